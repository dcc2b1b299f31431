#include "core/sites/site_pooling.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <map>

#include "core/metrics/decision_curve.h"
#include "core/metrics/sorted_cohort.h"
#include "core/util/errors.h"

namespace calivera {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

// One site's value of a measure on the pooling scale, or why it has none.
struct SiteValue {
  double estimate = kNaN;
  double variance = kNaN;
  std::string problem;
};

bool hasWarningFrom(const ValidationResult& r, const std::string& prefix) {
  return std::any_of(r.warnings.begin(), r.warnings.end(),
                     [&](const std::string& w) { return w.rfind(prefix, 0) == 0; });
}

std::string firstWarningFrom(const ValidationResult& r, const std::string& prefix) {
  for (const std::string& w : r.warnings) {
    if (w.rfind(prefix, 0) == 0) return w;
  }
  return {};
}

SiteValue cStatistic(const SubgroupResult& site) {
  const ValidationResult& m = *site.metrics;
  const double auc = m.discrimination.auc;
  const double se = m.discrimination.aucSe;
  if (!(auc > 0.0 && auc < 1.0)) {
    return {kNaN, kNaN,
            "AUC of " + std::string(auc >= 1.0 ? "1" : "0") +
                ": the logit scale is undefined (complete separation at this site)"};
  }
  if (!(std::isfinite(se) && se > 0.0)) {
    return {kNaN, kNaN, "no DeLong standard error (a single event or a single non-event)"};
  }
  const double seLogit = se / (auc * (1.0 - auc));
  return {std::log(auc / (1.0 - auc)), seLogit * seLogit, {}};
}

SiteValue oeRatio(const SubgroupResult& site) {
  const ValidationResult& m = *site.metrics;
  const double o = static_cast<double>(site.events);
  const double n = static_cast<double>(site.n);
  const double ratio = m.calibration.oeRatio;
  if (!(ratio > 0.0 && std::isfinite(ratio))) {
    return {kNaN, kNaN, "O/E of 0 or undefined: the log scale is undefined"};
  }
  const double variance = 1.0 / o - 1.0 / n;
  if (!(variance > 0.0)) return {kNaN, kNaN, "every patient an event: no variance of O"};
  return {std::log(ratio), variance, {}};
}

SiteValue regressionValue(double value, double se, const ValidationResult& m,
                          const std::string& warningPrefix) {
  if (hasWarningFrom(m, warningPrefix)) return {kNaN, kNaN, firstWarningFrom(m, warningPrefix)};
  if (!(std::isfinite(value) && std::isfinite(se) && se > 0.0)) {
    return {kNaN, kNaN, warningPrefix + " no finite estimate and standard error"};
  }
  return {value, se * se, {}};
}

SiteValue calibrationIntercept(const SubgroupResult& site) {
  const Calibration& c = site.metrics->calibration;
  return regressionValue(c.intercept, c.interceptSe, *site.metrics, "calibration-in-the-large:");
}

SiteValue calibrationSlope(const SubgroupResult& site) {
  const Calibration& c = site.metrics->calibration;
  return regressionValue(c.slope, c.slopeSe, *site.metrics, "calibration slope:");
}

struct MeasureDefinition {
  const char* key;
  const char* label;
  PoolingScale scale;
  double target;
  SiteValue (*value)(const SubgroupResult&);
};

const MeasureDefinition kMeasures[] = {
    {"c_statistic", "C-statistic (AUC)", PoolingScale::Logit, kNaN, cStatistic},
    {"oe_ratio", "O/E ratio", PoolingScale::Log, 1.0, oeRatio},
    {"calibration_intercept", "Calibration intercept", PoolingScale::Identity, 0.0,
     calibrationIntercept},
    {"calibration_slope", "Calibration slope", PoolingScale::Identity, 1.0, calibrationSlope},
};

std::string noMetricsReason(const SubgroupResult& site) {
  for (const std::string& w : site.warnings) {
    if (w.rfind("no metrics: ", 0) == 0) return w.substr(12);
  }
  return "no metrics at this site";
}

}  // namespace

const char* poolingScaleName(PoolingScale scale) {
  switch (scale) {
    case PoolingScale::Logit:
      return "logit";
    case PoolingScale::Log:
      return "log";
    case PoolingScale::Identity:
      return "identity";
  }
  return "identity";
}

double toNaturalScale(PoolingScale scale, double value) {
  switch (scale) {
    case PoolingScale::Logit:
      return 1.0 / (1.0 + std::exp(-value));
    case PoolingScale::Log:
      return std::exp(value);
    case PoolingScale::Identity:
      return value;
  }
  return value;
}

double netBenefitVariance(double threshold, std::size_t tp, std::size_t fp, std::size_t n) {
  const double total = static_cast<double>(n);
  const double pTp = static_cast<double>(tp) / total;
  const double pFp = static_cast<double>(fp) / total;
  const double w = threshold / (1.0 - threshold);
  return (pTp * (1.0 - pTp) + w * w * pFp * (1.0 - pFp) + 2.0 * w * pTp * pFp) / total;
}

SiteAnalysis validateSites(const std::string& column, const std::vector<std::string>& labels,
                           const ValidationInput& input, const ValidationOptions& options,
                           const std::vector<double>& netBenefitThresholds) {
  SiteAnalysis analysis;
  analysis.column = column;
  // Every site validated alone, exactly as a subgroup; no bootstrap.
  analysis.sites =
      validateSubgroups(column, labels, input, options, ValidationBootstrapOptions{}).levels;
  const std::size_t named = static_cast<std::size_t>(
      std::count_if(analysis.sites.begin(), analysis.sites.end(),
                    [](const SubgroupResult& s) { return s.level != kMissingLevel; }));
  if (named < 2) {
    throw InputError("--cluster " + column + ": " + std::to_string(named) +
                     " site with patients; pooling across sites needs at least two");
  }

  for (const MeasureDefinition& definition : kMeasures) {
    PooledMeasure measure;
    measure.key = definition.key;
    measure.label = definition.label;
    measure.scale = definition.scale;
    measure.target = definition.target;
    for (const SubgroupResult& site : analysis.sites) {
      if (site.level == kMissingLevel) {
        measure.excluded.push_back({site.level, "no site value: not a site"});
        continue;
      }
      if (!site.metrics) {
        measure.excluded.push_back({site.level, noMetricsReason(site)});
        continue;
      }
      const SiteValue value = definition.value(site);
      if (!value.problem.empty()) {
        measure.excluded.push_back({site.level, value.problem});
        continue;
      }
      measure.sites.push_back(site.level);
      measure.estimates.push_back(value.estimate);
      measure.variances.push_back(value.variance);
    }
    measure.pooled = poolRandomEffects(measure.estimates, measure.variances);
    analysis.measures.push_back(std::move(measure));
  }

  // Net benefit: each site's patients sorted once, counted at every threshold.
  std::map<std::string, std::vector<std::size_t>> members;
  for (std::size_t i = 0; i < labels.size(); ++i) members[labels[i]].push_back(i);
  std::vector<SortedCohort> sorted;
  for (const SubgroupResult& site : analysis.sites) {
    std::vector<double> risk, outcome;
    for (const std::size_t i : members[site.level]) {
      risk.push_back(input.risk[i]);
      outcome.push_back(input.outcome[i]);
    }
    sorted.push_back(sortCohort(risk, outcome));
  }
  for (const double t : netBenefitThresholds) {
    PooledNetBenefit nb;
    nb.threshold = t;
    for (std::size_t s = 0; s < analysis.sites.size(); ++s) {
      const std::string& level = analysis.sites[s].level;
      if (level == kMissingLevel) {
        nb.excluded.push_back({level, "no site value: not a site"});
        continue;
      }
      const ConfusionCounts c = sorted[s].countsAt(t);
      const std::size_t n = c.tp + c.fp + c.tn + c.fn;
      nb.n += n;
      nb.truePositives += c.tp;
      nb.falsePositives += c.fp;
      const double variance = netBenefitVariance(t, c.tp, c.fp, n);
      if (!(variance > 0.0)) {
        nb.excluded.push_back({level,
                               "net benefit without variance (no patient flagged, or "
                               "every patient flagged and an event)"});
        continue;
      }
      nb.sites.push_back(level);
      nb.estimates.push_back(netBenefitAt(t, c.tp, c.fp, c.tn, c.fn).netBenefit);
      nb.variances.push_back(variance);
    }
    const double odds = t / (1.0 - t);
    nb.byCounts =
        (static_cast<double>(nb.truePositives) - static_cast<double>(nb.falsePositives) * odds) /
        static_cast<double>(nb.n);
    nb.pooled = poolRandomEffects(nb.estimates, nb.variances);
    analysis.netBenefit.push_back(std::move(nb));
  }
  return analysis;
}

}  // namespace calivera
