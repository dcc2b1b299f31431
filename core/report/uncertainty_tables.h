#pragma once
// The uncertainty layer's results (core/uncertainty/uncertainty_run.h) as CSV tables, written by
// `calivera validate --csv-dir DIR` beside the validation tables (validation_tables.h), in the same
// CSV conventions (csv_text.h). Aggregates only; compared model files by file name and SHA-256.
// Each table is written only when its part was computed:
//   sample_size.csv                 always: kind (rule | criterion | verdict), name,
//                                   target_ci_width, target_se, required_n, required_events,
//                                   achieved_ci_width, met, note
//   bootstrap_intervals.csv         --bootstrap: statistic, estimate, ci_lo, ci_hi,
//                                   replicates_used, replicates, seed, failed
//   calibration_band.csv            --bootstrap: risk, estimate, ci_lo, ci_hi, replicates_used
//   net_benefit_band.csv            --bootstrap: threshold, estimate, ci_lo, ci_hi, replicates_used
//   compared_models.csv             --compare: model, file, sha256, auc, auc_ci_lo, auc_ci_hi,
//                                   comparison_rows, brier, calibration_intercept,
//                                   calibration_slope, oe_ratio
//   model_comparison_auc.csv        --compare: first, second, auc_first, auc_second,
//                                   auc_difference, se, ci_lo, ci_hi, z, p_value, correlation
//   model_comparison_net_benefit.csv --compare: first, second, threshold, net_benefit_first,
//                                   net_benefit_second, difference, ci_lo, ci_hi
//   subgroups.csv                   --subgroup: column, level, n, events, too_small, auc,
//                                   auc_ci_lo, auc_ci_hi, calibration_intercept, intercept_ci_lo,
//                                   intercept_ci_hi, calibration_slope, slope_ci_lo, slope_ci_hi,
//                                   oe_ratio, oe_ci_lo, oe_ci_hi, brier, auc_bootstrap_lo,
//                                   auc_bootstrap_hi, warnings, prevalence, ici,
//                                   slope_bootstrap_lo, slope_bootstrap_hi, size_note
// The last four tables are defined in uncertainty_result_tables.h, which the workstation shows.
// Intervals: analytic where the validation gives them (DeLong AUC, Wald intercept and slope, O/E),
// percentile bootstrap 95% in the bootstrap and band tables and the *_bootstrap_* columns.

#include <string>
#include <utility>
#include <vector>

#include "core/metrics/validation_run.h"
#include "core/uncertainty/uncertainty_run.h"

namespace calivera {

// (file name, CSV text) for every table computed, in the order above.
std::vector<std::pair<std::string, std::string>> uncertaintyTables(
    const UncertaintyResults& results);

// (file name, CSV text) of the validation tables and then the uncertainty tables.
std::vector<std::pair<std::string, std::string>> allValidationTables(
    const ValidationRun& run, const UncertaintyResults& results);

// The validation tables and the uncertainty tables, all or none (see writeTables).
void writeValidationTables(const std::string& directory, const ValidationRun& run,
                           const UncertaintyResults& results);

}  // namespace calivera
