#pragma once
// `calivera pool`: site summaries (core/sites/site_summary.h) checked for compatibility, then
// pooled through the same code as `validate --cluster` (core/sites/site_pooling.h), so a cohort
// split into sites gives the same per-site measures, pools and net benefit either way. What only
// the whole cohort could give exactly is estimated from the aggregates with a stated bound:
// the AUC of all patients together from the logit histograms (BinnedAuc). The overall O/E
// (sum O / sum E, E = O / (O/E) per site) and Brier score (n-weighted) are exact up to rounding.

#include <string>
#include <vector>

#include "core/sites/site_pooling.h"
#include "core/sites/site_summary.h"

namespace calivera {

struct SummaryFile {
  std::string path;
  std::string sha256;  // of the file's bytes
  SiteSummary summary;
};

struct PooledSummaries {
  std::vector<SummaryFile> inputs;
  SiteAnalysis analysis;
  BinnedAuc overallAuc;
  std::size_t n = 0, events = 0;
  double overallOe = 0.0;
  double overallBrier = 0.0;
  std::vector<std::string> warnings;
};

// Throws InputError naming the file and the setting when the summaries cannot be pooled: fewer
// than two, a different model (fingerprint) or risk column, different threshold grids, bin
// widths, group counts or outcome definitions of performance, a site name or cohort file given
// twice. `netBenefitThresholds` empty: defaultTableThresholds of the common grid; otherwise each
// must be on it.
PooledSummaries poolSummaries(std::vector<SummaryFile> inputs,
                              const std::vector<double>& netBenefitThresholds);

}  // namespace calivera
