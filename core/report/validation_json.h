#pragma once
// A ValidationRun as JSON (aggregates only, no patient rows), the machine-readable report of
// `calivera validate --json`. Non-finite numbers (an undefined statistic) are written as null.
// The key layout is a contract with outside checks: add keys, never rename. Layout:
//   format, software {name, version}, caution,
//   inputs {source "file", data {file, format, sha256, analysed_data_sha256},
//           model {file, sha256} | null, risk_column | null},
//   model {name, development_data_sha256 | null},
//   settings {outcome, event_value, groups, thresholds [..], histogram_bins, loess {...}},
//   cohort {n, events, non_events, prevalence, excluded, rows_read, excluded_by_column {col: n},
//           performance "apparent" | "new data", performance_basis},
//   discrimination {auc, auc_se, auc_ci [lo, hi], auc_ci_method, auc_ci_plain,
//                   discrimination_slope, roc [{threshold, fpr, tpr}]},
//   overall {brier, brier_scaled},
//   calibration {intercept, intercept_se, intercept_ci, slope, slope_se, slope_ci,
//                slope_model_intercept, oe_ratio, oe_ci, oe_ci_method, spiegelhalter_z,
//                spiegelhalter_p, ici, e50, e90, emax, curve_interpolated, curve [{risk,
//                observed}], groups [...], hierarchy},
//   hosmer_lemeshow {statistic, df, p_value, groups_requested, groups_formed,
//                    groups [{n, observed, expected, mean_risk, observed_proportion,
//                             observed_ci, risk_min, risk_max}]},
//   decision_curve [{threshold, net_benefit, net_benefit_treat_all, net_benefit_treat_none,
//                    standardized_net_benefit, interventions_avoided_per_100}],
//   thresholds [{threshold, tp, fp, tn, fn, sensitivity, sensitivity_ci, specificity,
//                specificity_ci, ppv, ppv_ci, npv, npv_ci, flagged_per_1000,
//                events_caught_per_1000, events_missed_per_1000, flagged_without_event_per_1000}],
//   risk_distribution {bin_edges, events, non_events},
//   missing_data {...}, pooled {...} | null   (core/report/imputation_json.h),
//   warnings [text]

#include <nlohmann/json.hpp>
#include <string>

#include "core/metrics/validation_run.h"
#include "core/present/caution.h"

namespace calivera {

inline constexpr const char* kValidationFormatId = "calivera-validation/1";

nlohmann::json validationToJson(const ValidationRun& run);
std::string validationJsonText(const ValidationRun& run);  // indented, trailing newline

}  // namespace calivera
