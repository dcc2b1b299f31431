#pragma once
// The workstation's analysis pipeline as plain functions over core (no Qt), each safe to run on a
// worker thread: read the cohort, fit or map a model, and validate it. Every step throws the core
// error types (InputError / AnalysisError / Cancelled); the caller turns them into messages.

#include <cstdint>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "core/data/cohort_file.h"
#include "core/data/csv_reader.h"
#include "core/data/table.h"
#include "core/fit/logistic_fit.h"
#include "core/fit/profile_ci.h"
#include "core/metrics/validation.h"
#include "core/metrics/validation_run.h"
#include "core/model/linear_predictor.h"  // modelVariables
#include "core/model/model.h"
#include "core/study/study.h"
#include "core/uncertainty/model_update.h"

namespace calivera {

// Per-patient data of the analysed rows, kept for the threshold index, the predictor views and
// the uncertainty run (core/study/study_uncertainty.h): a view of the one ValidationRun that the
// command line would produce for the same study (core/metrics/validation_run.h).
struct CohortData {
  std::shared_ptr<const ValidationRun> run;  // never null; its model is set

  const std::shared_ptr<const Table>& table() const { return run->table; }
  const std::vector<std::uint32_t>& rows() const { return run->cohort.rows; }  // analysed rows
  const OutcomeSpec& outcomeSpec() const { return run->request.outcome; }
  const Model& model() const { return *run->model; }  // with the study's column mapping applied
  // Outcome (0/1), risk and linear predictor per analysed row: exactly what validate() received.
  const ValidationInput& input() const { return run->cohort.input; }
  // As validate() used them: thresholds filled in, apparent decided, no progress callback.
  const ValidationOptions& options() const { return run->request.options; }
  const std::vector<double>& outcome() const { return input().outcome; }
  const std::vector<double>& risk() const { return input().risk; }
};

// The analysed patients as core's model-update input (core/uncertainty/model_update.h): the run's
// table, rows and outcome, its cohort fingerprint and the cohort's file name. The workstation's
// update and internal-validation dialogs and the update and internal commands all use this.
UpdateData updateDataOf(const CohortData& cohort);

struct AnalysisOutput {
  Model model;  // with the study's column mapping applied
  std::shared_ptr<const CohortData> cohort;
  ExclusionReport exclusions;
  std::shared_ptr<const ValidationResult> result;  // aliases cohort->run->result
};

struct LoadedTable {
  std::shared_ptr<const Table> table;
  InputFileRecord record;
  char delimiter = ',';
};

CsvOptions csvOptionsFor(const ImportSettings& settings);
LoadedTable loadCohortFile(const std::string& path, const ImportSettings& settings);
// A study's cohort, a file or a PostgreSQL table or query (reconnecting to read it again);
// `progress` is polled between the database's batches.
LoadedTable loadCohort(const InputFileRecord& source, const ImportSettings& settings,
                       const ProgressCallback& progress = {});
// How windows, chart footers and file names name the cohort: the file's name without folders, or
// "table T (PostgreSQL)" / "query (PostgreSQL)" for a database (the URI names the server; a
// footer must not).
std::string cohortShortLabel(const InputFileRecord& source);

// Table::sourceName of the table loadCohort gives for `source`: whether a loaded table is it.
std::string cohortSourceName(const InputFileRecord& source);

// The request the study stands for (studyRequests, core/study/reproduce_command.h, the one
// `calivera run` executes) with `model`, as the pipeline read or fitted it, held in memory.
ValidationRequest validationRequestFor(const StudyState& study, const Model& model);

// Validates `model` on the cohort through core's runValidation (the command line's path):
// complete cases over the model's columns and the outcome, linear predictor, risk, validate().
// `progress` spans the whole run.
AnalysisOutput runAnalysis(const std::shared_ptr<const Table>& table, Model model,
                           const StudyState& study, const ProgressCallback& progress);

struct FittedModel {
  Model model;
  FitResult fit;
  ExclusionReport exclusions;
  std::vector<std::string> warnings;        // separation, convergence, rank, in plain words
  std::optional<ProfileIntervals> profile;  // when FitSettings::profileIntervals (not Firth)
};

// Logistic regression of the outcome on the chosen predictors: numeric columns enter linearly (or
// as restricted cubic splines where fit.splineKnots says), text columns as indicators of each
// level but the first (the reference level).
FittedModel fitModel(const Table& table, const ImportSettings& import, const FitSettings& fit,
                     const ProgressCallback& progress);

}  // namespace calivera
