#pragma once
// The report's first-page summary and its sign-off block (audit_report.h): what was validated,
// on what, the discrimination, calibration and clinical utility found, whether the cohort is
// large enough, and the main warnings, in a few rows; then lines for the analyst, the reviewer
// and the governance sign-off, filled from the report settings or left blank to fill by hand.
// Every number is one the later sections state in full, worded by the measure catalog
// (core/present/measures.h); counts pass through the disclosure plan.

#include <string>
#include <vector>

#include "core/report/audit_disclosure.h"
#include "core/report/audit_report.h"

namespace calivera {

// How many warnings the summary lists before "and N more (Section 2, Warnings)".
inline constexpr std::size_t kOverviewWarnings = 3;

void addOverview(const AuditReportInput& input, const AuditDocument& doc,
                 const DisclosurePlan& plan, const std::vector<std::string>& warnings,
                 std::vector<ReportBlock>& blocks);

void addSignOff(const AuditReportInput& input, std::vector<ReportBlock>& blocks);

}  // namespace calivera
