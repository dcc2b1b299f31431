#include "core/report/validation_json.h"

#include <cmath>

#include "core/data/cohort_file.h"
#include "core/metrics/json_values.h"
#include "core/report/imputation_json.h"

namespace calivera {
namespace {

using nlohmann::json;

json groupsJson(const std::vector<CalibrationGroup>& groups) {
  json out = json::array();
  for (const CalibrationGroup& g : groups) {
    out.push_back({{"n", g.n},
                   {"observed", g.observed},
                   {"expected", jsonNumber(g.expected)},
                   {"mean_risk", jsonNumber(g.meanRisk)},
                   {"observed_proportion", jsonNumber(g.observedProportion)},
                   {"observed_ci", jsonInterval(g.observedCi)},
                   {"risk_min", jsonNumber(g.riskLo)},
                   {"risk_max", jsonNumber(g.riskHi)}});
  }
  return out;
}

json discriminationJson(const Discrimination& d) {
  json roc = json::array();
  for (const RocPoint& p : d.roc) {
    roc.push_back({{"threshold", jsonNumber(p.threshold)}, {"fpr", p.fpr}, {"tpr", p.tpr}});
  }
  return {{"auc", jsonNumber(d.auc)},
          {"auc_se", jsonNumber(d.aucSe)},
          {"auc_se_method", "DeLong (midranks)"},
          {"auc_ci", jsonInterval(d.aucCi)},
          {"auc_ci_method", "logit"},
          {"auc_ci_plain", jsonInterval(d.aucCiPlain)},
          {"discrimination_slope", jsonNumber(d.discriminationSlope)},
          {"roc_note", "threshold null: nobody flagged"},
          {"roc", roc}};
}

json calibrationJson(const Calibration& c) {
  json curve = json::array();
  for (const CalibrationCurvePoint& p : c.curve) {
    curve.push_back({{"risk", jsonNumber(p.risk)}, {"observed", jsonNumber(p.observed)}});
  }
  return {{"intercept", jsonNumber(c.intercept)},
          {"intercept_se", jsonNumber(c.interceptSe)},
          {"intercept_ci", jsonInterval(c.interceptCi)},
          {"slope", jsonNumber(c.slope)},
          {"slope_se", jsonNumber(c.slopeSe)},
          {"slope_ci", jsonInterval(c.slopeCi)},
          {"slope_model_intercept", jsonNumber(c.slopeModelIntercept)},
          {"oe_ratio", jsonNumber(c.oeRatio)},
          {"oe_ci", jsonInterval(c.oeCi)},
          {"oe_ci_method",
           "exp(ln(O/E) +/- z sqrt(1/O)), z = 1.959964 (standard normal 0.975 quantile)"},
          {"spiegelhalter_z", jsonNumber(c.spiegelhalterZ)},
          {"spiegelhalter_p", jsonNumber(c.spiegelhalterP)},
          {"ici", jsonNumber(c.ici)},
          {"e50", jsonNumber(c.e50)},
          {"e90", jsonNumber(c.e90)},
          {"emax", jsonNumber(c.emax)},
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
                   {"net_benefit", jsonNumber(p.netBenefit)},
                   {"net_benefit_treat_all", jsonNumber(p.netBenefitTreatAll)},
                   {"net_benefit_treat_none", 0.0},
                   {"standardized_net_benefit", jsonNumber(p.standardizedNetBenefit)},
                   {"interventions_avoided_per_100", jsonNumber(p.interventionsAvoidedPer100)}});
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
                   {"sensitivity", jsonNumber(r.sensitivity)},
                   {"sensitivity_ci", jsonInterval(r.sensitivityCi)},
                   {"specificity", jsonNumber(r.specificity)},
                   {"specificity_ci", jsonInterval(r.specificityCi)},
                   {"ppv", jsonNumber(r.ppv)},
                   {"ppv_ci", jsonInterval(r.ppvCi)},
                   {"npv", jsonNumber(r.npv)},
                   {"npv_ci", jsonInterval(r.npvCi)},
                   {"flagged_per_1000", jsonNumber(r.flaggedPer1000)},
                   {"events_caught_per_1000", jsonNumber(r.eventsCaughtPer1000)},
                   {"events_missed_per_1000", jsonNumber(r.eventsMissedPer1000)},
                   {"flagged_without_event_per_1000", jsonNumber(r.flaggedWithoutEventPer1000)}});
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
          {"prevalence", jsonNumber(s.prevalence)},
          {"excluded", ex.rowsExcluded},
          {"rows_read", ex.rowsRead},
          {"excluded_by_column", byColumn},
          {"exclusion_rule", "complete cases over the outcome and the columns the risks need"},
          {"performance", run.performance},
          {"performance_basis", run.performanceBasis}};
}

// A PostgreSQL source as the reports record it: where, what and the result's fingerprint; never
// a password (core/data/database_source.h refuses a URI that carries one).
json databaseSourceJson(const DatabaseProvenance& p) {
  json data = {{"uri", p.uri},
               {"format", "PostgreSQL"},
               {"server", p.server},
               {"database", p.database},
               {"user", p.user},
               {"server_version", p.serverVersion},
               {"statement", p.statement},
               {"rows_fetched", p.rows},
               {"result_sha256", p.resultSha256},
               {"fingerprint_rule", kDatabaseFingerprintRule}};
  if (!p.selection.table.empty()) data["table"] = p.selection.table;
  if (!p.selection.query.empty()) data["query"] = p.selection.query;
  return data;
}

json inputsJson(const ValidationRun& run) {
  const ValidationRequest& r = run.request;
  json model = nullptr;
  if (r.modelPath) model = {{"file", *r.modelPath}, {"sha256", run.modelSha256}};
  json data = {
      {"file", r.dataPath}, {"format", cohortFileFormat(r.dataPath)}, {"sha256", run.dataSha256}};
  if (run.database) data = databaseSourceJson(*run.database);
  if (!run.analysedSha256.empty()) data["analysed_data_sha256"] = run.analysedSha256;
  return {{"source", run.database ? "postgresql" : "file"},
          {"data", data},
          {"model", model},
          {"risk_column", r.riskColumn ? json(*r.riskColumn) : json(nullptr)}};
}

json settingsJson(const ValidationRun& run) {
  const ValidationOptions& o = run.request.options;
  return {{"outcome", run.request.outcome.column},
          {"event_value",
           run.request.outcome.eventValue ? json(*run.request.outcome.eventValue) : json(nullptr)},
          {"groups", o.groups},
          {"column_mapping", run.request.columnMapping},
          {"level_mapping", run.request.levelMapping},
          {"development_data_stated", run.request.developmentData},
          {"imputation_column",
           run.request.imputationColumn ? json(*run.request.imputationColumn) : json(nullptr)},
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
  json devAnalysed = nullptr;
  if (run.model && run.model->development.analysedSha256) {
    devAnalysed = *run.model->development.analysedSha256;
  }
  json hl = {{"statistic", jsonNumber(r.hosmerLemeshow.statistic)},
             {"df", r.hosmerLemeshow.df},
             {"p_value", jsonNumber(r.hosmerLemeshow.pValue)},
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
          {"model",
           {{"name", run.modelName},
            {"development_data_sha256", dev},
            {"development_analysed_data_sha256", devAnalysed}}},
          {"settings", settingsJson(run)},
          {"cohort", cohortJson(run)},
          {"discrimination", discriminationJson(r.discrimination)},
          {"overall",
           {{"brier", jsonNumber(r.overall.brier)},
            {"brier_scaled", jsonNumber(r.overall.brierScaled)}}},
          {"calibration", calibrationJson(r.calibration)},
          {"hosmer_lemeshow", hl},
          {"decision_curve", decisionCurveJson(r.decisionCurve)},
          {"thresholds", thresholdsJson(r.thresholds)},
          {"risk_distribution", histogram},
          {"missing_data", missingDataJson(run)},
          {"pooled", pooledJson(run)},
          {"warnings", r.warnings}};
}

std::string validationJsonText(const ValidationRun& run) {
  return validationToJson(run).dump(2) + "\n";
}

}  // namespace calivera
