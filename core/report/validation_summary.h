#pragma once
// A readable plain-text summary of a ValidationRun (what `calivera validate` prints without
// --json): inputs and fingerprints, cohort and exclusions, apparent / new data, discrimination,
// overall accuracy, calibration (leading with intercept, slope and the curve summaries, then
// Hosmer-Lemeshow), net benefit at a few thresholds, warnings and the caution text.

#include <string>

#include "core/metrics/validation_run.h"

namespace calivera {

// `beforeCaution` (e.g. the uncertainty results) is printed after the warnings, so the caution
// stays the last thing a reader sees.
std::string validationSummaryText(const ValidationRun& run, const std::string& beforeCaution = {});

}  // namespace calivera
