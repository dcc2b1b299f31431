#pragma once
// The tables of a validation across sites (core/sites/site_pooling.h), as ResultTables: each
// site validated alone, each measure pooled, and net benefit pooled at the tabulated thresholds.
// `--csv-dir` writes them as sites.csv, sites_pooled.csv and sites_net_benefit.csv; the command
// line's summary prints the first two with tableText.

#include "core/report/result_table.h"
#include "core/sites/site_pooling.h"
#include "core/sites/summary_pooling.h"

namespace calivera {

ResultTable sitesTable(const SiteAnalysis& analysis);
ResultTable pooledSitesTable(const SiteAnalysis& analysis);
ResultTable pooledNetBenefitTable(const SiteAnalysis& analysis);
// What a pool of site summaries read: each summary's site, file, counts, suppression, software
// and the SHA-256 of its bytes (site_inputs.csv).
ResultTable summaryInputsTable(const PooledSummaries& pooled);
// The one sentence on every site's patients together (counts, O/E, Brier, and the binned AUC with
// its bound) that `pool`'s summary, its report and the workstation's window all show.
std::string pooledOverallText(const PooledSummaries& pooled);

// "QLD: no events; VIC: ..." for the sites a pool left out; empty when none.
std::string exclusionText(const std::vector<SiteExclusion>& excluded);

}  // namespace calivera
