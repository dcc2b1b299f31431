#pragma once
// The audit report's input from a command-line validation run (core/metrics/validation_run.h):
// file names and fingerprints, exclusions, the model and its development record, every setting
// of the run, and the result. The workstation builds the same input from its study state
// (ui/dialogs/report_export_dialog.h).

#include <cstddef>
#include <string>

#include "core/metrics/validation_run.h"
#include "core/report/audit_report.h"

namespace calivera {

// Thresholds of the run become the rows of the threshold table when there are at most this many;
// a longer grid (the default 0.01..0.99) is tabulated at a few customary thresholds.
inline constexpr std::size_t kMaxTabulatedThresholds = 30;

AuditReportInput auditInputFromRun(const ValidationRun& run, const std::string& title,
                                   std::size_t suppressBelow);

// The same with the run's uncertainty results (core/uncertainty/uncertainty_run.h): the report
// gains their sections, and its settings table the bootstrap, comparison and subgroup settings.
AuditReportInput auditInputFromRun(const ValidationRun& run, const std::string& title,
                                   std::size_t suppressBelow,
                                   const UncertaintyResults& uncertainty);

}  // namespace calivera
