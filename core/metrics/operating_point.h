#pragma once
// The operating point at one threshold: the threshold-table row (confusion counts, sensitivity,
// specificity, predictive values with Wilson intervals, per-1000 counts) and the decision-curve
// point (net benefit of the model and of treating all; Vickers & Elkin, Med Decis Making 2006).
// The threshold table, the decision curve, the workstation's slider, confusion panel and ROC
// marker, and the PDF's threshold marker all come from this one function, so they agree exactly.
//
// One behaviour for every threshold t (a patient is flagged when risk >= t):
//   - counts and proportions are defined for any t (a ratio with an empty denominator is NaN);
//   - net benefit weighs a false positive by the odds t / (1 - t), which is 0 at t = 0 and
//     infinite at t = 1, so outside the open interval (0, 1), and for an empty cohort, every
//     net-benefit field is NaN ("not defined"), never an extrapolated number.

#include "core/metrics/threshold_index.h"
#include "core/metrics/validation.h"

namespace calivera {

struct OperatingPoint {
  ThresholdRow row;
  DecisionCurvePoint decision;
  double falsePositiveRate = 0.0;  // FP / non-events (the ROC curve's x), NaN without non-events
};

// True when net benefit is defined at t: 0 < t < 1.
bool netBenefitDefinedAt(double threshold);

OperatingPoint operatingPointAt(double threshold, const ConfusionCounts& counts);

}  // namespace calivera
