#pragma once
// The two JSON conventions every writer of results shares (core/report/validation_json.h,
// core/uncertainty/uncertainty_json.h): a number that is not finite (an undefined statistic) is
// written as null, since JSON has no NaN; a 95% interval is the array [lo, hi].

#include <cmath>
#include <nlohmann/json.hpp>

#include "core/metrics/validation.h"

namespace calivera {

inline nlohmann::json jsonNumber(double value) {
  return std::isfinite(value) ? nlohmann::json(value) : nlohmann::json(nullptr);
}

inline nlohmann::json jsonInterval(const Interval& ci) {
  return nlohmann::json::array({jsonNumber(ci.lo), jsonNumber(ci.hi)});
}

}  // namespace calivera
