#pragma once
// Confusion counts at any threshold in O(log n) after one sort, so an interactive threshold move
// never recomputes the metrics. A patient is flagged when risk >= threshold, the convention used
// throughout Calivera (threshold table, decision curve, ROC operating point).

#include <cstddef>
#include <vector>

namespace calivera {

struct ConfusionCounts {
  std::size_t tp = 0, fp = 0, tn = 0, fn = 0;
};

class ThresholdIndex {
 public:
  ThresholdIndex() = default;
  ThresholdIndex(const std::vector<double>& risk, const std::vector<double>& outcome);

  ConfusionCounts countsAt(double threshold) const;
  // Mean predicted risk of the patients flagged at `threshold` (risk >= threshold); NaN when
  // nobody is flagged. Beside the observed proportion (PPV) it shows calibration where it acts.
  double meanRiskFlaggedAt(double threshold) const;
  std::size_t size() const { return sortedRisk_.size(); }
  std::size_t events() const { return totalEvents_; }

 private:
  std::vector<double> sortedRisk_;            // ascending
  std::vector<std::size_t> eventsAtOrAbove_;  // eventsAtOrAbove_[i]: events among sortedRisk_[i..]
  std::vector<double> riskAtOrAbove_;         // riskAtOrAbove_[i]: sum of sortedRisk_[i..]
  std::size_t totalEvents_ = 0;
};

}  // namespace calivera
