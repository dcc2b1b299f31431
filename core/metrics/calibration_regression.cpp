#include "core/metrics/calibration_regression.h"

#include <Eigen/Dense>

#include "core/fit/logistic_fit.h"
#include "core/metrics/proportion_ci.h"

namespace calivera {
namespace {

void noteProblems(const FitResult& fit, const std::string& what, std::vector<std::string>& out) {
  if (!fit.converged) out.push_back(what + ": the logistic fit did not converge");
  if (fit.problem == FitProblem::CompleteSeparation || fit.problem == FitProblem::QuasiSeparation) {
    out.push_back(what + ": outcome separated by the linear predictor; estimate unreliable");
  }
  for (const std::string& w : fit.warnings) out.push_back(what + ": " + w);
}

}  // namespace

CalibrationFit calibrationRegression(const std::vector<double>& linearPredictor,
                                     const std::vector<double>& outcome) {
  const auto n = static_cast<Eigen::Index>(linearPredictor.size());
  const Eigen::Map<const Eigen::VectorXd> lp(linearPredictor.data(), n);
  const Eigen::VectorXd y = Eigen::Map<const Eigen::VectorXd>(outcome.data(), n);
  const Eigen::VectorXd offset = lp;
  CalibrationFit c;
  const FitOptions options;

  const Eigen::MatrixXd ones = Eigen::MatrixXd::Ones(n, 1);
  const FitResult large = fitLogistic(ones, y, &offset, options);
  c.intercept = large.beta(0);
  c.interceptSe = large.se(0);
  c.interceptCi = {c.intercept - kZ95 * c.interceptSe, c.intercept + kZ95 * c.interceptSe};
  noteProblems(large, "calibration-in-the-large", c.warnings);

  Eigen::MatrixXd design(n, 2);
  design.col(0).setOnes();
  design.col(1) = lp;
  const FitResult slope = fitLogistic(design, y, nullptr, options);
  c.slopeModelIntercept = slope.beta(0);
  c.slope = slope.beta(1);
  c.slopeSe = slope.se(1);
  c.slopeCi = {c.slope - kZ95 * c.slopeSe, c.slope + kZ95 * c.slopeSe};
  noteProblems(slope, "calibration slope", c.warnings);
  return c;
}

}  // namespace calivera
