#include "core/report/audit_format.h"

#include <cmath>
#include <cstdio>

#include "core/present/number_text.h"
#include "core/util/shown_text.h"

namespace calivera {

std::string formatFixed(double value, int decimals) {
  return formatNumber(value, decimals);
}

std::string formatInterval(const Interval& ci, int decimals) {
  return formatRange(ci.lo, ci.hi, decimals);
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
  return reportName(slash == std::string::npos ? path : path.substr(slash + 1));
}

std::string reportName(const std::string& text) {
  return visibleName(text, kReportNameChars);
}

}  // namespace calivera
