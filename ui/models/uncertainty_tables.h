#pragma once
// Fills RecordTableModels from core's uncertainty results (core/uncertainty/uncertainty_run.h):
// the compared models, the paired DeLong tests, the net-benefit differences over the clinically
// reasonable thresholds, and one subgroup analysis. Aggregates only; no patient-level values.

#include "core/uncertainty/uncertainty_run.h"
#include "ui/models/record_table_model.h"

namespace calivera::ui {

// One row per model (the study's first): file name, AUC with its DeLong 95% CI on the
// comparison rows, Brier, calibration intercept, slope and O/E there.
void fillComparedModelsTable(RecordTableModel& model, const UncertaintyResults& results);
// One row per pair: AUCs, difference, its 95% CI, SE, z, two-sided p, correlation of the AUCs.
void fillDelongTable(RecordTableModel& model, const ModelComparison& comparison);
// Net-benefit difference (first - second) with its bootstrap interval at every threshold of the
// comparison grid within [lo, hi], per pair.
void fillNetBenefitDifferenceTable(RecordTableModel& model, const ModelComparison& comparison,
                                   double lo, double hi);
// One row per level: n, events, prevalence, AUC, calibration intercept, slope, O/E (each with
// its analytic 95% CI), ICI, bootstrap AUC and slope intervals when present, and the warnings.
void fillSubgroupTable(RecordTableModel& model, const SubgroupAnalysis& analysis);

}  // namespace calivera::ui
