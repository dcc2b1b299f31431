#pragma once
// Lean, frequency-weighted versions of the four measures a bootstrap replicate needs many times:
// AUC (Mann-Whitney with ties one half), calibration-in-the-large intercept (logit p = a + LP,
// LP as offset) and calibration slope (logit p = a + b LP) by Newton-Raphson (Cox, Biometrika
// 1958), and the Brier score. A bootstrap resample is the original patients with integer weights
// (how often each was drawn), so both the resample and the original cohort are measured from one
// sort of the same linear predictor. They equal validate()'s values on the expanded data
// (checked in tests/unit/weighted_metrics_test.cpp).
//
// Edge cases: zero total weight in either outcome class -> AUC NaN; a calibration fit that does
// not converge in 100 iterations (separation in the weighted data) -> NaN.

#include <cstdint>
#include <vector>

namespace calivera {

struct WeightedMeasures {
  double auc = 0.0;
  double calibrationIntercept = 0.0;
  double calibrationSlope = 0.0;
  double brier = 0.0;
};

// `order` sorts `lp` ascending (computed once, shared by several weightings). weights may be
// empty, meaning 1 for every patient.
WeightedMeasures weightedMeasures(const std::vector<double>& lp, const std::vector<double>& y,
                                  const std::vector<std::uint32_t>& order,
                                  const std::vector<double>& weights);

double weightedAuc(const std::vector<double>& lp, const std::vector<double>& y,
                   const std::vector<std::uint32_t>& order, const std::vector<double>& weights);
// a in logit p = a + offset.
double weightedOffsetIntercept(const std::vector<double>& offset, const std::vector<double>& y,
                               const std::vector<double>& weights);
struct InterceptSlope {
  double intercept = 0.0;
  double slope = 0.0;
};
InterceptSlope weightedCalibrationSlope(const std::vector<double>& lp, const std::vector<double>& y,
                                        const std::vector<double>& weights);

std::vector<std::uint32_t> ascendingOrder(const std::vector<double>& values);

}  // namespace calivera
