#include "core/uncertainty/uncertainty_json.h"

#include <cmath>

namespace calivera {
namespace {

using nlohmann::json;

json number(double value) {
  return std::isfinite(value) ? json(value) : json(nullptr);
}

json interval(const Interval& ci) {
  return json::array({number(ci.lo), number(ci.hi)});
}

json estimate(const BootstrapEstimate& e) {
  return {{"estimate", number(e.estimate)},
          {"ci", interval(e.ci)},
          {"replicates_used", e.replicatesUsed}};
}

json band(const std::vector<BandPoint>& points, const char* xName) {
  json out = json::array();
  for (const auto& p : points) {
    out.push_back({{xName, p.x},
                   {"estimate", number(p.estimate)},
                   {"ci", interval(p.ci)},
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
  return {{"run", toJson(b.run)},
          {"auc", estimate(b.auc)},
          {"brier", estimate(b.brier)},
          {"brier_scaled", estimate(b.brierScaled)},
          {"calibration_intercept", estimate(b.calibrationIntercept)},
          {"calibration_slope", estimate(b.calibrationSlope)},
          {"oe_ratio", estimate(b.oeRatio)},
          {"ici", estimate(b.ici)},
          {"e90", estimate(b.e90)},
          {"net_benefit_band", band(b.netBenefit, "threshold")},
          {"calibration_band", band(b.calibrationCurve, "risk")},
          {"warnings", b.warnings}};
}

json toJson(const ModelComparison& c) {
  json pairs = json::array();
  for (const auto& pair : c.pairs) {
    const PairedAucTest& t = pair.auc;
    json nb = json::array();
    for (const auto& p : pair.netBenefit) {
      nb.push_back({{"threshold", p.threshold},
                    {"net_benefit_first", number(p.netBenefitFirst)},
                    {"net_benefit_second", number(p.netBenefitSecond)},
                    {"difference", number(p.difference)},
                    {"ci", interval(p.ci)}});
    }
    pairs.push_back({{"first", c.models[t.first]},
                     {"second", c.models[t.second]},
                     {"auc_first", number(t.aucFirst)},
                     {"auc_second", number(t.aucSecond)},
                     {"auc_difference", number(t.difference)},
                     {"auc_difference_se", number(t.se)},
                     {"auc_difference_ci", interval(t.differenceCi)},
                     {"z", number(t.z)},
                     {"p_value", number(t.pValue)},
                     {"auc_correlation", number(t.correlation)},
                     {"net_benefit_difference", nb}});
  }
  json covariance = json::array();
  for (const auto& row : c.aucCovariance) {
    json r = json::array();
    for (double v : row) r.push_back(number(v));
    covariance.push_back(r);
  }
  json aucs = json::array();
  for (double a : c.aucs) aucs.push_back(number(a));
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
  return {{"auc", number(d.auc)},
          {"auc_se", number(d.aucSe)},
          {"auc_ci", interval(d.aucCi)},
          {"brier", number(r.overall.brier)},
          {"brier_scaled", number(r.overall.brierScaled)},
          {"calibration_intercept", number(cal.intercept)},
          {"calibration_intercept_ci", interval(cal.interceptCi)},
          {"calibration_slope", number(cal.slope)},
          {"calibration_slope_ci", interval(cal.slopeCi)},
          {"oe_ratio", number(cal.oeRatio)},
          {"oe_ci", interval(cal.oeCi)},
          {"ici", number(cal.ici)},
          {"e50", number(cal.e50)},
          {"e90", number(cal.e90)},
          {"emax", number(cal.emax)},
          {"hosmer_lemeshow",
           {{"statistic", number(r.hosmerLemeshow.statistic)},
            {"df", r.hosmerLemeshow.df},
            {"p_value", number(r.hosmerLemeshow.pValue)}}},
          {"calibration_curve",
           [&] {
             json curve = json::array();
             for (const auto& p : cal.curve) {
               curve.push_back({{"risk", p.risk}, {"observed", number(p.observed)}});
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
         {"required_n", number(c.requiredN)},
         {"required_events", number(c.requiredEvents)},
         {"achieved_ci_width", c.achievedCiWidth ? number(*c.achievedCiWidth) : json(nullptr)},
         {"met", c.met},
         {"note", c.note}});
  }
  return {{"n", a.n},
          {"events", a.events},
          {"non_events", a.nonEvents},
          {"prevalence", a.prevalence},
          {"rules_of_thumb", rules},
          {"criteria", criteria},
          {"required_n", number(a.requiredN)},
          {"driving_criterion", a.drivingCriterion},
          {"adequate", a.adequate},
          {"verdict", a.verdict},
          {"source", "Riley et al., Stat Med 2021;40:4230-51 (precision criteria)"}};
}

json toJson(const OptimismResult& o) {
  json measures = json::array();
  for (const auto& m : o.measures) {
    measures.push_back({{"measure", m.measure},
                        {"apparent", number(m.apparent)},
                        {"mean_optimism", number(m.meanOptimism)},
                        {"optimism_sd", number(m.optimismSd)},
                        {"corrected", number(m.corrected)},
                        {"replicates_used", m.replicatesUsed}});
  }
  return {{"method", "bootstrap optimism correction (Efron 1983; Harrell, Lee & Mark 1996)"},
          {"run", toJson(o.run)},
          {"firth", o.firth},
          {"n", o.n},
          {"events", o.events},
          {"measures", measures},
          {"shrinkage_factor", number(o.shrinkageFactor)},
          {"warnings", o.warnings}};
}

json toJson(const ClosedTestResult& c) {
  json steps = json::array();
  for (const auto& s : c.steps) {
    steps.push_back({{"hypothesis", s.hypothesis},
                     {"lr_statistic", number(s.lrStatistic)},
                     {"df", s.df},
                     {"p_value", number(s.pValue)},
                     {"rejected", s.rejected}});
  }
  return {{"method", "closed testing procedure (Vergouwe et al., Stat Med 2017)"},
          {"alpha", c.alpha},
          {"deviance",
           {{"original", number(c.devianceOriginal)},
            {"intercept", number(c.devianceIntercept)},
            {"recalibrate", number(c.devianceRecalibrated)},
            {"refit", number(c.devianceRefit)}}},
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
}

}  // namespace calivera
