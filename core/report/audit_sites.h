#pragma once
// The report's section on validation across sites (validate --cluster, or pooled site summaries):
// each site's measures, the pools with their heterogeneity and prediction intervals, one forest
// plot per measure, and net benefit across sites; and the whole document `calivera pool --pdf`
// writes around that section.

#include <string>
#include <vector>

#include "core/report/audit_report.h"
#include "core/sites/summary_pooling.h"

namespace calivera {

// `suppressBelow` > 0: every site's patient and event counts are withheld when any site has a
// count of events or non-events below it (site totals can be subtracted from the cohort's).
void addSiteSection(const SiteAnalysis& analysis, std::size_t suppressBelow,
                    std::vector<ReportBlock>& blocks);

// The report of `calivera pool`: what was pooled (each summary's file, SHA-256, site and
// suppression), the overall aggregates, the site section, the methods and the caution.
AuditDocument buildPooledSitesDocument(const PooledSummaries& pooled, const std::string& title,
                                       const std::string& createdAt);

}  // namespace calivera
