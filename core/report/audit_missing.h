#pragma once
// The report's missing-data subsection (issue 17): which columns are missing together and how
// often, and with imputed copies the measures pooled by Rubin's rules next to the complete-case
// ones. Under small-cell suppression the patterns show rows only: patterns with fewer rows than
// the threshold are merged into one line (with the smallest other pattern when the merged line
// would itself be small), and event counts per pattern are withheld, since they add up to the
// published total of events.

#include <vector>

#include "core/report/audit_disclosure.h"
#include "core/report/audit_report.h"

namespace calivera {

void addMissingDataSection(const AuditReportInput& input, const DisclosurePlan& plan,
                           std::vector<ReportBlock>& blocks);

}  // namespace calivera
