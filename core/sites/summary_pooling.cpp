#include "core/sites/summary_pooling.h"

#include <algorithm>
#include <cmath>
#include <set>

#include "core/metrics/threshold_table.h"
#include "core/util/errors.h"

namespace calivera {
namespace {

void requireSame(const SummaryFile& first, const SummaryFile& other, const std::string& setting,
                 bool same, const std::string& firstValue, const std::string& otherValue) {
  if (same) return;
  throw InputError(other.path + ": " + setting + " '" + otherValue + "' differs from '" +
                   firstValue + "' in " + first.path +
                   "; summaries can be pooled only when every site validated the same model "
                   "with the same settings");
}

std::string listText(const std::vector<double>& values) {
  std::string text;
  for (std::size_t i = 0; i < values.size() && i < 5; ++i) {
    text += (i ? "," : "") + std::to_string(values[i]);
  }
  return text + (values.size() > 5 ? ",... (" + std::to_string(values.size()) + " values)" : "");
}

}  // namespace

PooledSummaries poolSummaries(std::vector<SummaryFile> inputs,
                              const std::vector<double>& netBenefitThresholds) {
  if (inputs.size() < 2) {
    throw InputError("pool: give at least two site summaries (got " +
                     std::to_string(inputs.size()) + "); one site has nothing to pool with");
  }
  const SummaryFile& first = inputs.front();
  const SiteSummary& a = first.summary;
  std::set<std::string> names, cohorts;
  PooledSummaries out;
  for (const SummaryFile& file : inputs) {
    const SiteSummary& b = file.summary;
    requireSame(first, file, "the model", a.modelKind == b.modelKind, a.modelKind, b.modelKind);
    if (a.modelKind == "model file") {
      requireSame(first, file, "the model file's SHA-256", a.modelSha256 == b.modelSha256,
                  a.modelSha256, b.modelSha256);
    } else {
      requireSame(first, file, "the risk column", a.riskColumn == b.riskColumn, a.riskColumn,
                  b.riskColumn);
    }
    requireSame(first, file, "the threshold grid", a.thresholdGrid == b.thresholdGrid,
                listText(a.thresholdGrid), listText(b.thresholdGrid));
    requireSame(first, file, "the histogram bin width", a.binWidth == b.binWidth,
                std::to_string(a.binWidth), std::to_string(b.binWidth));
    requireSame(first, file, "the number of risk groups", a.groups == b.groups,
                std::to_string(a.groups), std::to_string(b.groups));
    if (!names.insert(b.measures.name).second) {
      throw InputError(file.path + ": site '" + b.measures.name +
                       "' is given twice; each site's summary once, with its own --site name");
    }
    if (!cohorts.insert(b.dataSha256).second) {
      throw InputError(file.path + ": the same cohort file (SHA-256 " + b.dataSha256 +
                       ") was summarized twice; each site's patients once");
    }
    if (b.softwareVersion != a.softwareVersion) {
      out.warnings.push_back(file.path + " was written by Calivera " + b.softwareVersion + ", " +
                             first.path + " by " + a.softwareVersion);
    }
    if (b.outcomeColumn != a.outcomeColumn) {
      out.warnings.push_back("the outcome column is '" + b.outcomeColumn + "' at site '" +
                             b.measures.name + "' and '" + a.outcomeColumn + "' at site '" +
                             a.measures.name + "': check that it is the same outcome");
    }
    if (b.performance != a.performance) {
      out.warnings.push_back("site '" + b.measures.name + "' is " + b.performance +
                             " performance, site '" + a.measures.name + "' " + a.performance);
    }
  }
  if (a.modelKind == "risk column") {
    out.warnings.push_back(
        "the sites validated a risk column ('" + a.riskColumn +
        "'), which carries no fingerprint: that every site computed it with the same model "
        "cannot be checked here");
  }

  std::vector<double> thresholds = netBenefitThresholds;
  if (thresholds.empty()) {
    std::vector<ThresholdRow> rows;
    for (const double t : a.thresholdGrid) {
      ThresholdRow row;
      row.threshold = t;
      rows.push_back(row);
    }
    thresholds = defaultTableThresholds(rows);
  }
  for (const double t : thresholds) {
    const bool onGrid = std::any_of(a.thresholdGrid.begin(), a.thresholdGrid.end(),
                                    [&](double g) { return std::abs(g - t) < 1e-12; });
    if (!onGrid) {
      throw InputError("--report-thresholds: " + std::to_string(t) +
                       " is not among the thresholds the sites counted at");
    }
  }

  std::vector<SiteMeasures> sites;
  std::vector<const std::vector<LogitHistogramCell>*> histograms;
  double expected = 0.0, brierSum = 0.0;
  for (const SummaryFile& file : inputs) {
    const SiteMeasures& m = file.summary.measures;
    sites.push_back(m);
    histograms.push_back(&file.summary.histogram);
    out.n += m.n;
    out.events += m.events;
    expected += static_cast<double>(m.events) / m.oeRatio;
    brierSum += m.brier * static_cast<double>(m.n);
  }
  out.overallOe = static_cast<double>(out.events) / expected;
  out.overallBrier = brierSum / static_cast<double>(out.n);
  out.overallAuc = binnedAuc(histograms);
  out.analysis = poolSites("site summaries", std::move(sites), thresholds);
  out.analysis.column = "site summaries";
  out.inputs = std::move(inputs);
  return out;
}

}  // namespace calivera
