#pragma once
// The whole validation pipeline as one engine shared by the command line and the workstation:
// load the cohort -> select complete rows (exclusions counted per column) -> outcome ->
// predicted risks (from a model file, or from a risk column) -> validate() -> one ValidationRun
// that every output (JSON, CSV tables, text summary, PDF, GUI) reads.
//
// Apparent vs new data (decidePerformance): performance is "apparent" (the model is judged on the
// data it was fitted on; Hosmer-Lemeshow df = g - 2) when the user states that the cohort is the
// model's development data, or when the model file records the SHA-256 of its development data and
// it equals the cohort file's SHA-256; otherwise "new data" (df = g). With a risk column no
// development record exists and the cohort is treated as new data unless the user states
// otherwise, which the run says.
//
// The command line (validate, run) and the workstation (core/study/study_pipeline.h) both call
// runValidation, so a study gives the same ValidationRun, JSON and report wherever it runs.

#include <cstdint>
#include <map>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "core/data/cohort.h"
#include "core/data/cohort_file.h"
#include "core/data/csv_reader.h"
#include "core/data/database_source.h"
#include "core/data/table.h"
#include "core/imputation/chained_equations.h"
#include "core/imputation/imputed_validation.h"
#include "core/imputation/missing_patterns.h"
#include "core/metrics/validation.h"
#include "core/model/model.h"

namespace calivera {

inline constexpr const char* kPerformanceApparent = "apparent";
inline constexpr const char* kPerformanceNewData = "new data";

struct ValidationRequest {
  std::string dataPath;  // a cohort file, or a PostgreSQL URI when `database` is set
  // The table or query of a PostgreSQL source (core/data/database_source.h).
  std::optional<DatabaseSelection> database;
  CsvOptions csv;
  OutcomeSpec outcome;
  std::optional<std::string> modelPath;  // exactly one of modelPath, model and riskColumn
  std::optional<std::string> riskColumn;
  // A model already in memory (fitted in the workstation and saved in the study): used instead
  // of reading modelPath; modelLabel stands for its file name and its fingerprint is that of its
  // model JSON, the bytes "Save model" writes.
  std::optional<Model> model;
  std::string modelLabel = "(fitted in the workstation)";
  // Model variable -> cohort column, applied on top of the model file's own mapping.
  std::map<std::string, std::string> columnMapping;
  // Model variable -> (cohort level -> model level), applied on top of the model (Model::
  // levelMapping); its targets must be levels the model knows (core/model/category_levels.h).
  std::map<std::string, std::map<std::string, std::string>> levelMapping;
  // The user states that the cohort is the model's development data (apparent performance) even
  // when no fingerprint says so (for example the same patients saved with another delimiter).
  bool developmentData = false;
  // A column numbering stacked imputed copies (core/imputation/stacked_imputations.h): the
  // complete-case results come from the original data (index 0) and the pooled ones from the
  // copies. File route only (runValidation(request)).
  std::optional<std::string> imputationColumn;
  // Worker threads validating the stacked copies (0: all hardware threads). Every copy's
  // results are the same whatever the count.
  unsigned copyThreads = 0;
  // Impute the model's missing predictor values here (core/imputation/chained_equations.h):
  // the complete-case results come from the cohort as read and the pooled ones from the
  // completed copies. File route and model route only; not with imputationColumn.
  std::optional<ChainedEquationsOptions> impute;
  ValidationOptions options;  // thresholds empty: the default 0.01..0.99 by 0.01
};

// The analysed cohort before any metric: what validate() receives, plus where it came from.
struct PreparedCohort {
  std::vector<std::uint32_t> rows;  // table rows analysed, ascending
  ExclusionReport exclusions;
  ValidationInput input;  // outcome, risk and (model route) linear predictor per row
  std::vector<std::string> warnings;
};

struct ValidationRun {
  ValidationRequest request;  // as given, with options.thresholds filled in
  // The cohort file's SHA-256, or the database result's fingerprint.
  std::string dataSha256;
  // A PostgreSQL source: where the rows came from (the table's Table::database); null for a file.
  std::shared_ptr<const DatabaseProvenance> database;
  // The analysed-data fingerprint (core/model/analysed_fingerprint.h); model route only.
  std::string analysedSha256;
  std::optional<Model> model;          // model route only
  std::string modelSha256;             // model route only
  std::string modelName;               // the model's name, or "risk column COL"
  std::string performance;             // kPerformanceApparent or kPerformanceNewData
  std::string performanceBasis;        // one sentence: why apparent / new data
  std::shared_ptr<const Table> table;  // the cohort as read (subgroups, bootstrap, the GUI)
  PreparedCohort cohort;
  ValidationResult result;  // result.warnings also holds the pipeline's warnings
  // The columns the analysis uses (outcome first), missing together: the missingness report.
  MissingPatternReport missingPatterns;
  // With request.imputationColumn or request.impute: the validation of every copy pooled by
  // Rubin's rules.
  std::shared_ptr<const ImputedValidation> imputed;
  std::string softwareVersion;  // CALIVERA_VERSION
};

// The one wording of a complete-case exclusion ("k of n rows excluded for a missing value ...");
// the run's warnings hold it when rows were excluded.
std::string exclusionWarning(const ExclusionReport& report);

// Complete-case selection, outcome and risks on an already loaded table. Throws InputError for a
// missing column, a non-numeric risk column or a risk outside [0, 1] (naming file, line, column).
PreparedCohort prepareCohort(const Table& table, const OutcomeSpec& outcome, const Model* model,
                             const std::optional<std::string>& riskColumn);

// True when the model's development record matches the cohort: the file's SHA-256, or the
// analysed-data fingerprint (the same values saved in another layout).
bool isApparent(const Model* model, const std::string& dataSha256,
                const std::string& analysedSha256 = {});

struct PerformanceDecision {
  bool apparent = false;
  std::string basis;  // one sentence: why apparent / new data
};
PerformanceDecision decidePerformance(const Model* model, const std::string& dataSha256,
                                      const std::string& analysedSha256,
                                      bool statedDevelopmentData);

// The cohort columns a validation reads: the outcome, the model's (after the request's mapping)
// or the risk column, the compared models' and the subgroup columns. The command line reads only
// these (CsvOptions::onlyColumns). Reads the model files; empty (read every column, and let the
// run report the problem) when one of them cannot be read.
std::vector<std::string> analysisColumns(const ValidationRequest& request,
                                         const std::vector<std::string>& compareModelPaths,
                                         const std::vector<std::string>& subgroupColumns);

// Runs every step. Throws InputError (bad files, columns, values; exit 2 on the command line),
// AnalysisError (one outcome class, no complete rows; exit 1) or Cancelled.
ValidationRun runValidation(const ValidationRequest& request);

// The same after the caller loaded the table (the workstation loads it once for its data view),
// with the same imputation routes (request.impute, request.imputationColumn).
// `decided`: apparent or new data as already decided for the cohort this table is part of (an
// imputed copy takes the original data's decision); then no analysed-data fingerprint is made.
ValidationRun runValidation(const ValidationRequest& request, std::shared_ptr<const Table> table,
                            std::string dataSha256, const PerformanceDecision* decided = nullptr);

}  // namespace calivera
