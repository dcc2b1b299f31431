#include "ui/state/threshold_state.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace calivera::ui {

namespace {

double ratio(std::size_t numerator, std::size_t denominator) {
  return denominator == 0 ? std::numeric_limits<double>::quiet_NaN()
                          : static_cast<double>(numerator) / static_cast<double>(denominator);
}

}  // namespace

ThresholdSnapshot snapshotFromCounts(double threshold, const ConfusionCounts& counts) {
  ThresholdSnapshot s;
  s.threshold = threshold;
  s.counts = counts;
  s.n = counts.tp + counts.fp + counts.tn + counts.fn;
  s.events = counts.tp + counts.fn;
  const std::size_t nonEvents = counts.fp + counts.tn;
  const std::size_t flagged = counts.tp + counts.fp;
  s.sensitivity = ratio(counts.tp, s.events);
  s.specificity = ratio(counts.tn, nonEvents);
  s.falsePositiveRate = ratio(counts.fp, nonEvents);
  s.ppv = ratio(counts.tp, flagged);
  s.npv = ratio(counts.tn, counts.tn + counts.fn);
  const double per1000 =
      s.n == 0 ? std::numeric_limits<double>::quiet_NaN() : 1000.0 / static_cast<double>(s.n);
  s.flaggedPer1000 = static_cast<double>(flagged) * per1000;
  s.eventsCaughtPer1000 = static_cast<double>(counts.tp) * per1000;
  s.eventsMissedPer1000 = static_cast<double>(counts.fn) * per1000;
  s.flaggedWithoutEventPer1000 = static_cast<double>(counts.fp) * per1000;
  // Vickers & Elkin 2006; the odds t/(1-t) weighs a false positive against a true positive.
  if (s.n == 0 || threshold >= 1.0) {
    s.netBenefit = s.netBenefitTreatAll = std::numeric_limits<double>::quiet_NaN();
  } else {
    const double odds = threshold / (1.0 - threshold);
    const double n = static_cast<double>(s.n);
    s.netBenefit = static_cast<double>(counts.tp) / n - static_cast<double>(counts.fp) / n * odds;
    const double prevalence = static_cast<double>(s.events) / n;
    s.netBenefitTreatAll = prevalence - (1.0 - prevalence) * odds;
  }
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
  return snapshotFromCounts(threshold, index_ ? index_->countsAt(threshold) : ConfusionCounts{});
}

}  // namespace calivera::ui
