#pragma once
// The one caution every output carries (command-line summary and usage, JSON, CSV, PDF footer,
// the workstation's banner and exported charts): results are evidence about this cohort, never
// an approval to use a model. Change the wording here only.

namespace calivera {

inline constexpr const char* kCautionText =
    "Results describe model performance on this cohort; they do not replace clinical judgment. "
    "Any use in care is a decision for local clinical governance and licensed practice under "
    "local regulations.";

}  // namespace calivera
