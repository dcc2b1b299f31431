#pragma once
// One pass of the logistic Newton-Raphson iteration over the rows of X: deviance, score X'(y - mu)
// and information X'WX (W = diag mu(1 - mu)) at a given beta, plus the hat-diagonal term of
// Firth's modified score. Rows are processed in chunks of 4096 so each chunk of X stays in cache
// while it is used for the linear predictor, the score and the rank-k update of X'WX. Chunks are
// grouped into fixed blocks of rows; threads take whole blocks and the block sums are added in
// block order, so the result is the same for any number of threads.

#include <Eigen/Dense>
#include <cstddef>

namespace calivera::detail {

struct PassResult {
  double deviance = 0.0;        // -2 log L
  Eigen::VectorXd score;        // X'(y - mu)
  Eigen::MatrixXd information;  // X'WX, both triangles filled
  bool finite = true;           // false when the linear predictor overflowed
};

class LogisticPass {
 public:
  // X, y and offset must outlive the pass; offset may be null.
  LogisticPass(const Eigen::MatrixXd& X, const Eigen::VectorXd& y, const Eigen::VectorXd* offset,
               unsigned threads);

  PassResult evaluate(const Eigen::VectorXd& beta);
  double deviance(const Eigen::VectorXd& beta);

  // Firth's addition to the score, X'(h * (1/2 - mu)) with h_i = w_i x_i' I^{-1} x_i the diagonal
  // of the hat matrix, at the beta of the last evaluate(). `lower` is the Cholesky factor L of
  // I = X'WX = L L'.
  Eigen::VectorXd firthAdjustment(const Eigen::MatrixXd& lower);

  // Linear predictor (offset included) at the beta of the last evaluate().
  const Eigen::VectorXd& eta() const { return eta_; }

 private:
  template <typename Body>
  void forEachBlock(Body&& body);

  const Eigen::MatrixXd& x_;
  const Eigen::VectorXd& y_;
  const Eigen::VectorXd* offset_;
  unsigned threads_;
  Eigen::VectorXd eta_;
};

// Deviance contribution of one row, -2 log P(y | eta), computed as 2 softplus(-+eta) so that it
// stays exact where the risk is within rounding of 0 or 1.
double devianceTerm(double y, double eta);
// Risk and weight mu(1 - mu) without overflow.
double logistic(double eta);

}  // namespace calivera::detail
