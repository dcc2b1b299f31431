#include "core/fit/fit_diagnostics.h"

#include <Eigen/Eigenvalues>
#include <Eigen/QR>
#include <algorithm>
#include <cmath>
#include <limits>
#include <set>

namespace calivera::detail {
namespace {

// Eigenvalue ratio of the unit-diagonal X'WX below which the pivoted QR is consulted; it is the
// square of a singular-value ratio of about 3e-5, far above rounding.
constexpr double kScreenEigenRatio = 1e-9;
// |R_kk| / |R_11| of the QR of X with unit-length columns below which a column counts as a
// linear combination of the earlier pivots (R's glm uses 1e-11 on a similar scale; a column that
// close to dependent cannot carry an interpretable coefficient either).
constexpr double kQrTolerance = 1e-10;

std::string columnList(const std::vector<int>& columns) {
  std::string text;
  for (const int column : columns) {
    text += (text.empty() ? "" : ", ") + std::to_string(column);
  }
  return text;
}

bool isConstant(const Eigen::MatrixXd& X, Eigen::Index j) {
  if (X.rows() == 0) return true;
  const double first = X(0, j);
  return (X.col(j).array() == first).all();
}

}  // namespace

int interceptColumn(const Eigen::MatrixXd& X) {
  if (X.rows() == 0) return -1;
  for (Eigen::Index j = 0; j < X.cols(); ++j) {
    if (X(0, j) != 0.0 && isConstant(X, j)) return static_cast<int>(j);
  }
  return -1;
}

RankFinding checkRank(const Eigen::MatrixXd& X, const Eigen::MatrixXd& information) {
  RankFinding finding;
  const Eigen::Index n = X.rows();
  const Eigen::Index p = X.cols();
  if (p == 0) return finding;
  if (n < p) {
    finding.deficient = true;
    for (int j = 0; j < p; ++j) finding.columns.push_back(j);
    finding.detail =
        std::to_string(n) + " rows cannot identify " + std::to_string(p) + " coefficients";
    return finding;
  }
  std::vector<int> constant;
  for (Eigen::Index j = 0; j < p; ++j) {
    if (!isConstant(X, j)) continue;
    if (X(0, j) == 0.0) {
      finding.deficient = true;
      finding.columns = {static_cast<int>(j)};
      finding.detail = "column " + std::to_string(j) + " is 0 in every row";
      return finding;
    }
    constant.push_back(static_cast<int>(j));
  }
  if (constant.size() > 1) {
    finding.deficient = true;
    finding.columns = constant;
    finding.detail = "columns " + columnList(constant) +
                     " are each constant, so only one of them (the intercept) can be estimated";
    return finding;
  }

  const Eigen::VectorXd diagonal = information.diagonal();
  if ((diagonal.array() <= 0.0).any() || !diagonal.allFinite()) {
    finding.deficient = true;
    for (int j = 0; j < p; ++j) {
      if (!(diagonal[j] > 0.0)) finding.columns.push_back(j);
    }
    finding.detail = "columns " + columnList(finding.columns) + " carry no information";
    return finding;
  }
  const Eigen::VectorXd inverseRoot = diagonal.array().rsqrt();
  const Eigen::MatrixXd scaled = inverseRoot.asDiagonal() * information * inverseRoot.asDiagonal();
  const Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> eigen(scaled, Eigen::EigenvaluesOnly);
  const double ratio = eigen.eigenvalues().minCoeff() / eigen.eigenvalues().maxCoeff();
  if (ratio > kScreenEigenRatio) return finding;

  // Near-singular: decide with the pivoted QR of X, columns scaled to unit length.
  const Eigen::VectorXd norms = X.colwise().norm().transpose();
  const Eigen::MatrixXd unit = X * norms.cwiseInverse().asDiagonal();
  Eigen::ColPivHouseholderQR<Eigen::MatrixXd> qr(unit);
  qr.setThreshold(kQrTolerance);
  const Eigen::Index rank = qr.rank();
  if (rank == p) return finding;
  const auto& order = qr.colsPermutation().indices();
  const Eigen::MatrixXd r = qr.matrixR().topRows(p).triangularView<Eigen::Upper>();
  std::set<int> involved;
  for (Eigen::Index k = rank; k < p; ++k) {
    // Column order[k] = sum_i c_i * column order[i] over the independent pivots.
    const Eigen::VectorXd c =
        r.topLeftCorner(rank, rank).triangularView<Eigen::Upper>().solve(r.col(k).head(rank));
    involved.insert(order[k]);
    const double largest = std::max(1.0, c.cwiseAbs().maxCoeff());
    for (Eigen::Index i = 0; i < rank; ++i) {
      if (std::abs(c[i]) > 1e-6 * largest) involved.insert(order[i]);
    }
  }
  finding.deficient = true;
  finding.columns.assign(involved.begin(), involved.end());
  finding.detail = "columns " + columnList(finding.columns) + " are linearly dependent (rank " +
                   std::to_string(rank) + " of " + std::to_string(p) + ")";
  return finding;
}

SeparationFinding checkSeparation(const Eigen::MatrixXd& X, const Eigen::VectorXd& y,
                                  const Eigen::VectorXd& direction, const Eigen::VectorXd& eta) {
  SeparationFinding finding;
  if (X.rows() == 0 || X.cols() == 0) return finding;
  // A separating direction drives some fitted risks to their outcome; without any such row the
  // iterates cannot have been moving along one.
  bool anyFitted = false;
  for (Eigen::Index i = 0; i < eta.size() && !anyFitted; ++i) {
    anyFitted = (y[i] > 0.5 ? eta[i] > 13.8 : eta[i] < -13.8);  // risk within 1e-6 of y
  }
  if (!anyFitted) return finding;
  const Eigen::VectorXd signedMove = (2.0 * y.array() - 1.0) * (X * direction).array();
  const double scale = signedMove.cwiseAbs().maxCoeff();
  if (!(scale > 0.0) || !std::isfinite(scale)) return finding;
  const double tolerance = 1e-6 * scale;
  if ((signedMove.array() < -tolerance).any()) return finding;
  finding.separated = true;
  finding.complete = (signedMove.array() > tolerance).all();
  // Name the columns that separate the outcome on their own (max over non-events <= min over
  // events, or the reverse): that is what a user can act on. Only when no single column does is
  // the separating direction itself reported.
  const int intercept = interceptColumn(X);
  for (Eigen::Index j = 0; j < X.cols(); ++j) {
    if (j == intercept) continue;
    const double inf = std::numeric_limits<double>::infinity();
    double lo[2] = {inf, inf}, hi[2] = {-inf, -inf};
    for (Eigen::Index i = 0; i < X.rows(); ++i) {
      const int k = y[i] > 0.5 ? 1 : 0;
      lo[k] = std::min(lo[k], X(i, j));
      hi[k] = std::max(hi[k], X(i, j));
    }
    if (hi[0] <= lo[1] || hi[1] <= lo[0]) finding.columns.push_back(static_cast<int>(j));
  }
  if (!finding.columns.empty()) return finding;
  Eigen::VectorXd share(X.cols());
  for (Eigen::Index j = 0; j < X.cols(); ++j) {
    share[j] = std::abs(direction[j]) * X.col(j).cwiseAbs().maxCoeff();
  }
  const double largest = share.maxCoeff();
  for (Eigen::Index j = 0; j < X.cols(); ++j) {
    if (share[j] > 1e-3 * largest) finding.columns.push_back(static_cast<int>(j));
  }
  return finding;
}

}  // namespace calivera::detail
