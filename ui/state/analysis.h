#pragma once
// The workstation's analysis pipeline as plain functions over core (no Qt), each safe to run on a
// worker thread: read the cohort, fit or map a model, and validate it. Every step throws the core
// error types (InputError / AnalysisError / Cancelled); the caller turns them into messages.

#include <cstdint>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "core/data/csv_reader.h"
#include "core/data/table.h"
#include "core/fit/logistic_fit.h"
#include "core/fit/profile_ci.h"
#include "core/metrics/validation.h"
#include "core/model/model.h"
#include "ui/state/study_state.h"

namespace calivera::ui {

// Per-patient data of the analysed rows, kept for the threshold index, the predictor views and
// the uncertainty run (ui/state/uncertainty.h): exactly what validate() received.
struct CohortData {
  std::shared_ptr<const Table> table;
  std::vector<std::uint32_t> rows;  // analysed rows of `table`
  OutcomeSpec outcomeSpec;
  Model model;                // with the study's column mapping applied
  ValidationInput input;      // outcome (0/1), risk and linear predictor per analysed row
  ValidationOptions options;  // as validate() used them, thresholds filled in, no progress
  const std::vector<double>& outcome() const { return input.outcome; }
  const std::vector<double>& risk() const { return input.risk; }
};

struct AnalysisOutput {
  Model model;  // with the study's column mapping applied
  std::shared_ptr<const CohortData> cohort;
  ExclusionReport exclusions;
  std::shared_ptr<const ValidationResult> result;
};

struct LoadedTable {
  std::shared_ptr<const Table> table;
  InputFileRecord record;
  char delimiter = ',';
};

CsvOptions csvOptionsFor(const ImportSettings& settings);
LoadedTable loadCohortFile(const std::string& path, const ImportSettings& settings);

// Model variables (term variables and product factors), in first-use order, before mapping.
std::vector<std::string> modelVariables(const Model& model);

// Validates `model` on the cohort: complete cases over the model's columns and the outcome,
// linear predictor, risk, then core's validate(). `progress` spans the whole run.
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

}  // namespace calivera::ui
