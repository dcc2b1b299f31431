#pragma once
// A readable plain-text summary of a ValidationRun (what `calivera validate` prints without
// --json): inputs and fingerprints, cohort and exclusions, apparent / new data, discrimination,
// overall accuracy, calibration (leading with intercept, slope and the curve summaries, then
// Hosmer-Lemeshow), net benefit at a few thresholds, warnings and the caution text.

#include <string>

#include "core/metrics/validation_run.h"

namespace calivera {

std::string validationSummaryText(const ValidationRun& run);

}  // namespace calivera
