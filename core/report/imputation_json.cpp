#include "core/report/imputation_json.h"

#include <sstream>

#include "core/metrics/json_values.h"
#include "core/present/measures.h"
#include "core/present/number_text.h"

namespace calivera {

using nlohmann::json;

namespace {

json spreadJson(const SpreadOverCopies& s) {
  return {{"smallest", jsonNumber(s.smallest)},
          {"median", jsonNumber(s.median)},
          {"largest", jsonNumber(s.largest)}};
}

}  // namespace

json missingDataJson(const ValidationRun& run) {
  json patterns = json::array();
  for (const MissingPattern& p : run.missingPatterns.patterns) {
    patterns.push_back(
        {{"missing", p.missingColumns},
         {"rows", p.rows},
         {"outcome_known", p.outcomeKnown},
         {"events", p.events},
         {"event_rate", p.outcomeKnown > 0 ? jsonNumber(static_cast<double>(p.events) /
                                                        static_cast<double>(p.outcomeKnown))
                                           : json(nullptr)}});
  }
  json out = {
      {"method", run.imputed ? run.imputed->method : "complete_case"},
      {"m", run.imputed ? run.imputed->indices.size() : 0},
      {"imputation_column",
       run.imputed && !run.imputed->column.empty() ? json(run.imputed->column) : json(nullptr)},
      {"patterns", patterns},
      {"other_patterns",
       {{"patterns", run.missingPatterns.otherPatterns},
        {"rows", run.missingPatterns.othersRows}}}};
  if (!run.imputed) {
    out["hosmer_lemeshow_per_imputation"] = nullptr;
    return out;
  }
  const ImputedValidation& imputed = *run.imputed;
  out["imputation_indices"] = imputed.indices;
  if (imputed.method == "chained_equations") {
    json columns = json::array();
    for (const ImputedColumnRecord& c : imputed.imputedColumns) {
      columns.push_back({{"column", c.column}, {"method", c.method}, {"imputed", c.missing}});
    }
    out["chained_equations"] = {{"iterations", imputed.iterations},
                                {"seed", imputed.seed},
                                {"donors", imputed.donors},
                                {"imputed_columns", columns}};
  }
  out["patients_per_copy"] = imputed.n;
  out["events_per_copy"] = imputed.events;
  out["hosmer_lemeshow_per_imputation"] = {
      {"df", imputed.hosmerLemeshowDf},
      {"statistic", spreadJson(imputed.hosmerLemeshowStatistic)},
      {"p_value", spreadJson(imputed.hosmerLemeshowP)}};
  json curve = json::array();
  for (const CalibrationCurvePoint& p : imputed.calibrationCurve) {
    curve.push_back({{"risk", jsonNumber(p.risk)}, {"observed", jsonNumber(p.observed)}});
  }
  out["calibration_curve"] = curve;
  json decision = json::array();
  for (const DecisionCurvePoint& p : imputed.decisionCurve) {
    decision.push_back({{"threshold", jsonNumber(p.threshold)},
                        {"net_benefit", jsonNumber(p.netBenefit)},
                        {"net_benefit_treat_all", jsonNumber(p.netBenefitTreatAll)}});
  }
  out["decision_curve"] = decision;
  return out;
}

json pooledJson(const ValidationRun& run) {
  if (!run.imputed) return nullptr;
  json out = json::object();
  for (const PooledImputedMeasure& m : run.imputed->pooled) {
    const bool ok = m.problem.empty();
    const auto value = [ok](double v) { return ok ? jsonNumber(v) : json(nullptr); };
    out[m.key] = {{"estimate", value(m.estimate)},
                  {"ci", ok ? jsonInterval(m.ci) : json(nullptr)},
                  {"within_variance", value(m.rubin.withinVariance)},
                  {"between_variance", value(m.rubin.betweenVariance)},
                  {"total_variance", value(m.rubin.totalVariance)},
                  {"fraction_missing_information", value(m.rubin.fractionMissingInformation)},
                  {"df", value(m.rubin.df)},
                  {"complete_data_df", value(m.rubin.completeDataDf)},
                  {"scale", m.scale},
                  {"estimate_on_scale", value(m.rubin.estimate)},
                  {"per_imputation", m.perImputation},
                  {"per_imputation_variance", m.perImputationVariance},
                  {"problem", ok ? json(nullptr) : json(m.problem)}};
  }
  return out;
}

std::string missingDataSummaryText(const ValidationRun& run) {
  std::ostringstream out;
  const MissingPatternReport& report = run.missingPatterns;
  if (report.patterns.size() > 1 || run.imputed) {
    out << "\nMissing values by pattern (columns missing together; rows, events / outcome "
           "known)\n";
    for (const MissingPattern& p : report.patterns) {
      std::string names;
      for (const std::string& c : p.missingColumns) names += (names.empty() ? "" : ", ") + c;
      out << "  " << (names.empty() ? std::string("(complete)") : names) << ": " << p.rows
          << " rows, " << p.events << " / " << p.outcomeKnown << "\n";
    }
    if (report.otherPatterns > 0) {
      out << "  " << report.otherPatterns << " other patterns: " << report.othersRows << " rows\n";
    }
  }
  if (!run.imputed) return out.str();
  const ImputedValidation& imputed = *run.imputed;
  out << "\n" << imputedCopiesSentence(imputed) << "\n";
  for (const PooledImputedMeasure& m : imputed.pooled) {
    const Measure& measure = measureOfPooledKey(m.key);
    out << "  " << measure.label << ": ";
    if (!m.problem.empty()) {
      out << "not pooled: " << m.problem << "\n";
      continue;
    }
    // The measure's own decimals, as everywhere it is printed (core/present/measures.h).
    out << formatNumber(m.estimate, measure.decimals) << " (95% CI "
        << formatRange(m.ci.lo, m.ci.hi, measure.decimals) << "), fraction of missing information "
        << formatNumber(m.rubin.fractionMissingInformation, 3) << ", df "
        << formatNumber(m.rubin.df, 1) << ", pooled on the " << m.scale << " scale\n";
  }
  out << "  Hosmer-Lemeshow per copy (not pooled): statistic "
      << formatNumber(imputed.hosmerLemeshowStatistic.smallest, 2) << " to "
      << formatNumber(imputed.hosmerLemeshowStatistic.largest, 2) << " (median "
      << formatNumber(imputed.hosmerLemeshowStatistic.median, 2) << ") on "
      << imputed.hosmerLemeshowDf << " df\n";
  out << (imputed.column.empty()
              ? "  The results above are the complete cases of the cohort as read.\n"
              : "  The results above are the complete cases of the original data (index 0).\n");
  return out.str();
}

}  // namespace calivera
