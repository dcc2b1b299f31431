#include "core/metrics/overall_metrics.h"

#include <cstddef>
#include <limits>

namespace calivera {

Overall brierScores(const std::vector<double>& risk, const std::vector<double>& outcome) {
  Overall o;
  if (risk.empty()) return o;
  double squares = 0.0, events = 0.0;
  for (std::size_t i = 0; i < risk.size(); ++i) {
    const double y = outcome[i] > 0.5 ? 1.0 : 0.0;
    squares += (y - risk[i]) * (y - risk[i]);
    events += y;
  }
  const double n = static_cast<double>(risk.size());
  const double prevalence = events / n;
  o.brier = squares / n;
  const double maximum = prevalence * (1.0 - prevalence);
  o.brierScaled =
      maximum > 0.0 ? 1.0 - o.brier / maximum : std::numeric_limits<double>::quiet_NaN();
  return o;
}

double discriminationSlope(const std::vector<double>& risk, const std::vector<double>& outcome) {
  double sumEvents = 0.0, sumNonEvents = 0.0;
  std::size_t events = 0;
  for (std::size_t i = 0; i < risk.size(); ++i) {
    if (outcome[i] > 0.5) {
      sumEvents += risk[i];
      ++events;
    } else {
      sumNonEvents += risk[i];
    }
  }
  const std::size_t nonEvents = risk.size() - events;
  if (events == 0 || nonEvents == 0) return std::numeric_limits<double>::quiet_NaN();
  return sumEvents / static_cast<double>(events) - sumNonEvents / static_cast<double>(nonEvents);
}

}  // namespace calivera
