#pragma once
// Checks that decide whether a logistic maximum-likelihood fit is meaningful.
//
// Rank: a column that is constant (other than one intercept column) or a column that is a linear
// combination of others makes X'WX singular and the coefficients unidentifiable. The cheap test
// is the smallest eigenvalue of X'WX scaled to unit diagonal; when that is small, a column-pivoted
// Householder QR of X (columns scaled to unit length) decides the rank and names the columns of
// each dependency, as R's glm does with its pivoted QR (tolerance below).
//
// Separation (Albert & Anderson, Biometrika 1984): the MLE does not exist when some direction d
// has (2y_i - 1) x_i'd >= 0 for every row (quasi-complete; complete when > 0 for all). Newton
// iterates then move along such a d without end while fitted risks approach 0 or 1. We take d as
// the change of beta over the last iterations and verify the sign condition on every row, so a
// reported separation is certified by the data, not guessed from large coefficients.

#include <Eigen/Dense>
#include <string>
#include <vector>

namespace calivera::detail {

struct RankFinding {
  bool deficient = false;
  std::vector<int> columns;  // columns involved, ascending
  std::string detail;        // e.g. "column 3 is constant", "columns 2, 4 are collinear"
};

// `information` is X'WX at any beta with all weights > 0 (the rank of X).
RankFinding checkRank(const Eigen::MatrixXd& X, const Eigen::MatrixXd& information);

struct SeparationFinding {
  bool separated = false;
  bool complete = false;  // every row strictly on its side
  // Columns that separate the outcome on their own; when none does alone, the columns with a
  // material share of the separating direction.
  std::vector<int> columns;
};

// `direction` = beta_final - beta_earlier. `eta` is the final linear predictor.
SeparationFinding checkSeparation(const Eigen::MatrixXd& X, const Eigen::VectorXd& y,
                                  const Eigen::VectorXd& direction, const Eigen::VectorXd& eta);

// Index of the first constant non-zero column (the intercept), or -1.
int interceptColumn(const Eigen::MatrixXd& X);

}  // namespace calivera::detail
