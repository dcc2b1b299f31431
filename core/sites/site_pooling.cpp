#include "core/sites/site_pooling.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>

#include "core/metrics/decision_curve.h"
#include "core/metrics/sorted_cohort.h"
#include "core/metrics/threshold_table.h"
#include "core/util/errors.h"

namespace calivera {
namespace {

struct MeasureDefinition {
  const char* key;
  const char* label;
  PoolingScale scale;
};

const MeasureDefinition kMeasures[] = {
    {"c_statistic", "C-statistic (AUC)", PoolingScale::Logit},
    {"oe_ratio", "O/E ratio", PoolingScale::Log},
    {"calibration_intercept", "Calibration intercept", PoolingScale::Identity},
    {"calibration_slope", "Calibration slope", PoolingScale::Identity},
};

// A usable site's estimate and variance on the measure's pooling scale.
std::pair<double, double> onPoolingScale(const std::string& key, const SiteMeasures& s) {
  if (key == "c_statistic") {
    const double se = s.aucSe / (s.auc * (1.0 - s.auc));  // delta method
    return {std::log(s.auc / (1.0 - s.auc)), se * se};
  }
  if (key == "oe_ratio") return {std::log(s.oeRatio), s.logOeSe() * s.logOeSe()};
  if (key == "calibration_intercept") return {s.intercept, s.interceptSe * s.interceptSe};
  return {s.slope, s.slopeSe * s.slopeSe};
}

const char* const kNotASite = "no site value: not a site";

}  // namespace

double netBenefitVariance(double threshold, std::size_t tp, std::size_t fp, std::size_t n) {
  const double total = static_cast<double>(n);
  const double pTp = static_cast<double>(tp) / total;
  const double pFp = static_cast<double>(fp) / total;
  const double w = threshold / (1.0 - threshold);
  return (pTp * (1.0 - pTp) + w * w * pFp * (1.0 - pFp) + 2.0 * w * pTp * pFp) / total;
}

SiteAnalysis poolSites(const std::string& column, std::vector<SiteMeasures> sites,
                       const std::vector<double>& netBenefitThresholds) {
  SiteAnalysis analysis;
  analysis.column = column;
  analysis.sites = std::move(sites);
  const std::size_t named = static_cast<std::size_t>(
      std::count_if(analysis.sites.begin(), analysis.sites.end(),
                    [](const SiteMeasures& s) { return !s.missingLevel && s.n > 0; }));
  if (named < 2) {
    throw InputError(column + ": " + std::to_string(named) +
                     " site with patients; pooling across sites needs at least two");
  }

  for (const MeasureDefinition& definition : kMeasures) {
    PooledMeasure measure;
    measure.key = definition.key;
    measure.label = definition.label;
    measure.scale = definition.scale;
    for (const SiteMeasures& site : analysis.sites) {
      if (site.missingLevel) {
        measure.excluded.push_back({site.name, kNotASite});
        continue;
      }
      const auto problem = site.problems.find(measure.key);
      if (problem != site.problems.end()) {
        measure.excluded.push_back({site.name, problem->second});
        continue;
      }
      const auto [estimate, variance] = onPoolingScale(measure.key, site);
      if (!(std::isfinite(estimate) && std::isfinite(variance) && variance > 0.0)) {
        measure.excluded.push_back({site.name, "no finite estimate and variance"});
        continue;
      }
      measure.sites.push_back(site.name);
      measure.estimates.push_back(estimate);
      measure.variances.push_back(variance);
    }
    measure.pooled = poolRandomEffects(measure.estimates, measure.variances);
    analysis.measures.push_back(std::move(measure));
  }

  for (const double t : netBenefitThresholds) {
    PooledNetBenefit nb;
    nb.threshold = t;
    const double odds = t / (1.0 - t);
    for (const SiteMeasures& site : analysis.sites) {
      if (site.missingLevel) {
        nb.excluded.push_back({site.name, kNotASite});
        continue;
      }
      const auto counts = std::find_if(
          site.thresholds.begin(), site.thresholds.end(),
          [&](const SiteThresholdCounts& c) { return std::abs(c.threshold - t) < 1e-12; });
      if (counts == site.thresholds.end()) {
        throw InputError("site '" + site.name + "' has no counts at threshold " +
                         std::to_string(t));
      }
      nb.n += site.n;
      if (counts->suppressed) {
        nb.suppressedAt.push_back(site.name);
        nb.excluded.push_back({site.name, "counts withheld at this site (small cells)"});
        continue;
      }
      nb.truePositives += counts->truePositives;
      nb.falsePositives += counts->falsePositives;
      const double variance =
          netBenefitVariance(t, counts->truePositives, counts->falsePositives, site.n);
      if (!(variance > 0.0)) {
        nb.excluded.push_back({site.name,
                               "net benefit without variance (no patient flagged, or "
                               "every patient flagged and an event)"});
        continue;
      }
      nb.sites.push_back(site.name);
      nb.estimates.push_back((static_cast<double>(counts->truePositives) -
                              static_cast<double>(counts->falsePositives) * odds) /
                             static_cast<double>(site.n));
      nb.variances.push_back(variance);
    }
    if (nb.suppressedAt.empty()) {
      nb.byCounts =
          (static_cast<double>(nb.truePositives) - static_cast<double>(nb.falsePositives) * odds) /
          static_cast<double>(nb.n);
    }
    nb.pooled = poolRandomEffects(nb.estimates, nb.variances);
    analysis.netBenefit.push_back(std::move(nb));
  }
  return analysis;
}

SiteAnalysis validateSites(const std::string& column, const std::vector<std::string>& labels,
                           const ValidationInput& input, const ValidationOptions& options,
                           const std::vector<double>& netBenefitThresholds) {
  // Every site validated alone, exactly as a subgroup; no bootstrap.
  ValidationBootstrapOptions noBootstrap;
  noBootstrap.bootstrap.replicates = 0;
  std::vector<SubgroupResult> validations =
      validateSubgroups(column, labels, input, options, noBootstrap).levels;
  std::map<std::string, std::vector<std::size_t>> members;
  for (std::size_t i = 0; i < labels.size(); ++i) members[labels[i]].push_back(i);
  std::vector<SiteMeasures> sites;
  for (const SubgroupResult& v : validations) {
    std::vector<double> risk, outcome;
    if (!v.metrics) {
      for (const std::size_t i : members[v.level]) {
        risk.push_back(input.risk[i]);
        outcome.push_back(input.outcome[i]);
      }
    }
    std::vector<std::string> warnings;
    std::string noMetricsReason = "no metrics at this site";
    for (const std::string& w : v.warnings) {
      if (w.rfind("no metrics: ", 0) == 0) {
        noMetricsReason = w.substr(12);
      }
      warnings.push_back(w);
    }
    // A validated site has its threshold table; a site without metrics is counted here.
    const std::vector<ThresholdRow> counted =
        v.metrics ? v.metrics->thresholds
                  : thresholdTable(sortCohort(risk, outcome), netBenefitThresholds);
    SiteMeasures s = siteMeasures(v.level, v.n, v.events, v.metrics ? &*v.metrics : nullptr,
                                  noMetricsReason, warnings, counted, netBenefitThresholds);
    s.missingLevel = v.level == kMissingLevel;
    sites.push_back(std::move(s));
  }
  SiteAnalysis analysis = poolSites("--cluster " + column, std::move(sites), netBenefitThresholds);
  analysis.column = column;
  analysis.validations = std::move(validations);
  return analysis;
}

}  // namespace calivera
