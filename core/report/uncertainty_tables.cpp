#include "core/report/uncertainty_tables.h"

#include <cmath>

#include "core/report/csv_text.h"
#include "core/report/site_tables.h"
#include "core/report/uncertainty_result_tables.h"
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
    for (const ResultTable& table :
         {comparedModelsTable(results), modelComparisonAucTable(*results.comparison),
          modelComparisonNetBenefitTable(*results.comparison)}) {
      tables.emplace_back(table.fileName, tableCsv(table));
    }
  }
  if (!results.subgroups.empty()) {
    const ResultTable table = subgroupsTable(results.subgroups);
    tables.emplace_back(table.fileName, tableCsv(table));
  }
  if (results.sites) {
    for (const ResultTable& table : {sitesTable(*results.sites), pooledSitesTable(*results.sites),
                                     pooledNetBenefitTable(*results.sites)}) {
      tables.emplace_back(table.fileName, tableCsv(table));
    }
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
