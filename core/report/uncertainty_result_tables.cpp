#include "core/report/uncertainty_result_tables.h"

#include "core/present/wording.h"
#include "core/report/audit_format.h"

namespace calivera {

namespace {

using table_columns::count;
using table_columns::interval;
using table_columns::number;
using table_columns::pValue;
using table_columns::text;

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
const Interval kNoInterval{kNaN, kNaN};

const char* const kDelong = "DeLong, on the logit scale";

}  // namespace

ResultTable comparedModelsTable(const UncertaintyResults& r) {
  const ModelComparison& c = *r.comparison;
  ResultTable t;
  t.fileName = "compared_models.csv";
  t.columns = {text("model", "Model"),
               text("file", "File", "File name only; the validated model is listed first"),
               text("sha256", "SHA-256",
                    "SHA-256 of the model file (the screen shows its first 16 digits)", 16),
               number("auc", "AUC", 3, "On the patients complete for every compared model"),
               interval("auc_ci_lo", "auc_ci_hi", "AUC 95% CI", 3, kDelong),
               count("comparison_rows", "Comparison patients"),
               number("brier", "Brier", 4),
               number("calibration_intercept", "Cal. intercept", 3, "Target 0"),
               number("calibration_slope", "Cal. slope", 3, "Target 1"),
               number("oe_ratio", "O/E", 3, "Observed / expected events; target 1")};
  // The patient count is the same on every row; the view states it above the table.
  t.shownOrder = {0, 1, 2, 3, 4, 6, 7, 8, 9};
  for (std::size_t m = 0; m < c.models.size(); ++m) {
    // The first model is the validated one: its file is in the validation's own tables.
    const ComparedModelFile* file =
        m > 0 && m - 1 < r.comparedModels.size() ? &r.comparedModels[m - 1] : nullptr;
    std::vector<TableValue> row{
        TableValue::of(c.models[m]),
        TableValue::of(file ? fileNameOnly(file->path) : std::string("(validated model)")),
        TableValue::of(file ? file->sha256 : std::string()), TableValue::of(c.aucs[m])};
    if (m < r.comparedResults.size()) {
      const ValidationResult& v = r.comparedResults[m];
      row.push_back(TableValue::of(v.discrimination.aucCi));
      row.push_back(TableValue::ofCount(r.comparisonRows));
      row.push_back(TableValue::of(v.overall.brier));
      row.push_back(TableValue::of(v.calibration.intercept));
      row.push_back(TableValue::of(v.calibration.slope));
      row.push_back(TableValue::of(v.calibration.oeRatio));
    } else {
      row.push_back(TableValue::of(kNoInterval));
      row.push_back(TableValue::ofCount(r.comparisonRows));
      for (int k = 0; k < 4; ++k) row.push_back(TableValue::of(kNaN));
    }
    t.rows.push_back(std::move(row));
  }
  return t;
}

ResultTable modelComparisonAucTable(const ModelComparison& c) {
  ResultTable t;
  t.fileName = "model_comparison_auc.csv";
  t.columns = {text("first", "First model"),
               text("second", "Second model"),
               number("auc_first", "AUC first", 3),
               number("auc_second", "AUC second", 3),
               number("auc_difference", "Difference", 4, "AUC first − AUC second"),
               number("se", "SE", 4, "Paired DeLong standard error of the difference"),
               interval("ci_lo", "ci_hi", "95% CI", 4,
                        "Difference ± 1.96 SE (DeLong, DeLong & Clarke-Pearson 1988)"),
               number("z", "z", 3, "Difference / SE"),
               pValue("p_value", "p", "Two-sided, normal distribution"),
               number("correlation", "Correlation", 3,
                      "Correlation of the two AUC estimates on the same patients")};
  t.shownOrder = {0, 1, 2, 3, 4, 6, 5, 7, 8, 9};
  for (const ModelPairComparison& pair : c.pairs) {
    const PairedAucTest& a = pair.auc;
    t.rows.push_back({TableValue::of(c.models[a.first]), TableValue::of(c.models[a.second]),
                      TableValue::of(a.aucFirst), TableValue::of(a.aucSecond),
                      TableValue::of(a.difference), TableValue::of(a.se),
                      TableValue::of(a.differenceCi), TableValue::of(a.z), TableValue::of(a.pValue),
                      TableValue::of(a.correlation)});
  }
  return t;
}

ResultTable modelComparisonNetBenefitTable(const ModelComparison& c, double lo, double hi) {
  ResultTable t;
  t.fileName = "model_comparison_net_benefit.csv";
  t.columns = {text("first", "First model"),
               text("second", "Second model"),
               number("threshold", "Threshold", 3),
               number("net_benefit_first", "Net benefit first", 4,
                      "Vickers & Elkin 2006: TP/n − FP/n × t/(1 − t)"),
               number("net_benefit_second", "Net benefit second", 4),
               number("difference", "Difference", 4, "First − second"),
               interval("ci_lo", "ci_hi", "Bootstrap 95% CI", 4,
                        "Percentile interval, both models on each resample")};
  for (const ModelPairComparison& pair : c.pairs) {
    for (const NetBenefitDifferencePoint& p : pair.netBenefit) {
      if (p.threshold < lo - 1e-12 || p.threshold > hi + 1e-12) continue;
      t.rows.push_back({TableValue::of(c.models[pair.auc.first]),
                        TableValue::of(c.models[pair.auc.second]), TableValue::of(p.threshold),
                        TableValue::of(p.netBenefitFirst), TableValue::of(p.netBenefitSecond),
                        TableValue::of(p.difference), TableValue::of(p.ci)});
    }
  }
  return t;
}

ResultTable subgroupsTable(const std::vector<SubgroupAnalysis>& subgroups) {
  ResultTable t;
  t.fileName = "subgroups.csv";
  t.columns = {text("column", "Column"),  // 0
               text("level", "Level"),
               count("n", "Patients"),
               count("events", "Events"),
               text("too_small", "Too small", "Fails a sample-size rule of thumb"),
               number("auc", "AUC", 3, "The subgroup validated on its own"),  // 5
               interval("auc_ci_lo", "auc_ci_hi", "AUC 95% CI", 3, kDelong),
               number("calibration_intercept", "Cal. intercept", 3, "Target 0"),
               interval("intercept_ci_lo", "intercept_ci_hi", "Intercept 95% CI", 3),
               number("calibration_slope", "Cal. slope", 3, "Target 1"),
               interval("slope_ci_lo", "slope_ci_hi", "Slope 95% CI", 3),  // 10
               number("oe_ratio", "O/E", 3, "Observed / expected events; target 1"),
               interval("oe_ci_lo", "oe_ci_hi", "O/E 95% CI", 3),
               number("brier", "Brier", 4),
               interval("auc_bootstrap_lo", "auc_bootstrap_hi", "AUC bootstrap CI", 3,
                        "Percentile 95%, resampling the subgroup's patients"),
               text("warnings", "Warnings"),  // 15
               number("prevalence", "Prevalence", 4, "Observed event rate in the subgroup"),
               number("ici", "ICI", 4, "Integrated calibration index (Austin & Steyerberg 2019)"),
               interval("slope_bootstrap_lo", "slope_bootstrap_hi", "Slope bootstrap CI", 3,
                        "Percentile 95%, resampling the subgroup's patients"),
               text("size_note", "Size", "Too few patients: fails a sample-size rule of thumb")};
  bool anyBootstrap = false;
  for (const SubgroupAnalysis& analysis : subgroups) {
    for (const SubgroupResult& level : analysis.levels) {
      anyBootstrap = anyBootstrap || level.bootstrap.has_value();
      std::vector<TableValue> row{TableValue::of(analysis.column), TableValue::of(level.level),
                                  TableValue::ofCount(level.n), TableValue::ofCount(level.events),
                                  TableValue::of(std::string(level.tooSmall ? "yes" : "no"))};
      if (level.metrics) {
        const ValidationResult& m = *level.metrics;
        const Calibration& cal = m.calibration;
        row.insert(
            row.end(),
            {TableValue::of(m.discrimination.auc), TableValue::of(m.discrimination.aucCi),
             TableValue::of(cal.intercept), TableValue::of(cal.interceptCi),
             TableValue::of(cal.slope), TableValue::of(cal.slopeCi), TableValue::of(cal.oeRatio),
             TableValue::of(cal.oeCi), TableValue::of(m.overall.brier)});
      } else {
        row.insert(row.end(),
                   {TableValue::of(kNaN), TableValue::of(kNoInterval), TableValue::of(kNaN),
                    TableValue::of(kNoInterval), TableValue::of(kNaN), TableValue::of(kNoInterval),
                    TableValue::of(kNaN), TableValue::of(kNoInterval), TableValue::of(kNaN)});
      }
      row.push_back(TableValue::of(level.bootstrap ? level.bootstrap->auc.ci : kNoInterval));
      std::string warnings;
      for (const std::string& w : level.warnings) warnings += (warnings.empty() ? "" : "; ") + w;
      row.push_back(TableValue::of(warnings));
      row.push_back(TableValue::of(
          level.n > 0 ? static_cast<double>(level.events) / static_cast<double>(level.n) : kNaN));
      row.push_back(TableValue::of(level.metrics ? level.metrics->calibration.ici : kNaN));
      row.push_back(
          TableValue::of(level.bootstrap ? level.bootstrap->calibrationSlope.ci : kNoInterval));
      row.push_back(TableValue::of(
          std::string(subgroupSizeText(level.tooSmall, level.metrics.has_value(), level.events))));
      t.rows.push_back(std::move(row));
    }
  }
  if (subgroups.size() != 1) t.shownOrder.push_back(0);
  for (const std::size_t k : {1, 2, 3, 16, 5, 6, 7, 8, 9, 10, 11, 12, 17, 13}) {
    t.shownOrder.push_back(k);
  }
  if (anyBootstrap) t.shownOrder.insert(t.shownOrder.end(), {14, 18});
  t.shownOrder.insert(t.shownOrder.end(), {19, 15});
  return t;
}

}  // namespace calivera
