#include "core/metrics/threshold_index.h"

#include <algorithm>
#include <limits>
#include <numeric>
#include <stdexcept>

namespace calivera {

ThresholdIndex::ThresholdIndex(const std::vector<double>& risk,
                               const std::vector<double>& outcome) {
  if (risk.size() != outcome.size()) throw std::invalid_argument("risk and outcome sizes differ");
  std::vector<std::size_t> order(risk.size());
  std::iota(order.begin(), order.end(), std::size_t{0});
  std::sort(order.begin(), order.end(),
            [&](std::size_t a, std::size_t b) { return risk[a] < risk[b]; });
  sortedRisk_.resize(order.size());
  eventsAtOrAbove_.assign(order.size() + 1, 0);
  for (std::size_t i = 0; i < order.size(); ++i) sortedRisk_[i] = risk[order[i]];
  riskAtOrAbove_.assign(order.size() + 1, 0.0);
  long double sum = 0.0L;  // summed from the smallest risk up within each suffix's order
  for (std::size_t i = order.size(); i-- > 0;) {
    eventsAtOrAbove_[i] = eventsAtOrAbove_[i + 1] + (outcome[order[i]] > 0.5 ? 1 : 0);
    sum += sortedRisk_[i];
    riskAtOrAbove_[i] = static_cast<double>(sum);
  }
  totalEvents_ = eventsAtOrAbove_.empty() ? 0 : eventsAtOrAbove_[0];
}

ConfusionCounts ThresholdIndex::countsAt(double threshold) const {
  const auto first = std::lower_bound(sortedRisk_.begin(), sortedRisk_.end(), threshold);
  const auto i = static_cast<std::size_t>(first - sortedRisk_.begin());
  const std::size_t flagged = sortedRisk_.size() - i;
  ConfusionCounts c;
  c.tp = eventsAtOrAbove_[i];
  c.fp = flagged - c.tp;
  c.fn = totalEvents_ - c.tp;
  c.tn = sortedRisk_.size() - flagged - c.fn;
  return c;
}

double ThresholdIndex::meanRiskFlaggedAt(double threshold) const {
  const auto first = std::lower_bound(sortedRisk_.begin(), sortedRisk_.end(), threshold);
  const auto i = static_cast<std::size_t>(first - sortedRisk_.begin());
  const std::size_t flagged = sortedRisk_.size() - i;
  return flagged == 0 ? std::numeric_limits<double>::quiet_NaN()
                      : riskAtOrAbove_[i] / static_cast<double>(flagged);
}

}  // namespace calivera
