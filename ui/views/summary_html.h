#pragma once
// The summary panel's content as HTML: every metric with its 95% CI and a plain-language reading,
// the cohort and exclusions, the sample-size warnings and what they mean. Built from a StudyState
// alone (no widgets), so tests and the report can use it.

#include <QString>

#include "core/study/study.h"

namespace calivera::ui {

// With study.uncertainty: the sample-size verdict first, then the results with the percentile
// bootstrap interval beside each analytic one.
QString summaryHtml(const StudyState& study);

// Rules of thumb and Riley et al. (2021) sizes: needed, available, target and achieved CI width.
QString sampleSizeHtml(const SampleSizeAssessment& assessment);

// Reading of the decision curve over the user's range of reasonable thresholds.
QString decisionCurveReading(const std::vector<DecisionCurvePoint>& curve, double lo, double hi);

}  // namespace calivera::ui
