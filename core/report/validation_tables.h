#pragma once
// The validation tables as CSV (comma, header row, '.' decimals, 10 significant digits, empty
// field for an undefined value), for `calivera validate --csv-dir DIR` and for export from the
// workstation. Each table is one file in DIR:
//   thresholds.csv, decision_curve.csv, hosmer_lemeshow_groups.csv, calibration_curve.csv,
//   roc.csv, risk_distribution.csv, summary.csv (one row per scalar statistic), warnings.csv,
//   missing_patterns.csv; with imputed copies also pooled_imputations.csv,
//   imputed_calibration_curve.csv and imputed_decision_curve.csv (means over the copies).
// The threshold and group tables are defined once, with their on-screen labels, in
// core/report/result_table.h; the workstation exports them as this same text.

#include <string>
#include <utility>
#include <vector>

#include "core/metrics/validation_run.h"

namespace calivera {

// (file name, CSV text) for every table, in the order above.
std::vector<std::pair<std::string, std::string>> validationTables(const ValidationRun& run);

// Creates DIR if needed and writes every table atomically. If any write fails, the tables this
// call already wrote are removed again and the error propagates (InputError naming the path).
void writeValidationTables(const std::string& directory, const ValidationRun& run);

// The same for any list of (file name, CSV text).
void writeTables(const std::string& directory,
                 const std::vector<std::pair<std::string, std::string>>& tables);

}  // namespace calivera
