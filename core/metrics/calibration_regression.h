#pragma once
// Logistic recalibration on the linear predictor LP (Cox, Biometrika 1958; Van Calster et al.,
// J Clin Epidemiol 2016;74:167-76):
//   calibration-in-the-large: logit P(y = 1) = a + offset(LP); target a = 0;
//   calibration slope:        logit P(y = 1) = a' + b LP;      target b = 1.
// Both by maximum likelihood (fitLogistic, core/fit/logistic_fit.h) with Wald SEs from the
// observed information and 95% CIs estimate +/- 1.96 SE. Non-convergence or separation comes back
// as warnings, never as an exception.

#include <string>
#include <vector>

#include "core/metrics/validation.h"

namespace calivera {

struct CalibrationFit {
  double intercept = 0.0, interceptSe = 0.0;
  Interval interceptCi;
  double slope = 0.0, slopeSe = 0.0;
  Interval slopeCi;
  double slopeModelIntercept = 0.0;
  std::vector<std::string> warnings;
};

CalibrationFit calibrationRegression(const std::vector<double>& linearPredictor,
                                     const std::vector<double>& outcome);

}  // namespace calivera
