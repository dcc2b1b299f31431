#include "core/report/validation_tables.h"

#include <cmath>
#include <filesystem>
#include <sstream>

#include "core/present/measures.h"
#include "core/report/csv_text.h"
#include "core/report/missing_table.h"
#include "core/report/result_table.h"
#include "core/util/errors.h"
#include "core/util/output_transaction.h"

namespace calivera {
namespace {

std::string decisionCurveCsv(const std::vector<DecisionCurvePoint>& points) {
  CsvText csv({"threshold", "net_benefit", "net_benefit_treat_all", "net_benefit_treat_none",
               "standardized_net_benefit", "interventions_avoided_per_100"});
  for (const DecisionCurvePoint& p : points) {
    csv.num(p.threshold).num(p.netBenefit).num(p.netBenefitTreatAll).num(0.0);
    csv.num(p.standardizedNetBenefit).num(p.interventionsAvoidedPer100).end();
  }
  return csv.str();
}

std::string curveCsv(const std::vector<CalibrationCurvePoint>& curve) {
  CsvText csv({"risk", "observed_smoothed"});
  for (const CalibrationCurvePoint& p : curve) csv.num(p.risk).num(p.observed).end();
  return csv.str();
}

std::string rocCsv(const std::vector<RocPoint>& roc) {
  CsvText csv({"threshold", "false_positive_rate", "true_positive_rate"});
  for (const RocPoint& p : roc) csv.num(p.threshold).num(p.fpr).num(p.tpr).end();
  return csv.str();
}

std::string histogramCsv(const RiskHistogram& h) {
  CsvText csv({"bin_from", "bin_to", "events", "non_events"});
  for (std::size_t k = 0; k < h.eventCounts.size(); ++k) {
    csv.num(h.binEdges[k]).num(h.binEdges[k + 1]).count(h.eventCounts[k]);
    csv.count(h.nonEventCounts[k]).end();
  }
  return csv.str();
}

std::string summaryCsv(const ValidationRun& run) {
  const ValidationResult& r = run.result;
  CsvText csv({"statistic", "estimate", "ci_lo", "ci_hi", "se"});
  const auto row = [&csv](const std::string& name, double estimate, const Interval* ci, double se) {
    csv.field(name).num(estimate);
    if (ci) {
      csv.ci(*ci);
    } else {
      csv.field("").field("");
    }
    if (std::isfinite(se)) {
      csv.num(se);
    } else {
      csv.field("");
    }
    csv.end();
  };
  const double none = std::nan("");
  row("n", static_cast<double>(r.cohort.n), nullptr, none);
  row("events", static_cast<double>(r.cohort.events), nullptr, none);
  row("prevalence", r.cohort.prevalence, nullptr, none);
  row("excluded", static_cast<double>(run.cohort.exclusions.rowsExcluded), nullptr, none);
  // Every scalar measure, from the one catalog (core/present/measures.h).
  for (const Measure& m : measureCatalog()) {
    Interval ci;
    if (m.interval != nullptr) ci = m.interval(r);
    row(m.key, m.estimate(r), m.interval != nullptr ? &ci : nullptr,
        m.se != nullptr ? m.se(r) : none);
  }
  return csv.str();
}

std::string warningsCsv(const ValidationRun& run) {
  CsvText csv({"warning"});
  csv.field("performance: " + run.performance + " (" + run.performanceBasis + ")").end();
  for (const std::string& w : run.result.warnings) csv.field(w).end();
  return csv.str();
}

}  // namespace

std::vector<std::pair<std::string, std::string>> validationTables(const ValidationRun& run) {
  const ValidationResult& r = run.result;
  const ResultTable thresholds = thresholdTable(r);
  const ResultTable groups = hosmerLemeshowTable(r.hosmerLemeshow);
  std::vector<std::pair<std::string, std::string>> tables{
      {thresholds.fileName, tableCsv(thresholds)},
      {"decision_curve.csv", decisionCurveCsv(r.decisionCurve)},
      {groups.fileName, tableCsv(groups)},
      {"calibration_curve.csv", curveCsv(r.calibration.curve)},
      {"roc.csv", rocCsv(r.discrimination.roc)},
      {"risk_distribution.csv", histogramCsv(r.distribution)},
      {"summary.csv", summaryCsv(run)},
      {"warnings.csv", warningsCsv(run)},
      {"missing_patterns.csv", tableCsv(missingPatternsTable(run.missingPatterns))}};
  if (run.imputed) {
    tables.emplace_back("pooled_imputations.csv",
                        tableCsv(pooledImputationsTable(*run.imputed, r)));
    tables.emplace_back("imputed_calibration_curve.csv", curveCsv(run.imputed->calibrationCurve));
    tables.emplace_back("imputed_decision_curve.csv", decisionCurveCsv(run.imputed->decisionCurve));
  }
  return tables;
}

void writeTables(const std::string& directory,
                 const std::vector<std::pair<std::string, std::string>>& tables) {
  // All or none, and earlier tables untouched on failure (core/util/output_transaction.h).
  OutputTransaction files;
  for (const auto& [name, text] : tables) {
    files.add((std::filesystem::path(directory) / name).string(), text, /*createFolder=*/true);
  }
  files.commit();
}

void writeValidationTables(const std::string& directory, const ValidationRun& run) {
  writeTables(directory, validationTables(run));
}

}  // namespace calivera
