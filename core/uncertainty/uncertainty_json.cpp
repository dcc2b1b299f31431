#include "core/uncertainty/uncertainty_json.h"

#include <cmath>

#include "core/metrics/json_values.h"
#include "core/sites/site_json.h"
#include "core/uncertainty/bootstrap_measures.h"

namespace calivera {
namespace {

using nlohmann::json;

json estimate(const BootstrapEstimate& e) {
  return {{"estimate", jsonNumber(e.estimate)},
          {"ci", jsonInterval(e.ci)},
          {"replicates_used", e.replicatesUsed}};
}

json band(const std::vector<BandPoint>& points, const char* xName) {
  json out = json::array();
  for (const auto& p : points) {
    out.push_back({{xName, p.x},
                   {"estimate", jsonNumber(p.estimate)},
                   {"ci", jsonInterval(p.ci)},
                   {"replicates_used", p.replicatesUsed}});
  }
  return out;
}

}  // namespace

json toJson(const BootstrapSummary& s) {
  return {{"replicates", s.replicates},
          {"seed", s.seed},
          {"threads", s.threads},
          {"failed", s.failed},
          {"first_failure", s.firstFailure},
          {"method", "percentile bootstrap, patients resampled with replacement"}};
}

json toJson(const ValidationBootstrap& b) {
  json out = {{"run", toJson(b.run)}};
  for (const BootstrappedMeasure& m : bootstrappedMeasures()) out[m.key] = estimate(b.*m.interval);
  out["net_benefit_band"] = band(b.netBenefit, "threshold");
  out["calibration_band"] = band(b.calibrationCurve, "risk");
  out["warnings"] = b.warnings;
  return out;
}

json toJson(const ModelComparison& c) {
  json pairs = json::array();
  for (const auto& pair : c.pairs) {
    const PairedAucTest& t = pair.auc;
    json nb = json::array();
    for (const auto& p : pair.netBenefit) {
      nb.push_back({{"threshold", p.threshold},
                    {"net_benefit_first", jsonNumber(p.netBenefitFirst)},
                    {"net_benefit_second", jsonNumber(p.netBenefitSecond)},
                    {"difference", jsonNumber(p.difference)},
                    {"ci", jsonInterval(p.ci)}});
    }
    pairs.push_back({{"first", c.models[t.first]},
                     {"second", c.models[t.second]},
                     {"auc_first", jsonNumber(t.aucFirst)},
                     {"auc_second", jsonNumber(t.aucSecond)},
                     {"auc_difference", jsonNumber(t.difference)},
                     {"auc_difference_se", jsonNumber(t.se)},
                     {"auc_difference_ci", jsonInterval(t.differenceCi)},
                     {"z", jsonNumber(t.z)},
                     {"p_value", jsonNumber(t.pValue)},
                     {"auc_correlation", jsonNumber(t.correlation)},
                     {"net_benefit_difference", nb}});
  }
  json covariance = json::array();
  for (const auto& row : c.aucCovariance) {
    json r = json::array();
    for (double v : row) r.push_back(jsonNumber(v));
    covariance.push_back(r);
  }
  json aucs = json::array();
  for (double a : c.aucs) aucs.push_back(jsonNumber(a));
  return {{"models", c.models},
          {"aucs", aucs},
          {"auc_covariance", covariance},
          {"auc_test", "paired DeLong (DeLong et al. 1988), two-sided"},
          {"pairs", pairs},
          {"bootstrap", toJson(c.bootstrap)},
          {"warnings", c.warnings}};
}

json headlineMetricsJson(const ValidationResult& r) {
  const auto& d = r.discrimination;
  const auto& cal = r.calibration;
  return {{"auc", jsonNumber(d.auc)},
          {"auc_se", jsonNumber(d.aucSe)},
          {"auc_ci", jsonInterval(d.aucCi)},
          {"brier", jsonNumber(r.overall.brier)},
          {"brier_scaled", jsonNumber(r.overall.brierScaled)},
          {"calibration_intercept", jsonNumber(cal.intercept)},
          {"calibration_intercept_ci", jsonInterval(cal.interceptCi)},
          {"calibration_slope", jsonNumber(cal.slope)},
          {"calibration_slope_ci", jsonInterval(cal.slopeCi)},
          {"oe_ratio", jsonNumber(cal.oeRatio)},
          {"oe_ci", jsonInterval(cal.oeCi)},
          {"ici", jsonNumber(cal.ici)},
          {"e50", jsonNumber(cal.e50)},
          {"e90", jsonNumber(cal.e90)},
          {"emax", jsonNumber(cal.emax)},
          {"hosmer_lemeshow",
           {{"statistic", jsonNumber(r.hosmerLemeshow.statistic)},
            {"df", r.hosmerLemeshow.df},
            {"p_value", jsonNumber(r.hosmerLemeshow.pValue)}}},
          {"calibration_curve",
           [&] {
             json curve = json::array();
             for (const auto& p : cal.curve) {
               curve.push_back({{"risk", p.risk}, {"observed", jsonNumber(p.observed)}});
             }
             return curve;
           }()},
          {"warnings", r.warnings}};
}

json toJson(const SubgroupAnalysis& s) {
  json levels = json::array();
  for (const auto& level : s.levels) {
    json entry = {
        {"column", s.column},     {"level", level.level},        {"n", level.n},
        {"events", level.events}, {"too_small", level.tooSmall}, {"warnings", level.warnings}};
    entry["metrics"] = level.metrics ? headlineMetricsJson(*level.metrics) : json(nullptr);
    entry["bootstrap"] = level.bootstrap ? toJson(*level.bootstrap) : json(nullptr);
    levels.push_back(entry);
  }
  return levels;
}

json toJson(const SampleSizeAssessment& a) {
  json rules = json::array();
  for (const auto& r : a.rules) rules.push_back({{"rule", r.rule}, {"met", r.met}});
  json criteria = json::array();
  for (const auto& c : a.criteria) {
    criteria.push_back(
        {{"criterion", c.criterion},
         {"target_ci_width", c.targetCiWidth},
         {"target_se", c.targetSe},
         {"required_n", jsonNumber(c.requiredN)},
         {"required_events", jsonNumber(c.requiredEvents)},
         {"achieved_ci_width", c.achievedCiWidth ? jsonNumber(*c.achievedCiWidth) : json(nullptr)},
         {"met", c.met},
         {"note", c.note}});
  }
  return {{"n", a.n},
          {"events", a.events},
          {"non_events", a.nonEvents},
          {"prevalence", a.prevalence},
          {"rules_of_thumb", rules},
          {"criteria", criteria},
          {"required_n", jsonNumber(a.requiredN)},
          {"driving_criterion", a.drivingCriterion},
          {"adequate", a.adequate},
          {"verdict", a.verdict},
          {"source", "Riley et al., Stat Med 2021;40:4230-51 (precision criteria)"}};
}

json toJson(const OptimismResult& o) {
  json measures = json::array();
  for (const auto& m : o.measures) {
    measures.push_back({{"measure", m.measure},
                        {"apparent", jsonNumber(m.apparent)},
                        {"mean_optimism", jsonNumber(m.meanOptimism)},
                        {"optimism_sd", jsonNumber(m.optimismSd)},
                        {"corrected", jsonNumber(m.corrected)},
                        {"replicates_used", m.replicatesUsed}});
  }
  return {{"method", "bootstrap optimism correction (Efron 1983; Harrell, Lee & Mark 1996)"},
          {"run", toJson(o.run)},
          {"firth", o.firth},
          {"n", o.n},
          {"events", o.events},
          {"measures", measures},
          {"shrinkage_factor", jsonNumber(o.shrinkageFactor)},
          {"warnings", o.warnings}};
}

json toJson(const ClosedTestResult& c) {
  json steps = json::array();
  for (const auto& s : c.steps) {
    steps.push_back({{"hypothesis", s.hypothesis},
                     {"lr_statistic", jsonNumber(s.lrStatistic)},
                     {"df", s.df},
                     {"p_value", jsonNumber(s.pValue)},
                     {"rejected", s.rejected}});
  }
  return {{"method", "closed testing procedure (Vergouwe et al., Stat Med 2017)"},
          {"alpha", c.alpha},
          {"deviance",
           {{"original", jsonNumber(c.devianceOriginal)},
            {"intercept", jsonNumber(c.devianceIntercept)},
            {"recalibrate", jsonNumber(c.devianceRecalibrated)},
            {"refit", jsonNumber(c.devianceRefit)}}},
          {"steps", steps},
          {"suggested", updateMethodName(c.suggested)},
          {"warnings", c.warnings}};
}

}  // namespace calivera

namespace calivera {

void addUncertaintyJson(nlohmann::json& out, const UncertaintyResults& results) {
  out["sample_size"] = toJson(results.sampleSize);
  if (results.bootstrap) out["bootstrap"] = toJson(*results.bootstrap);
  if (results.comparison) {
    nlohmann::json comparison = toJson(*results.comparison);
    nlohmann::json files = nlohmann::json::array();
    for (const auto& m : results.comparedModels) {
      files.push_back({{"path", m.path}, {"sha256", m.sha256}, {"name", m.name}});
    }
    comparison["compared_model_files"] = files;
    comparison["rows"] = results.comparisonRows;
    out["comparison"] = comparison;
  }
  if (!results.subgroups.empty()) {
    nlohmann::json all = nlohmann::json::array();
    for (const auto& analysis : results.subgroups) {
      for (auto& entry : toJson(analysis)) all.push_back(entry);
    }
    out["subgroups"] = all;
  }
  if (results.sites) out["clusters"] = siteAnalysisJson(*results.sites);
}

}  // namespace calivera
