#pragma once
// Maximum-likelihood logistic regression by Newton-Raphson (IRLS) with step-halving, and Firth's
// penalized likelihood (Firth, Biometrika 1993; Heinze & Schemper, Stat Med 2002). Used for model
// fitting and, with an offset, for calibration-in-the-large and the calibration slope.

#include <optional>
#include <string>
#include <vector>

#include <Eigen/Dense>

#include "core/util/progress.h"

namespace calivera {

struct FitOptions {
  bool firth = false;
  int maxIterations = 100;
  double relativeDevianceTolerance = 1e-10;
  ProgressCallback progress;
};

enum class FitProblem { None, CompleteSeparation, QuasiSeparation, RankDeficient, NotConverged };

struct FitResult {
  Eigen::VectorXd beta;        // one per column of X
  Eigen::VectorXd se;          // from the observed information at the final estimate
  Eigen::MatrixXd covariance;
  double deviance = 0.0;       // -2 log L (unpenalized, also for Firth)
  double nullDeviance = 0.0;   // intercept-only (or offset-only) model
  double aic = 0.0;
  int iterations = 0;
  bool converged = false;
  FitProblem problem = FitProblem::None;
  std::vector<int> problemColumns;  // columns of X involved in separation or rank deficiency
  std::vector<std::string> warnings;
};

// X holds one column per coefficient, the intercept column (all ones) included by the caller.
// y is 0/1. offset, when given, is added to the linear predictor with coefficient fixed at 1.
// Never throws for data problems: they come back in `problem` and `warnings`.
FitResult fitLogistic(const Eigen::MatrixXd& X, const Eigen::VectorXd& y,
                      const Eigen::VectorXd* offset, const FitOptions& options);

}  // namespace calivera
