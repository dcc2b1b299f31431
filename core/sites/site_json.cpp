#include "core/sites/site_json.h"

#include <cmath>
#include <limits>

#include "core/metrics/json_values.h"

namespace calivera {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

nlohmann::json exclusionsJson(const std::vector<SiteExclusion>& excluded) {
  nlohmann::json out = nlohmann::json::array();
  for (const SiteExclusion& e : excluded) out.push_back({{"site", e.site}, {"reason", e.reason}});
  return out;
}

nlohmann::json poolJson(PoolingScale scale, const RandomEffectsOutcome& outcome) {
  nlohmann::json out;
  out["scale"] = poolingScaleName(scale);
  if (!outcome.pool) {
    const nlohmann::json none = jsonInterval(Interval{kNaN, kNaN});
    out["k"] = 0;
    out["estimate"] = nullptr;
    out["ci"] = none;
    out["prediction_interval"] = none;
    out["tau2"] = nullptr;
    out["i2"] = nullptr;
    out["fixed_effect"] = {{"estimate", nullptr}, {"ci", none}};
    out["problem"] = outcome.problem;
    return out;
  }
  const RandomEffectsPool& p = *outcome.pool;
  const Interval noInterval{kNaN, kNaN};
  out["k"] = p.k;
  out["estimate"] = jsonNumber(toNaturalScale(scale, p.estimate));
  out["ci"] = jsonInterval(toNaturalScale(scale, p.ci));
  out["prediction_interval"] = jsonInterval(
      p.predictionInterval ? toNaturalScale(scale, *p.predictionInterval) : noInterval);
  if (!p.predictionInterval) {
    out["prediction_interval_problem"] = "a prediction interval needs at least three sites";
  }
  out["tau2"] = jsonNumber(p.tau2);
  out["i2"] = jsonNumber(p.i2);
  out["fixed_effect"] = {{"estimate", jsonNumber(toNaturalScale(scale, p.fixedEstimate))},
                         {"ci", jsonInterval(toNaturalScale(scale, p.fixedCi))}};
  out["ci_hksj_untruncated"] = jsonInterval(toNaturalScale(scale, p.ciHksj));
  out["ci_wald"] = jsonInterval(toNaturalScale(scale, p.ciWald));
  out["hksj_scale_q"] = jsonNumber(p.hksjScale);
  out["cochran_q"] = jsonNumber(p.q);
  out["cochran_q_p_value"] = jsonNumber(p.qPValue);
  out["on_pooling_scale"] = {{"estimate", jsonNumber(p.estimate)},
                             {"se", jsonNumber(p.se)},
                             {"ci", jsonInterval(p.ci)},
                             {"fixed_effect_estimate", jsonNumber(p.fixedEstimate)},
                             {"fixed_effect_se", jsonNumber(p.fixedSe)}};
  out["tau2_iterations"] = p.iterations;
  return out;
}

}  // namespace

nlohmann::json siteMeasuresJson(const SiteMeasures& site) {
  nlohmann::json s;
  s["name"] = site.name;
  s["n"] = site.n;
  s["events"] = site.events;
  s["auc"] = jsonNumber(site.auc);
  s["auc_se"] = jsonNumber(site.aucSe);
  s["auc_ci"] = jsonInterval(site.aucCi);
  s["oe_ratio"] = jsonNumber(site.oeRatio);
  s["log_oe_se"] = jsonNumber(site.hasMetrics ? site.logOeSe() : kNaN);
  s["calibration_intercept"] = jsonNumber(site.intercept);
  s["calibration_intercept_se"] = jsonNumber(site.interceptSe);
  s["calibration_slope"] = jsonNumber(site.slope);
  s["calibration_slope_se"] = jsonNumber(site.slopeSe);
  s["brier"] = jsonNumber(site.brier);
  if (site.missingLevel) s["missing_site_value"] = true;
  if (!site.hasMetrics) s["no_metrics_reason"] = site.noMetricsReason;
  nlohmann::json problems = nlohmann::json::object();
  for (const auto& [key, reason] : site.problems) problems[key] = reason;
  s["not_pooled"] = problems;
  s["warnings"] = site.warnings;
  return s;
}

nlohmann::json calibrationCurveJson(const std::vector<CalibrationCurvePoint>& points) {
  nlohmann::json curve = nlohmann::json::array();
  for (const CalibrationCurvePoint& p : points) {
    curve.push_back(nlohmann::json::array({p.risk, jsonNumber(p.observed)}));
  }
  return curve;
}

nlohmann::json siteAnalysisJson(const SiteAnalysis& analysis) {
  nlohmann::json out;
  out["column"] = analysis.column;
  out["method"] = {
      {"tau2", "REML (Fisher scoring), truncated at 0"},
      {"ci",
       "Hartung-Knapp-Sidik-Jonkman, t on k-1 df, scale factor max(1, q) (Knapp & "
       "Hartung 2003) so never narrower than the plain-SE interval"},
      {"prediction_interval", "t on k-2 df, sqrt(tau2 + SE^2) (Riley, Higgins & Deeks 2011)"},
      {"i2", "tau2 / (tau2 + typical within-site variance) (Higgins & Thompson 2002)"},
      {"fixed_effect", "inverse-variance, Wald 95% CI"},
      {"scales",
       "c_statistic on logit(AUC), oe_ratio on log(O/E); estimates and intervals are "
       "back-transformed, tau2 is on the pooling scale"}};
  nlohmann::json sites = nlohmann::json::array();
  for (const SiteMeasures& site : analysis.sites) {
    nlohmann::json entry = siteMeasuresJson(site);
    entry["calibration_curve"] = calibrationCurveJson(site.calibrationCurve);
    sites.push_back(std::move(entry));
  }
  out["sites"] = sites;
  nlohmann::json pooled = nlohmann::json::object();
  for (const PooledMeasure& m : analysis.measures) {
    nlohmann::json entry = poolJson(m.scale, m.pooled);
    entry["label"] = m.label;
    entry["sites"] = m.sites;
    entry["excluded"] = exclusionsJson(m.excluded);
    pooled[m.key] = entry;
  }
  out["pooled"] = pooled;
  nlohmann::json netBenefit = nlohmann::json::array();
  for (const PooledNetBenefit& nb : analysis.netBenefit) {
    nlohmann::json entry;
    entry["threshold"] = nb.threshold;
    if (nb.byCounts) {
      entry["by_counts"] = {{"n", nb.n},
                            {"true_positives", nb.truePositives},
                            {"false_positives", nb.falsePositives},
                            {"estimate", jsonNumber(*nb.byCounts)}};
    } else {
      // A site withheld its counts here: the sum would reveal them, so it stays withheld.
      entry["by_counts"] = {{"n", nb.n},
                            {"true_positives", nullptr},
                            {"false_positives", nullptr},
                            {"estimate", nullptr},
                            {"withheld_by", nb.suppressedAt}};
    }
    nlohmann::json random = poolJson(PoolingScale::Identity, nb.pooled);
    random["sites"] = nb.sites;
    random["excluded"] = exclusionsJson(nb.excluded);
    entry["random_effects"] = random;
    netBenefit.push_back(entry);
  }
  out["net_benefit"] = netBenefit;
  return out;
}

}  // namespace calivera
