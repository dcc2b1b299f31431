#include "core/report/validation_json.h"

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

json groupsJson(const std::vector<CalibrationGroup>& groups) {
  json out = json::array();
  for (const CalibrationGroup& g : groups) {
    out.push_back({{"n", g.n},
                   {"observed", g.observed},
                   {"expected", number(g.expected)},
                   {"mean_risk", number(g.meanRisk)},
                   {"observed_proportion", number(g.observedProportion)},
                   {"observed_ci", interval(g.observedCi)},
                   {"risk_min", number(g.riskLo)},
                   {"risk_max", number(g.riskHi)}});
  }
  return out;
}

json discriminationJson(const Discrimination& d) {
  json roc = json::array();
  for (const RocPoint& p : d.roc) {
    roc.push_back({{"threshold", number(p.threshold)}, {"fpr", p.fpr}, {"tpr", p.tpr}});
  }
  return {{"auc", number(d.auc)},
          {"auc_se", number(d.aucSe)},
          {"auc_se_method", "DeLong (midranks)"},
          {"auc_ci", interval(d.aucCi)},
          {"auc_ci_method", "logit"},
          {"auc_ci_plain", interval(d.aucCiPlain)},
          {"discrimination_slope", number(d.discriminationSlope)},
          {"roc_note", "threshold null: nobody flagged"},
          {"roc", roc}};
}

json calibrationJson(const Calibration& c) {
  json curve = json::array();
  for (const CalibrationCurvePoint& p : c.curve) {
    curve.push_back({{"risk", number(p.risk)}, {"observed", number(p.observed)}});
  }
  return {{"intercept", number(c.intercept)},
          {"intercept_se", number(c.interceptSe)},
          {"intercept_ci", interval(c.interceptCi)},
          {"slope", number(c.slope)},
          {"slope_se", number(c.slopeSe)},
          {"slope_ci", interval(c.slopeCi)},
          {"slope_model_intercept", number(c.slopeModelIntercept)},
          {"oe_ratio", number(c.oeRatio)},
          {"oe_ci", interval(c.oeCi)},
          {"oe_ci_method", "exp(ln(O/E) +/- 1.96 sqrt(1/O))"},
          {"spiegelhalter_z", number(c.spiegelhalterZ)},
          {"spiegelhalter_p", number(c.spiegelhalterP)},
          {"ici", number(c.ici)},
          {"e50", number(c.e50)},
          {"e90", number(c.e90)},
          {"emax", number(c.emax)},
          {"curve_method", "loess degree 2, span 0.75, tricube, exact local fits"},
          {"curve_interpolated", c.curveInterpolated},
          {"curve", curve},
          {"groups", groupsJson(c.groups)},
          {"hierarchy", c.hierarchyLevel}};
}

json decisionCurveJson(const std::vector<DecisionCurvePoint>& points) {
  json out = json::array();
  for (const DecisionCurvePoint& p : points) {
    out.push_back({{"threshold", p.threshold},
                   {"net_benefit", number(p.netBenefit)},
                   {"net_benefit_treat_all", number(p.netBenefitTreatAll)},
                   {"net_benefit_treat_none", 0.0},
                   {"standardized_net_benefit", number(p.standardizedNetBenefit)},
                   {"interventions_avoided_per_100", number(p.interventionsAvoidedPer100)}});
  }
  return out;
}

json thresholdsJson(const std::vector<ThresholdRow>& rows) {
  json out = json::array();
  for (const ThresholdRow& r : rows) {
    out.push_back({{"threshold", r.threshold},
                   {"tp", r.tp},
                   {"fp", r.fp},
                   {"tn", r.tn},
                   {"fn", r.fn},
                   {"sensitivity", number(r.sensitivity)},
                   {"sensitivity_ci", interval(r.sensitivityCi)},
                   {"specificity", number(r.specificity)},
                   {"specificity_ci", interval(r.specificityCi)},
                   {"ppv", number(r.ppv)},
                   {"ppv_ci", interval(r.ppvCi)},
                   {"npv", number(r.npv)},
                   {"npv_ci", interval(r.npvCi)},
                   {"flagged_per_1000", number(r.flaggedPer1000)},
                   {"events_caught_per_1000", number(r.eventsCaughtPer1000)},
                   {"events_missed_per_1000", number(r.eventsMissedPer1000)},
                   {"flagged_without_event_per_1000", number(r.flaggedWithoutEventPer1000)}});
  }
  return out;
}

json cohortJson(const ValidationRun& run) {
  const ExclusionReport& ex = run.cohort.exclusions;
  json byColumn = json::object();
  for (const ColumnExclusion& c : ex.byColumn) byColumn[c.column] = c.rowsMissing;
  const CohortSummary& s = run.result.cohort;
  return {{"n", s.n},
          {"events", s.events},
          {"non_events", s.n - s.events},
          {"prevalence", number(s.prevalence)},
          {"excluded", ex.rowsExcluded},
          {"rows_read", ex.rowsRead},
          {"excluded_by_column", byColumn},
          {"exclusion_rule", "complete cases over the outcome and the columns the risks need"},
          {"performance", run.performance},
          {"performance_basis", run.performanceBasis}};
}

json inputsJson(const ValidationRun& run) {
  const ValidationRequest& r = run.request;
  json model = nullptr;
  if (r.modelPath) model = {{"file", *r.modelPath}, {"sha256", run.modelSha256}};
  return {{"data", {{"file", r.dataPath}, {"sha256", run.dataSha256}}},
          {"model", model},
          {"risk_column", r.riskColumn ? json(*r.riskColumn) : json(nullptr)}};
}

json settingsJson(const ValidationRun& run) {
  const ValidationOptions& o = run.request.options;
  return {{"outcome", run.request.outcome.column},
          {"event_value",
           run.request.outcome.eventValue ? json(*run.request.outcome.eventValue) : json(nullptr)},
          {"groups", o.groups},
          {"thresholds", o.thresholds},
          {"flag_rule", "risk >= threshold"},
          {"histogram_bins", o.histogramBins},
          {"loess",
           {{"span", 0.75},
            {"degree", 2},
            {"exact_max_n", o.loessExactMaxN},
            {"grid_points", o.loessGridPoints}}}};
}

}  // namespace

json validationToJson(const ValidationRun& run) {
  const ValidationResult& r = run.result;
  json dev = nullptr;
  if (run.model && run.model->development.dataSha256) dev = *run.model->development.dataSha256;
  json hl = {{"statistic", number(r.hosmerLemeshow.statistic)},
             {"df", r.hosmerLemeshow.df},
             {"p_value", number(r.hosmerLemeshow.pValue)},
             {"groups_requested", run.request.options.groups},
             {"groups_formed", r.hosmerLemeshow.groups.size()},
             {"groups", groupsJson(r.hosmerLemeshow.groups)}};
  json histogram = {{"bin_edges", r.distribution.binEdges},
                    {"events", r.distribution.eventCounts},
                    {"non_events", r.distribution.nonEventCounts}};
  return {{"format", kValidationFormatId},
          {"software", {{"name", "calivera"}, {"version", run.softwareVersion}}},
          {"caution", kCautionText},
          {"inputs", inputsJson(run)},
          {"model", {{"name", run.modelName}, {"development_data_sha256", dev}}},
          {"settings", settingsJson(run)},
          {"cohort", cohortJson(run)},
          {"discrimination", discriminationJson(r.discrimination)},
          {"overall",
           {{"brier", number(r.overall.brier)}, {"brier_scaled", number(r.overall.brierScaled)}}},
          {"calibration", calibrationJson(r.calibration)},
          {"hosmer_lemeshow", hl},
          {"decision_curve", decisionCurveJson(r.decisionCurve)},
          {"thresholds", thresholdsJson(r.thresholds)},
          {"risk_distribution", histogram},
          {"warnings", r.warnings}};
}

std::string validationJsonText(const ValidationRun& run) {
  return validationToJson(run).dump(2) + "\n";
}

}  // namespace calivera
