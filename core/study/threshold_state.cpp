#include "core/study/threshold_state.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "core/metrics/operating_point.h"

namespace calivera {

ThresholdSnapshot snapshotFromCounts(double threshold, const ConfusionCounts& counts) {
  // Every number from core's one operating-point function (core/metrics/operating_point.h), so
  // the slider, the threshold table and the decision curve agree exactly, edge cases included.
  const OperatingPoint p = operatingPointAt(threshold, counts);
  ThresholdSnapshot s;
  s.threshold = threshold;
  s.counts = counts;
  s.n = counts.tp + counts.fp + counts.tn + counts.fn;
  s.events = counts.tp + counts.fn;
  s.sensitivity = p.row.sensitivity;
  s.specificity = p.row.specificity;
  s.falsePositiveRate = p.falsePositiveRate;
  s.ppv = p.row.ppv;
  s.npv = p.row.npv;
  s.flaggedPer1000 = p.row.flaggedPer1000;
  s.eventsCaughtPer1000 = p.row.eventsCaughtPer1000;
  s.eventsMissedPer1000 = p.row.eventsMissedPer1000;
  s.flaggedWithoutEventPer1000 = p.row.flaggedWithoutEventPer1000;
  s.netBenefit = p.decision.netBenefit;
  s.netBenefitTreatAll = p.decision.netBenefitTreatAll;
  return s;
}

void ThresholdState::setData(const std::vector<double>& risk, const std::vector<double>& outcome) {
  index_ = std::make_shared<const ThresholdIndex>(risk, outcome);
}

void ThresholdState::clear() {
  index_.reset();
}

bool ThresholdState::setThreshold(double threshold) {
  if (!std::isfinite(threshold)) return false;
  const double clamped = std::clamp(threshold, 0.0, 1.0);
  if (clamped == threshold_) return false;
  threshold_ = clamped;
  return true;
}

bool ThresholdState::nudge(int steps, double step) {
  // Round to the step grid so repeated nudges do not accumulate rounding noise.
  const double target = std::round((threshold_ + steps * step) / step) * step;
  return setThreshold(target);
}

ThresholdSnapshot ThresholdState::snapshot() const {
  return snapshotAt(threshold_);
}

ThresholdSnapshot ThresholdState::snapshotAt(double threshold) const {
  ThresholdSnapshot s =
      snapshotFromCounts(threshold, index_ ? index_->countsAt(threshold) : ConfusionCounts{});
  if (index_) s.meanRiskFlagged = index_->meanRiskFlaggedAt(threshold);
  return s;
}

}  // namespace calivera
