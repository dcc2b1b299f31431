#pragma once
// The summary panel's content as HTML: every metric with its 95% CI and a plain-language reading,
// the cohort and exclusions, the sample-size warnings and what they mean. Built from a StudyState
// alone (no widgets), so tests and the report can use it.

#include <QString>

#include "ui/state/study_state.h"

namespace calivera::ui {

QString summaryHtml(const StudyState& study);

// Reading of the decision curve over the user's range of reasonable thresholds.
QString decisionCurveReading(const std::vector<DecisionCurvePoint>& curve, double lo, double hi);

}  // namespace calivera::ui
