#include "core/present/number_text.h"

#include <cmath>
#include <cstdio>

namespace calivera {

std::string formatNumber(double value, int decimals) {
  if (std::isnan(value)) return kNotDefinedText;
  if (std::isinf(value)) return value > 0 ? "inf" : "-inf";
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*f", decimals, value);
  std::string text = buffer;
  // snprintf prints -0.000 for small negatives; a reader would take it for a sign.
  if (text.front() == '-' && text.find_first_not_of("-0.") == std::string::npos) text.erase(0, 1);
  return text;
}

std::string formatPValue(double p) {
  if (std::isnan(p)) return kNotDefinedText;
  return p < kPValueFloor ? "< 0.001" : formatNumber(p, 3);
}

std::string formatRange(double lo, double hi, int decimals) {
  // No interval at all reads once, not "not defined to not defined".
  if (std::isnan(lo) && std::isnan(hi)) return kNotDefinedText;
  return formatNumber(lo, decimals) + " to " + formatNumber(hi, decimals);
}

}  // namespace calivera
