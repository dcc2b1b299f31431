#include "core/metrics/risk_histogram.h"

#include <algorithm>
#include <cstddef>
#include <stdexcept>

namespace calivera {

RiskHistogram riskHistogram(const std::vector<double>& risk, const std::vector<double>& outcome,
                            int bins) {
  if (bins < 1) throw std::invalid_argument("histogram needs at least one bin");
  RiskHistogram h;
  const auto count = static_cast<std::size_t>(bins);
  for (std::size_t k = 0; k <= count; ++k) {
    h.binEdges.push_back(static_cast<double>(k) / static_cast<double>(bins));
  }
  h.eventCounts.assign(count, 0);
  h.nonEventCounts.assign(count, 0);
  for (std::size_t i = 0; i < risk.size(); ++i) {
    const auto bin = std::min(count - 1, static_cast<std::size_t>(risk[i] * bins));
    ++(outcome[i] > 0.5 ? h.eventCounts : h.nonEventCounts)[bin];
  }
  return h;
}

}  // namespace calivera
