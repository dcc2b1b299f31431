#pragma once
// Maximum-likelihood logistic regression by Newton-Raphson (IRLS) with step-halving, and Firth's
// penalized likelihood (Firth, Biometrika 1993; Heinze & Schemper, Stat Med 2002). Used for model
// fitting and, with an offset, for calibration-in-the-large and the calibration slope.

#include <Eigen/Dense>
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "core/util/progress.h"

namespace calivera {

struct FitOptions {
  bool firth = false;
  int maxIterations = 100;
  // Converged when |D_new - D_old| / (|D_new| + 0.1) < tolerance, D the deviance (penalized
  // deviance for Firth); the + 0.1 keeps the test meaningful when D approaches 0.
  double relativeDevianceTolerance = 1e-10;
  unsigned threads = 0;  // 0: all hardware threads; results do not depend on the count
  ProgressCallback progress;
};

enum class FitProblem { None, CompleteSeparation, QuasiSeparation, RankDeficient, NotConverged };

struct FitResult {
  Eigen::VectorXd beta;  // one per column of X
  Eigen::VectorXd se;    // from the observed information at the final estimate
  Eigen::MatrixXd covariance;
  double deviance = 0.0;  // -2 log L (unpenalized, also for Firth)
  // Null model as R's glm defines it: the offset (when given) plus an intercept when X has a
  // constant column; offset only when X has none; risk 1/2 with neither.
  double nullDeviance = 0.0;
  double penalizedLogLikelihood = 0.0;  // Firth: log L + 0.5 log det I; otherwise log L
  double aic = 0.0;                     // deviance + 2 * columns of X
  std::size_t fittedZeroOrOne = 0;      // rows with a fitted risk within 10 * machine eps of 0 or 1
  int iterations = 0;
  bool converged = false;
  FitProblem problem = FitProblem::None;
  std::vector<int> problemColumns;  // columns of X involved in separation or rank deficiency
  std::vector<std::string> warnings;
};

// X holds one column per coefficient, the intercept column (all ones) included by the caller.
// y is 0/1. offset, when given, is added to the linear predictor with coefficient fixed at 1.
// Never throws for data problems: they come back in `problem` and `warnings`. Throws
// std::invalid_argument for caller errors: sizes that differ, y not 0/1, a non-finite entry of X
// or offset (clamp risks of exactly 0 or 1 before taking their logit).
FitResult fitLogistic(const Eigen::MatrixXd& X, const Eigen::VectorXd& y,
                      const Eigen::VectorXd* offset, const FitOptions& options);

}  // namespace calivera
