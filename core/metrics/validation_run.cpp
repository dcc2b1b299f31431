#include "core/metrics/validation_run.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <future>
#include <sstream>
#include <utility>

#include "core/data/cohort_source.h"
#include "core/imputation/stacked_imputations.h"
#include "core/model/analysed_fingerprint.h"
#include "core/model/category_levels.h"
#include "core/model/linear_predictor.h"
#include "core/model/model_io.h"
#include "core/util/errors.h"
#include "core/util/indexed_tasks.h"
#include "core/util/sha256.h"
#include "core/util/stage_times.h"

namespace calivera {
std::string exclusionWarning(const ExclusionReport& report) {
  std::string text = std::to_string(report.rowsExcluded) + " of " +
                     std::to_string(report.rowsRead) +
                     " rows excluded for a missing value (complete-case analysis):";
  bool first = true;
  for (const ColumnExclusion& c : report.byColumn) {
    if (c.rowsMissing == 0) continue;
    text +=
        std::string(first ? " " : ", ") + c.column + " missing in " + std::to_string(c.rowsMissing);
    first = false;
  }
  return text;
}

namespace {

std::vector<double> riskFromColumn(const Table& table, const std::string& name,
                                   const std::vector<std::uint32_t>& rows) {
  const Column& column = table.requireNumeric(name);
  std::vector<double> risk(rows.size());
  for (std::size_t i = 0; i < rows.size(); ++i) {
    const double p = column.numbers[rows[i]];
    if (!(p >= 0.0 && p <= 1.0)) {
      std::ostringstream message;
      message.precision(10);
      message << table.placeOfRow(rows[i]) << ": column " << name << ": risk " << p
              << " lies outside [0, 1]";
      throw InputError(message.str());
    }
    risk[i] = p;
  }
  return risk;
}

}  // namespace

PreparedCohort prepareCohort(const Table& table, const OutcomeSpec& outcome, const Model* model,
                             const std::optional<std::string>& riskColumn) {
  if ((model != nullptr) == riskColumn.has_value()) {
    throw InputError("give either a model file or a risk column, not both or neither");
  }
  std::vector<std::string> columns{outcome.column};
  if (model) {
    requireModelColumns(*model, table);  // names the term and how to map it
    for (const std::string& c : requiredColumns(*model)) {
      if (c != outcome.column) columns.push_back(c);
    }
  } else {
    table.requireNumeric(*riskColumn);  // a text risk column is an error naming its line
    if (*riskColumn != outcome.column) columns.push_back(*riskColumn);
  }
  for (const std::string& c : columns) table.require(c);
  PreparedCohort prepared;
  AnalysisRows selected = selectCompleteCases(table, columns);
  prepared.rows = std::move(selected.rows);
  prepared.exclusions = std::move(selected.exclusions);
  if (prepared.exclusions.rowsExcluded > 0) {
    prepared.warnings.push_back(exclusionWarning(prepared.exclusions));
  }
  if (prepared.rows.empty()) {
    // Name the columns that are missing in every row: the usual reason, and the one to fix.
    std::string empty;
    for (const ColumnExclusion& c : prepared.exclusions.byColumn) {
      if (c.rowsMissing == prepared.exclusions.rowsRead) {
        empty += (empty.empty() ? "" : ", ") + std::string("'") + c.column + "'";
      }
    }
    throw AnalysisError(table.sourceName + ": no row has all of the needed columns" +
                        (empty.empty() ? std::string() : " (missing in every row: " + empty + ")"));
  }
  prepared.input.outcome = outcomeValues(table, outcome, prepared.rows);
  if (model) {
    for (std::string& w : checkCategoryLevels(*model, table, prepared.rows)) {
      prepared.warnings.push_back(std::move(w));
    }
    std::vector<double> lp = linearPredictor(*model, table, prepared.rows);
    prepared.input.risk.resize(lp.size());
    for (std::size_t i = 0; i < lp.size(); ++i) prepared.input.risk[i] = logisticRisk(lp[i]);
    prepared.input.linearPredictor = std::move(lp);
  } else {
    prepared.input.risk = riskFromColumn(table, *riskColumn, prepared.rows);
  }
  return prepared;
}

bool isApparent(const Model* model, const std::string& dataSha256,
                const std::string& analysedSha256) {
  if (!model) return false;
  const DevelopmentRecord& d = model->development;
  return (d.dataSha256 && *d.dataSha256 == dataSha256) ||
         (d.analysedSha256 && !analysedSha256.empty() && *d.analysedSha256 == analysedSha256);
}

PerformanceDecision decidePerformance(const Model* model, const std::string& dataSha256,
                                      const std::string& analysedSha256,
                                      bool statedDevelopmentData) {
  if (isApparent(model, dataSha256)) {
    return {true,
            "the cohort is the model's development data (SHA-256 match of the file, or of the "
            "database result)"};
  }
  if (isApparent(model, {}, analysedSha256)) {
    return {true,
            "the analysed values are the model's development data (analysed-data fingerprint "
            "match), although the file's bytes or the database result differ"};
  }
  if (statedDevelopmentData) {
    return {true, "stated by the user: the cohort is the model's development data"};
  }
  if (model && (model->development.dataSha256 || model->development.analysedSha256)) {
    return {false,
            "the cohort differs from the model's development data (SHA-256 of the file or "
            "database result, and analysed-data fingerprint)"};
  }
  if (model) {
    return {false, "the model file records no development data SHA-256; treated as new data"};
  }
  return {false, "risks read from a column; no development record, treated as new data"};
}

namespace {

// One validation of one table: no imputation (the request's imputation fields are ignored).
ValidationRun runSingleValidation(const ValidationRequest& request,
                                  std::shared_ptr<const Table> table, std::string dataSha256,
                                  const PerformanceDecision* decided) {
  if (!table) throw InputError("no cohort is loaded");
  ValidationRun run;
  run.request = request;
  run.request.model.reset();  // kept once, in run.model
  run.softwareVersion = CALIVERA_VERSION;
  run.dataSha256 = std::move(dataSha256);
  run.database = table->database;
  reportProgress(request.options.progress, 0.0);
  if (request.model) {
    run.model = *request.model;
    run.modelSha256 = sha256OfBytes(modelToJson(*request.model));
    run.modelName = run.model->name;
    run.request.modelPath = request.modelLabel;
  } else if (request.modelPath) {
    run.model = readModelFile(*request.modelPath);
    run.modelSha256 = sha256OfFile(*request.modelPath);
    run.modelName = run.model->name;
  } else if (request.riskColumn) {
    run.modelName = "risk column " + *request.riskColumn;
  }
  if (run.model) {
    for (const auto& [variable, column] : request.columnMapping) {
      run.model->columnMapping[variable] = column;
    }
    for (const auto& [variable, levels] : request.levelMapping) {
      for (const auto& [from, to] : levels) run.model->levelMapping[variable][from] = to;
    }
  }
  const Model* model = run.model ? &*run.model : nullptr;
  run.cohort = prepareCohort(*table, request.outcome, model, request.riskColumn);
  {
    std::vector<std::string> used;
    for (const ColumnExclusion& c : run.cohort.exclusions.byColumn) used.push_back(c.column);
    run.missingPatterns = missingPatterns(*table, used, request.outcome);
  }
  markStage("cohort prepared");
  if (model && !decided) {
    run.analysedSha256 =
        analysedDataFingerprint(*model, *table, run.cohort.rows, run.cohort.input.outcome);
  }
  markStage("analysed-data fingerprint");
  const PerformanceDecision decision =
      decided
          ? *decided
          : decidePerformance(model, run.dataSha256, run.analysedSha256, request.developmentData);
  run.performance = decision.apparent ? kPerformanceApparent : kPerformanceNewData;
  run.performanceBasis = decision.basis;
  ValidationOptions options = request.options;
  options.apparent = decision.apparent;
  if (options.thresholds.empty()) options.thresholds = thresholdRange(0.01, 0.99, 0.01);
  run.request.options.thresholds = options.thresholds;
  run.result = validate(run.cohort.input, options);
  markStage("validated");
  run.result.warnings.insert(run.result.warnings.begin(), run.cohort.warnings.begin(),
                             run.cohort.warnings.end());
  run.request.options.apparent = decision.apparent;
  run.request.options.progress = nullptr;  // the caller's callback must not outlive the call
  run.table = std::move(table);
  return run;
}

}  // namespace

std::vector<std::string> analysisColumns(const ValidationRequest& request,
                                         const std::vector<std::string>& compareModelPaths,
                                         const std::vector<std::string>& subgroupColumns) {
  std::vector<std::string> columns{request.outcome.column};
  const auto add = [&columns](const std::string& c) {
    if (std::find(columns.begin(), columns.end(), c) == columns.end()) columns.push_back(c);
  };
  try {
    if (request.model || request.modelPath) {
      Model model = request.model ? *request.model : readModelFile(*request.modelPath);
      for (const auto& [variable, column] : request.columnMapping) {
        model.columnMapping[variable] = column;
      }
      for (const std::string& c : requiredColumns(model)) add(c);
    }
    for (const std::string& path : compareModelPaths) {
      for (const std::string& c : requiredColumns(readModelFile(path))) add(c);
    }
  } catch (const InputError&) {
    return {};
  }
  if (request.riskColumn) add(*request.riskColumn);
  if (request.imputationColumn) add(*request.imputationColumn);
  for (const std::string& c : subgroupColumns) add(c);
  return columns;
}

namespace {

// --impute: the complete-case validation of the cohort as read, then `copies` completed copies
// made by chained equations, each validated (on the worker that made it) and pooled.
ValidationRun runImputedValidation(const ValidationRequest& request,
                                   std::shared_ptr<const Table> table, const std::string& sha,
                                   const PerformanceDecision* decided) {
  const ChainedEquationsOptions& impute = *request.impute;
  assert(impute.isValid());
  if (request.imputationColumn) {
    throw InputError(
        "imputation: copies are either made here or read from an imputation "
        "column, not both");
  }
  if (!request.modelPath && !request.model) {
    throw InputError(
        "imputation needs a model: risks read from a column cannot be recomputed "
        "from imputed predictor values");
  }
  ValidationRequest each = request;
  each.impute.reset();
  each.options.progress = nullptr;
  ValidationRun run = runSingleValidation(each, std::move(table), sha, decided);
  const ChainedEquationsData data =
      prepareChainedEquations(*run.table, requiredColumns(*run.model), request.outcome);
  markStage("imputation prepared");
  // Every copy validates the run's model (its mapping already applied) without reading the file
  // again; its fingerprint does not enter the pooled results.
  each.model = run.model;
  each.modelPath.reset();
  const PerformanceDecision decision{run.performance == kPerformanceApparent, run.performanceBasis};
  const auto m = static_cast<std::size_t>(impute.copies);
  std::vector<CopyMeasures> copies(m);
  runIndexedTasks(m, impute.threads, request.options.progress, [&](std::size_t k) {
    const ValidationRun copy = runSingleValidation(
        each, std::make_shared<const Table>(imputedCopy(*run.table, data, impute, k)), sha,
        &decision);
    if (copy.result.cohort.n != data.rows.size()) {
      throw InputError(run.table->sourceName + ": imputed copy " + std::to_string(k + 1) +
                       " analyses " + std::to_string(copy.result.cohort.n) + " of the " +
                       std::to_string(data.rows.size()) +
                       " patients with a known outcome: a value the model needs is still "
                       "unusable after imputation");
    }
    copies[k] = copyMeasures(copy, static_cast<long long>(k + 1));
  });
  markStage("imputed copies made and validated");
  ImputedValidation pooled = poolImputedCopies(copies, std::string());
  pooled.method = "chained_equations";
  pooled.iterations = impute.iterations;
  pooled.seed = impute.seed;
  pooled.donors = impute.donors;
  for (const std::size_t v : data.incomplete) {
    const ChainedEquationsData::Variable& variable = data.variables[v];
    pooled.imputedColumns.push_back(
        {variable.name, imputationMethodKey(variable.method), variable.missingAt.size()});
  }
  run.imputed = std::make_shared<const ImputedValidation>(std::move(pooled));
  run.request.impute = request.impute;
  markStage("imputations pooled");
  return run;
}

// --imputation-column: the complete-case validation of the original data (index 0), then every
// stacked copy validated (in parallel, each copy a table of its own only while it is validated)
// and pooled.
ValidationRun runStackedValidation(const ValidationRequest& request, const Table& table,
                                   const std::string& sha, const PerformanceDecision* decided) {
  const StackedImputations stacked =
      splitStackedImputations(table, *request.imputationColumn, request.outcome.column);
  ValidationRequest each = request;
  each.imputationColumn.reset();
  each.options.progress = nullptr;
  ValidationRun run = runSingleValidation(
      each, std::make_shared<const Table>(tableRows(table, stacked.originalRows)), sha, decided);
  // Every copy validates the run's model (its mapping already applied) without reading the file
  // again.
  if (run.model) {
    each.model = run.model;
    each.modelPath.reset();
  }
  const PerformanceDecision decision{run.performance == kPerformanceApparent, run.performanceBasis};
  const std::size_t m = stacked.copyRows.size();
  std::vector<CopyMeasures> copies(m);
  std::vector<std::vector<std::uint32_t>> analysedRows(m);
  runIndexedTasks(m, request.copyThreads, request.options.progress, [&](std::size_t i) {
    ValidationRun copy = runSingleValidation(
        each, std::make_shared<const Table>(tableRows(table, stacked.copyRows[i])), sha, &decision);
    copies[i] = copyMeasures(copy, stacked.indices[i]);
    analysedRows[i] = std::move(copy.cohort.rows);
  });
  for (std::size_t i = 1; i < m; ++i) {
    if (analysedRows[i] == analysedRows[0]) continue;
    throw InputError(table.sourceName + ": imputation " + std::to_string(stacked.indices[i]) +
                     " analyses " + std::to_string(analysedRows[i].size()) +
                     " patients, imputation " + std::to_string(stacked.indices[0]) + " " +
                     std::to_string(analysedRows[0].size()) +
                     ": a column the analysis needs is still missing in a copy (each copy "
                     "must be complete)");
  }
  markStage("imputed copies validated");
  run.imputed =
      std::make_shared<const ImputedValidation>(poolImputedCopies(copies, stacked.column));
  run.request.imputationColumn = request.imputationColumn;  // the run as asked for
  markStage("imputations pooled");
  return run;
}

}  // namespace

ValidationRun runValidation(const ValidationRequest& request, std::shared_ptr<const Table> table,
                            std::string dataSha256, const PerformanceDecision* decided) {
  if (!table) throw InputError("no cohort is loaded");
  if (request.impute) return runImputedValidation(request, std::move(table), dataSha256, decided);
  if (request.imputationColumn) return runStackedValidation(request, *table, dataSha256, decided);
  return runSingleValidation(request, std::move(table), std::move(dataSha256), decided);
}

ValidationRun runValidation(const ValidationRequest& request) {
  CohortRead read =
      readCohort(request.dataPath, request.database, request.csv, request.options.progress);
  return runValidation(request, std::make_shared<const Table>(std::move(read.table)),
                       std::move(read.sha256));
}

}  // namespace calivera
