#pragma once
// The uncertainty layer's result tables (core/uncertainty/uncertainty_run.h) as core result
// tables (result_table.h): the compared models, the paired DeLong tests, the net-benefit
// differences and the subgroups. `calivera validate --csv-dir` writes their tableCsv()
// (compared_models.csv, model_comparison_auc.csv, model_comparison_net_benefit.csv,
// subgroups.csv; uncertainty_tables.h) and the workstation shows the same tables, so its
// "Export table" writes the same CSV. The CSV columns listed in uncertainty_tables.h keep their
// place; columns added later come after them.

#include <limits>
#include <vector>

#include "core/report/result_table.h"
#include "core/uncertainty/uncertainty_run.h"

namespace calivera {

// One row per model, the validated model first: file name, SHA-256, AUC with its DeLong 95% CI
// on the comparison rows; then Brier, calibration intercept, slope and O/E there.
// Requires results.comparison.
ResultTable comparedModelsTable(const UncertaintyResults& results);

// One row per pair: AUCs, difference, SE, 95% CI, z, two-sided p, correlation of the two AUCs.
ResultTable modelComparisonAucTable(const ModelComparison& comparison);

// The net-benefit difference (first − second) with its bootstrap interval, per pair, at every
// threshold of the comparison grid within [lo, hi] (the whole grid by default).
ResultTable modelComparisonNetBenefitTable(const ModelComparison& comparison,
                                           double lo = -std::numeric_limits<double>::infinity(),
                                           double hi = std::numeric_limits<double>::infinity());

// One row per level of every analysis given. With one analysis the screen leaves out the
// column-name column (the view names the column); the CSV always has it.
ResultTable subgroupsTable(const std::vector<SubgroupAnalysis>& subgroups);

}  // namespace calivera
