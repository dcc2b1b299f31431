#include "core/present/threshold_entry.h"

#include <charconv>
#include <cmath>

namespace calivera {
namespace {

std::string trimmed(const std::string& text) {
  const auto first = text.find_first_not_of(" \t");
  if (first == std::string::npos) return {};
  const auto last = text.find_last_not_of(" \t");
  return text.substr(first, last - first + 1);
}

std::optional<double> number(const std::string& text) {
  const std::string t = trimmed(text);
  double value = 0.0;
  const auto [end, error] = std::from_chars(t.data(), t.data() + t.size(), value);
  if (t.empty() || error != std::errc() || end != t.data() + t.size() || !std::isfinite(value)) {
    return std::nullopt;
  }
  return value;
}

ThresholdEntry refused(std::string why) {
  return {std::nullopt, std::move(why)};
}

ThresholdEntry inside(double t, const std::string& shown) {
  if (!(t > 0.0 && t < 1.0)) {
    return refused(shown + " is not a risk strictly between 0 and 1 (0% and 100%)");
  }
  return {t, {}};
}

}  // namespace

ThresholdEntry parseThresholdEntry(const std::string& raw) {
  const std::string text = trimmed(raw);
  if (text.empty()) return refused("enter a threshold, e.g. 0.15, 15% or 1:9");
  if (const auto colon = text.find(':'); colon != std::string::npos) {
    const auto harm = number(text.substr(0, colon));
    const auto benefit = number(text.substr(colon + 1));
    if (!harm || !benefit || *harm <= 0.0 || *benefit <= 0.0) {
      return refused("'" + text + "' is not a harm-to-benefit ratio such as 1:9");
    }
    return inside(*harm / (*harm + *benefit), "'" + text + "'");
  }
  if (text.back() == '%') {
    const auto percent = number(text.substr(0, text.size() - 1));
    if (!percent) return refused("'" + text + "' is not a percentage such as 15%");
    return inside(*percent / 100.0, "'" + text + "'");
  }
  const auto value = number(text);
  if (!value) return refused("'" + text + "' is not a number; write 0.15, 15% or 1:9");
  if (*value > 1.0 && *value < 100.0) {
    return refused("'" + text + "' is above 1: write " + text + "% for a percentage");
  }
  return inside(*value, "'" + text + "'");
}

}  // namespace calivera
