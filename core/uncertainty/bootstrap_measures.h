#pragma once
// The measures the bootstrap gives intervals for, in the order it computes them: the entries of
// the catalog of measures (core/present/measures.h) that name a ValidationBootstrap member, with
// their key (JSON and CSV), printed label, decimals and accessors taken from there. The JSON, the
// CSV table, the text summary and the report list them from here.

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
