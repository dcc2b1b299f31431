#include "core/report/validation_summary.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <iterator>
#include <sstream>

#include "core/data/cohort_file.h"
#include "core/present/measures.h"
#include "core/present/number_text.h"
#include "core/report/audit_run.h"
#include "core/report/imputation_json.h"
#include "core/report/validation_json.h"
#include "core/util/shown_text.h"

namespace calivera {
namespace {

std::string fixed(double value, int decimals) {
  return formatNumber(value, decimals);
}

// Net benefit rows shown for a long threshold grid (the default 0.01..0.99): these customary
// thresholds when computed. A short list the user gave (as the PDF report) is shown in full.
constexpr double kSummaryThresholds[] = {0.05, 0.10, 0.20, 0.30, 0.50};

std::vector<double> summaryThresholds(const std::vector<double>& computed) {
  if (computed.size() <= kMaxTabulatedThresholds) return computed;
  return {std::begin(kSummaryThresholds), std::end(kSummaryThresholds)};
}

}  // namespace

std::string validationSummaryText(const ValidationRun& run, const std::string& beforeCaution) {
  const ValidationResult& r = run.result;
  const Calibration& c = r.calibration;
  std::ostringstream out;
  out << "Calivera " << run.softwareVersion << " - validation of " << run.modelName << "\n\n";
  if (run.database) {
    const DatabaseProvenance& db = *run.database;
    out << "Cohort        PostgreSQL database " << shownText(db.database, 80) << " on "
        << shownText(db.server, 120) << " ("
        << (db.selection.table.empty() ? "query" : "table " + shownText(db.selection.table, 80))
        << ")\n"
        << "  statement   " << shownText(db.statement, 200) << "\n"
        << "  rows        " << db.rows << " fetched\n"
        << "  result      " << run.dataSha256 << " (SHA-256 of the rows as received)\n";
  } else {
    out << "Cohort file   " << run.request.dataPath << " ("
        << cohortFileFormat(run.request.dataPath) << ")\n  SHA-256     " << run.dataSha256 << "\n";
  }
  if (!run.analysedSha256.empty()) out << "  analysed    " << run.analysedSha256 << "\n";
  if (run.request.modelPath) {
    out << "Model file    " << *run.request.modelPath << "\n  SHA-256     " << run.modelSha256
        << "\n";
  }
  out << "Performance   " << run.performance << ": " << run.performanceBasis << "\n\n";
  const ExclusionReport& ex = run.cohort.exclusions;
  out << "Patients      " << r.cohort.n << " analysed of " << ex.rowsRead << " rows ("
      << ex.rowsExcluded << " excluded for missing values)\n";
  for (const ColumnExclusion& col : ex.byColumn) {
    if (col.rowsMissing > 0) {
      out << "  missing " << col.column << ": " << col.rowsMissing << "\n";
    }
  }
  out << "Events        " << r.cohort.events << " (prevalence "
      << fixed(100 * r.cohort.prevalence, 1) << "%)\n\n";
  // Labels, decimals and targets from the one catalog of measures (core/present/measures.h).
  const auto line = [&](const char* key, bool ci) {
    const Measure& m = measureByKey(key);
    std::string label = m.label;
    label.resize(std::max<std::size_t>(label.size() + 1, 24), ' ');
    out << "  " << label << (ci ? measureWithCiText(m, r) : measureText(m, r));
  };
  const auto text = [&](const char* key) { return measureText(measureByKey(key), r); };
  const auto target = [&](const char* key) {
    out << "  target " << measureByKey(key).target << "\n";
  };
  out << "Discrimination\n";
  line("auc", true);
  out << ", DeLong SE " << fixed(r.discrimination.aucSe, 4) << "\n";
  line("discrimination_slope", false);
  out << "\nOverall\n";
  line("brier", false);
  out << " (scaled " << text("brier_scaled") << ")\n";
  out << "Calibration\n";
  line("calibration_intercept", true);
  target("calibration_intercept");
  line("calibration_slope", true);
  target("calibration_slope");
  line("oe_ratio", true);
  target("oe_ratio");
  out << "  ICI / E50 / E90 / Emax  " << text("ici") << " / " << text("e50") << " / " << text("e90")
      << " / " << text("emax") << (c.curveInterpolated ? "  (loess on a quantile grid)" : "")
      << "\n";
  line("spiegelhalter_z", false);
  out << ", p " << text("spiegelhalter_p") << "\n";
  const HosmerLemeshow& hl = r.hosmerLemeshow;
  out << "  Hosmer-Lemeshow         " << text("hosmer_lemeshow_statistic") << " on "
      << text("hosmer_lemeshow_df") << " df, p " << text("hosmer_lemeshow_p") << " ("
      << hl.groups.size() << " groups)\n";
  out << "  Reading: " << c.hierarchyLevel << "\n\n";
  out << "Risk groups     n   observed  expected  observed % (95% CI)\n";
  for (std::size_t k = 0; k < c.groups.size(); ++k) {
    const CalibrationGroup& g = c.groups[k];
    char line[160];
    std::snprintf(line, sizeof line, "  %2zu  %10zu  %9zu  %8.1f  %5.1f (%.1f to %.1f)\n", k + 1,
                  g.n, g.observed, g.expected, 100 * g.observedProportion, 100 * g.observedCi.lo,
                  100 * g.observedCi.hi);
    out << line;
  }
  out << "\nThreshold  net benefit  treat all  avoided/100  sensitivity  specificity  "
         "flagged/1000\n";
  for (const double wanted : summaryThresholds(run.request.options.thresholds)) {
    for (std::size_t i = 0; i < r.decisionCurve.size(); ++i) {
      if (std::abs(r.decisionCurve[i].threshold - wanted) > 1e-9) continue;
      const DecisionCurvePoint& d = r.decisionCurve[i];
      const ThresholdRow& t = r.thresholds[i];
      char line[200];
      std::snprintf(line, sizeof line, "  %6.2f  %11.4f  %9.4f  %11.1f  %11.3f  %11.3f  %12.1f\n",
                    d.threshold, d.netBenefit, d.netBenefitTreatAll, d.interventionsAvoidedPer100,
                    t.sensitivity, t.specificity, t.flaggedPer1000);
      out << line;
    }
  }
  if (!r.warnings.empty()) {
    out << "\nWarnings\n";
    for (const std::string& w : r.warnings) out << "  - " << w << "\n";
  }
  out << missingDataSummaryText(run);
  if (!beforeCaution.empty()) out << "\n" << beforeCaution;
  out << "\n" << kCautionText << "\n";
  return out.str();
}

}  // namespace calivera
