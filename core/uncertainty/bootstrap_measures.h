#pragma once
// The catalog of the measures the bootstrap gives intervals for: one row each with its key (JSON
// and CSV), its printed label, its decimals on screen and in print, where its estimate is in a
// ValidationResult and where its interval is in a ValidationBootstrap. The bootstrap computes
// them in this order, and the JSON, the CSV table, the text summary and the report list them from
// here, so a measure added here appears everywhere and nowhere is it written out again.

#include <array>

#include "core/metrics/validation.h"
#include "core/uncertainty/validation_bootstrap.h"

namespace calivera {

struct BootstrappedMeasure {
  const char* key;    // JSON key and CSV `statistic` value, e.g. "calibration_slope"
  const char* label;  // as printed, e.g. "calibration slope"
  int decimals;       // in the text summary, the workstation and the report
  double (*estimate)(const ValidationResult&);
  BootstrapEstimate ValidationBootstrap::*interval;
};

inline constexpr std::size_t kBootstrappedMeasureCount = 8;
const std::array<BootstrappedMeasure, kBootstrappedMeasureCount>& bootstrappedMeasures();

}  // namespace calivera
