#include "core/report/audit_run.h"

#include "core/report/audit_format.h"

namespace calivera {

AuditReportInput auditInputFromRun(const ValidationRun& run, const std::string& title,
                                   std::size_t suppressBelow) {
  AuditReportInput input;
  input.title = title;
  input.softwareVersion = run.softwareVersion.empty() ? CALIVERA_VERSION : run.softwareVersion;
  input.cohortFile = {run.request.dataPath, run.dataSha256};
  input.database = run.database;
  input.analysedSha256 = run.analysedSha256;
  input.exclusions = run.cohort.exclusions;
  input.missingPatterns = run.missingPatterns;
  input.imputed = run.imputed;
  if (run.model) {
    input.model = *run.model;
    input.modelFile = {run.request.modelPath.value_or(""), run.modelSha256};
  } else {
    // Risks read from a column: there is no model file to fingerprint.
    input.model.name = run.modelName;
    input.modelFile = {"(" + run.modelName + ")", "none (risks read from the cohort file)"};
  }
  AuditSettings& settings = input.settings;
  settings.outcomeColumn = run.request.outcome.column;
  settings.eventValue = run.request.outcome.eventValue;
  settings.groups = run.request.options.groups;
  settings.apparent = run.performance == kPerformanceApparent;
  if (run.request.options.thresholds.size() <= kMaxTabulatedThresholds) {
    settings.tableThresholds = run.request.options.thresholds;
  }
  settings.suppressBelow = suppressBelow;
  const ValidationOptions& options = run.request.options;
  const std::vector<double>& grid = options.thresholds;
  if (!grid.empty()) {
    settings.other.emplace_back("Thresholds computed (decision curve)",
                                std::to_string(grid.size()) + " from " +
                                    formatThreshold(grid.front()) + " to " +
                                    formatThreshold(grid.back()));
  }
  settings.other.emplace_back("Predicted risks from", run.model ? "model file (linear predictor)"
                                                                : "risk column of the cohort");
  settings.other.emplace_back("Performance basis", run.performanceBasis);
  settings.other.emplace_back("Risk histogram bins", std::to_string(options.histogramBins));
  std::string missing;
  for (const std::string& token : run.request.csv.missingTokens) {
    missing += (missing.empty() ? "" : ", ") + (token.empty() ? std::string("(empty)") : token);
  }
  settings.other.emplace_back("Missing-value tokens", missing.empty() ? "none" : missing);
  for (const auto& [variable, column] : input.model.columnMapping) {
    settings.other.emplace_back("Column mapping: " + variable, column);
  }
  for (const auto& [variable, levels] : input.model.levelMapping) {
    std::string pairs;
    for (const auto& [from, to] : levels) pairs += (pairs.empty() ? "" : "; ") + from + " as " + to;
    settings.other.emplace_back("Level mapping: " + variable, pairs);
  }
  input.result = run.result;
  return input;
}

AuditReportInput auditInputFromRun(const ValidationRun& run, const std::string& title,
                                   std::size_t suppressBelow,
                                   const UncertaintyResults& uncertainty) {
  AuditReportInput input = auditInputFromRun(run, title, suppressBelow);
  auto& other = input.settings.other;
  if (uncertainty.bootstrap) {
    const BootstrapSummary& b = uncertainty.bootstrap->run;
    other.emplace_back("Bootstrap", std::to_string(b.replicates) + " resamples, seed " +
                                        std::to_string(b.seed) + ", " + std::to_string(b.threads) +
                                        (b.threads == 1 ? " thread" : " threads"));
  } else {
    other.emplace_back("Bootstrap", "not run (analytic intervals only)");
  }
  if (!uncertainty.comparedModels.empty()) {
    std::string files;
    for (const ComparedModelFile& m : uncertainty.comparedModels) {
      files += (files.empty() ? "" : ", ") + fileNameOnly(m.path);
    }
    other.emplace_back("Models compared", files);
  }
  if (!uncertainty.subgroups.empty()) {
    std::string columns;
    for (const SubgroupAnalysis& s : uncertainty.subgroups) {
      columns += (columns.empty() ? "" : ", ") + s.column;
    }
    other.emplace_back("Subgroup columns", columns);
  }
  input.uncertainty = uncertainty;
  return input;
}

}  // namespace calivera
