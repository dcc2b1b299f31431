#pragma once
// The one decision threshold that drives every linked view, as plain C++ (no Qt) so it can be
// tested without widgets. Counts at any threshold come from core's ThresholdIndex (one sort, then
// O(log n) per move), so a move never recomputes a metric.
//
// Conventions: those of core's operating point (core/metrics/operating_point.h), which computes
// every number here: flagged when risk >= threshold; a proportion with a zero denominator is NaN
// ("not defined"); net benefit (Vickers & Elkin 2006) is NaN outside 0 < t < 1.

#include <cstddef>
#include <limits>
#include <memory>
#include <vector>

#include "core/metrics/threshold_index.h"

namespace calivera {

struct ThresholdSnapshot {
  double threshold = 0.0;
  ConfusionCounts counts;
  std::size_t n = 0;
  std::size_t events = 0;
  double sensitivity = 0.0;  // TP / events
  double specificity = 0.0;  // TN / non-events
  double falsePositiveRate = 0.0;
  double ppv = 0.0;  // TP / flagged
  double npv = 0.0;  // TN / not flagged
  double flaggedPer1000 = 0.0;
  double eventsCaughtPer1000 = 0.0;
  double eventsMissedPer1000 = 0.0;
  double flaggedWithoutEventPer1000 = 0.0;
  double netBenefit = 0.0;
  double netBenefitTreatAll = 0.0;
  // Mean predicted risk among the flagged patients (NaN when nobody is flagged); set by
  // ThresholdState from its index, not derivable from the four counts.
  double meanRiskFlagged = std::numeric_limits<double>::quiet_NaN();
};

// All derived quantities from the four counts at threshold t.
ThresholdSnapshot snapshotFromCounts(double threshold, const ConfusionCounts& counts);

class ThresholdState {
 public:
  static constexpr double kDefaultStep = 0.005;

  ThresholdState() = default;
  // Builds the sorted index once (O(n log n)); risk and outcome per analysed patient.
  void setData(const std::vector<double>& risk, const std::vector<double>& outcome);
  void clear();
  bool hasData() const { return index_ != nullptr && index_->size() > 0; }

  double threshold() const { return threshold_; }
  // Clamped to [0, 1]; returns true when the value changed.
  bool setThreshold(double threshold);
  // Moves by steps * step, clamped; returns true when the value changed.
  bool nudge(int steps, double step = kDefaultStep);

  // O(log n). Without data the counts are all zero.
  ThresholdSnapshot snapshot() const;
  ThresholdSnapshot snapshotAt(double threshold) const;

 private:
  std::shared_ptr<const ThresholdIndex> index_;
  double threshold_ = 0.1;
};

}  // namespace calivera
