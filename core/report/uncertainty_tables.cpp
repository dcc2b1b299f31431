#include "core/report/uncertainty_tables.h"

#include <cmath>

#include "core/report/audit_format.h"
#include "core/report/csv_text.h"
#include "core/report/validation_tables.h"
#include "core/uncertainty/bootstrap_measures.h"

namespace calivera {
namespace {

std::string sampleSizeCsv(const SampleSizeAssessment& a) {
  CsvText csv({"kind", "name", "target_ci_width", "target_se", "required_n", "required_events",
               "achieved_ci_width", "met", "note"});
  const double none = std::nan("");
  for (const RuleOfThumb& rule : a.rules) {
    csv.field("rule").field(rule.rule).num(none).num(none).num(none).num(none).num(none);
    csv.field(rule.met ? "yes" : "no").field("").end();
  }
  for (const SampleSizeCriterion& c : a.criteria) {
    csv.field("criterion").field(c.criterion).num(c.targetCiWidth).num(c.targetSe);
    csv.num(c.requiredN).num(c.requiredEvents).num(c.achievedCiWidth.value_or(none));
    csv.field(c.met ? "yes" : "no").field(c.note).end();
  }
  csv.field("verdict").field(a.verdict).num(none).num(none).num(a.requiredN).num(none).num(none);
  csv.field(a.adequate ? "yes" : "no").field(a.drivingCriterion).end();
  return csv.str();
}

std::string bootstrapCsv(const ValidationBootstrap& b) {
  CsvText csv({"statistic", "estimate", "ci_lo", "ci_hi", "replicates_used", "replicates", "seed",
               "failed"});
  for (const BootstrappedMeasure& m : bootstrappedMeasures()) {
    const BootstrapEstimate* e = &(b.*m.interval);
    csv.field(m.key).num(e->estimate).ci(e->ci).count(e->replicatesUsed);
    csv.count(static_cast<std::size_t>(b.run.replicates)).field(std::to_string(b.run.seed));
    csv.count(b.run.failed).end();
  }
  return csv.str();
}

std::string bandCsv(const std::vector<BandPoint>& band, const char* xName) {
  CsvText csv({xName, "estimate", "ci_lo", "ci_hi", "replicates_used"});
  for (const BandPoint& p : band) {
    csv.num(p.x).num(p.estimate).ci(p.ci).count(p.replicatesUsed).end();
  }
  return csv.str();
}

std::string comparedModelsCsv(const UncertaintyResults& r) {
  const ModelComparison& c = *r.comparison;
  CsvText csv({"model", "file", "sha256", "auc", "auc_ci_lo", "auc_ci_hi", "comparison_rows"});
  for (std::size_t m = 0; m < c.models.size(); ++m) {
    // The first model is the validated one: its file is in the validation's own tables.
    const ComparedModelFile* file = m == 0 ? nullptr : &r.comparedModels.at(m - 1);
    csv.field(c.models[m]).field(file ? fileNameOnly(file->path) : "(validated model)");
    csv.field(file ? file->sha256 : "").num(c.aucs[m]);
    if (m < r.comparedResults.size()) {
      csv.ci(r.comparedResults[m].discrimination.aucCi);
    } else {
      csv.field("").field("");
    }
    csv.count(r.comparisonRows).end();
  }
  return csv.str();
}

std::string comparisonAucCsv(const ModelComparison& c) {
  CsvText csv({"first", "second", "auc_first", "auc_second", "auc_difference", "se", "ci_lo",
               "ci_hi", "z", "p_value", "correlation"});
  for (const ModelPairComparison& pair : c.pairs) {
    const PairedAucTest& t = pair.auc;
    csv.field(c.models[t.first]).field(c.models[t.second]).num(t.aucFirst).num(t.aucSecond);
    csv.num(t.difference).num(t.se).ci(t.differenceCi).num(t.z).num(t.pValue).num(t.correlation);
    csv.end();
  }
  return csv.str();
}

std::string comparisonNetBenefitCsv(const ModelComparison& c) {
  CsvText csv({"first", "second", "threshold", "net_benefit_first", "net_benefit_second",
               "difference", "ci_lo", "ci_hi"});
  for (const ModelPairComparison& pair : c.pairs) {
    for (const NetBenefitDifferencePoint& p : pair.netBenefit) {
      csv.field(c.models[pair.auc.first]).field(c.models[pair.auc.second]).num(p.threshold);
      csv.num(p.netBenefitFirst).num(p.netBenefitSecond).num(p.difference).ci(p.ci).end();
    }
  }
  return csv.str();
}

std::string subgroupsCsv(const std::vector<SubgroupAnalysis>& subgroups) {
  CsvText csv({"column",
               "level",
               "n",
               "events",
               "too_small",
               "auc",
               "auc_ci_lo",
               "auc_ci_hi",
               "calibration_intercept",
               "intercept_ci_lo",
               "intercept_ci_hi",
               "calibration_slope",
               "slope_ci_lo",
               "slope_ci_hi",
               "oe_ratio",
               "oe_ci_lo",
               "oe_ci_hi",
               "brier",
               "auc_bootstrap_lo",
               "auc_bootstrap_hi",
               "warnings"});
  const double none = std::nan("");
  const Interval noInterval{none, none};
  for (const SubgroupAnalysis& analysis : subgroups) {
    for (const SubgroupResult& level : analysis.levels) {
      csv.field(analysis.column).field(level.level).count(level.n).count(level.events);
      csv.field(level.tooSmall ? "yes" : "no");
      if (level.metrics) {
        const ValidationResult& m = *level.metrics;
        const Calibration& cal = m.calibration;
        csv.num(m.discrimination.auc).ci(m.discrimination.aucCi);
        csv.num(cal.intercept).ci(cal.interceptCi).num(cal.slope).ci(cal.slopeCi);
        csv.num(cal.oeRatio).ci(cal.oeCi).num(m.overall.brier);
      } else {
        csv.num(none).ci(noInterval).num(none).ci(noInterval).num(none).ci(noInterval);
        csv.num(none).ci(noInterval).num(none);
      }
      csv.ci(level.bootstrap ? level.bootstrap->auc.ci : noInterval);
      std::string warnings;
      for (const std::string& w : level.warnings) warnings += (warnings.empty() ? "" : "; ") + w;
      csv.field(warnings).end();
    }
  }
  return csv.str();
}

}  // namespace

std::vector<std::pair<std::string, std::string>> uncertaintyTables(
    const UncertaintyResults& results) {
  std::vector<std::pair<std::string, std::string>> tables;
  tables.emplace_back("sample_size.csv", sampleSizeCsv(results.sampleSize));
  if (results.bootstrap) {
    tables.emplace_back("bootstrap_intervals.csv", bootstrapCsv(*results.bootstrap));
    tables.emplace_back("calibration_band.csv",
                        bandCsv(results.bootstrap->calibrationCurve, "risk"));
    tables.emplace_back("net_benefit_band.csv",
                        bandCsv(results.bootstrap->netBenefit, "threshold"));
  }
  if (results.comparison) {
    tables.emplace_back("compared_models.csv", comparedModelsCsv(results));
    tables.emplace_back("model_comparison_auc.csv", comparisonAucCsv(*results.comparison));
    tables.emplace_back("model_comparison_net_benefit.csv",
                        comparisonNetBenefitCsv(*results.comparison));
  }
  if (!results.subgroups.empty()) {
    tables.emplace_back("subgroups.csv", subgroupsCsv(results.subgroups));
  }
  return tables;
}

std::vector<std::pair<std::string, std::string>> allValidationTables(
    const ValidationRun& run, const UncertaintyResults& results) {
  std::vector<std::pair<std::string, std::string>> tables = validationTables(run);
  for (auto& table : uncertaintyTables(results)) tables.push_back(std::move(table));
  return tables;
}

void writeValidationTables(const std::string& directory, const ValidationRun& run,
                           const UncertaintyResults& results) {
  writeTables(directory, allValidationTables(run, results));
}

}  // namespace calivera
