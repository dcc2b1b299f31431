#pragma once
// The missing-data part of a validation's JSON and text summary (issue 17): how missing values
// were handled, the missingness patterns, and with stacked imputations the measures pooled by
// Rubin's rules. Layout (added keys of `calivera validate --json`; the complete-case results keep
// their keys):
//   missing_data {method "complete_case" | "imputed_elsewhere" | "chained_equations", m,
//                 imputation_column | null,
//                 chained_equations {iterations, seed, donors,
//                                    imputed_columns [{column, method, imputed}]}
//                 (chained equations only),
//                 imputation_indices [..], patients_per_copy, events_per_copy,
//                 patterns [{missing [col..], rows, outcome_known, events, event_rate}],
//                 other_patterns {patterns, rows},
//                 hosmer_lemeshow_per_imputation {df, statistic {smallest, median, largest},
//                                                 p_value {...}} | null,
//                 calibration_curve [{risk, observed}] (mean over copies),
//                 decision_curve [{threshold, net_benefit, net_benefit_treat_all}] (mean)},
//   pooled {<measure>: {estimate, ci [lo, hi], within_variance, between_variance,
//           total_variance, fraction_missing_information, df, complete_data_df, scale,
//           estimate_on_scale, per_imputation [..], per_imputation_variance [..], problem}}
//          | null   (measures: c_statistic, oe_ratio, calibration_intercept,
//                    calibration_slope, brier; variances and df on `scale`)

#include <nlohmann/json.hpp>
#include <string>

#include "core/metrics/validation_run.h"

namespace calivera {

nlohmann::json missingDataJson(const ValidationRun& run);
nlohmann::json pooledJson(const ValidationRun& run);

// Lines for the text summary: the patterns and, with imputations, the pooled measures.
std::string missingDataSummaryText(const ValidationRun& run);

}  // namespace calivera
