#include "core/report/audit_format.h"

#include <cmath>
#include <cstdio>

namespace calivera {

std::string formatFixed(double value, int decimals) {
  if (std::isnan(value)) return "-";
  if (std::isinf(value)) return value > 0 ? "inf" : "-inf";
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*f", decimals, value);
  std::string text = buffer;
  // snprintf prints -0.000 for small negatives; a reader would take it for a sign.
  if (text.front() == '-' && text.find_first_not_of("-0.") == std::string::npos) text.erase(0, 1);
  return text;
}

std::string formatInterval(const Interval& ci, int decimals) {
  return formatFixed(ci.lo, decimals) + " to " + formatFixed(ci.hi, decimals);
}

std::string formatWithCi(double value, const Interval& ci, int decimals) {
  return formatFixed(value, decimals) + " (" + formatInterval(ci, decimals) + ")";
}

std::string formatThreshold(double threshold) {
  for (int decimals = 2; decimals < 4; ++decimals) {
    const double scale = std::pow(10.0, decimals);
    if (std::abs(threshold * scale - std::round(threshold * scale)) < 1e-9) {
      return formatFixed(threshold, decimals);
    }
  }
  return formatFixed(threshold, 4);
}

std::string formatPercent(double proportion, int decimals) {
  return formatFixed(proportion * 100.0, decimals) + "%";
}

std::string fileNameOnly(const std::string& path) {
  const auto slash = path.find_last_of("/\\");
  return slash == std::string::npos ? path : path.substr(slash + 1);
}

}  // namespace calivera
