#pragma once
// What a threshold means when the model is miscalibrated on this cohort, in plain words for the
// "of 1000 patients" panel: the natural-frequency numbers count observed events, but a clinician
// reads the threshold as a predicted risk. When observed/expected (O/E) differs from 1 beyond its
// 95% interval, a predicted 10% is not an observed 10% here, and the panel says so, with the mean
// predicted risk and the observed event rate among the flagged patients (calibration where the
// threshold acts; the calibration hierarchy's "mean" level, Van Calster et al., J Clin Epidemiol
// 2016;74:167-76).

#include <string>

#include "core/metrics/validation.h"
#include "core/study/threshold_state.h"

namespace calivera {

// Empty without patients. Percentages with one decimal.
std::string calibrationAtThresholdText(const ThresholdSnapshot& snapshot,
                                       const Calibration& calibration);

}  // namespace calivera
