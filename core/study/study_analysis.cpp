#include "core/study/study_analysis.h"

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <future>

#include "core/data/cohort.h"
#include "core/data/cohort_source.h"
#include "core/fit/cohort_fit.h"
#include "core/metrics/validation_run.h"
#include "core/study/reproduce_command.h"
#include "core/util/errors.h"
#include "core/util/sha256.h"

namespace calivera {

namespace {

std::string problemText(FitProblem problem) {
  switch (problem) {
    case FitProblem::None:
      return {};
    case FitProblem::CompleteSeparation:
      return "complete separation: some predictor values predict the outcome perfectly, so "
             "maximum-likelihood estimates do not exist; consider Firth's penalized fit";
    case FitProblem::QuasiSeparation:
      return "quasi-complete separation: estimates for some terms are unstable or infinite; "
             "consider Firth's penalized fit";
    case FitProblem::RankDeficient:
      return "some predictors are constant or collinear; their coefficients are not identifiable";
    case FitProblem::NotConverged:
      return "the fit did not converge";
  }
  return {};
}

}  // namespace

CsvOptions csvOptionsFor(const ImportSettings& settings) {
  CsvOptions options;
  options.delimiter = settings.delimiter;
  options.missingTokens = settings.missingTokens;
  return options;
}

LoadedTable loadCohortFile(const std::string& path, const ImportSettings& settings) {
  LoadedTable loaded;
  std::future<std::string> hash = sha256OfFileInBackground(path);  // while the file is parsed
  CohortFileRead read = readCohortFile(path, csvOptionsFor(settings));
  loaded.delimiter = read.delimiter;
  loaded.table = std::make_shared<const Table>(std::move(read.table));
  loaded.record.path = std::filesystem::absolute(path).string();
  loaded.record.sha256 = hash.get();
  return loaded;
}

LoadedTable loadCohort(const InputFileRecord& source, const ImportSettings& settings,
                       const ProgressCallback& progress) {
  if (!source.database) return loadCohortFile(source.path, settings);
  CohortRead read = readCohort(source.path, source.database, csvOptionsFor(settings), progress);
  LoadedTable loaded;
  loaded.table = std::make_shared<const Table>(std::move(read.table));
  loaded.record = InputFileRecord{source.path, read.sha256, source.database};
  loaded.delimiter = 0;
  return loaded;
}

std::string cohortShortLabel(const InputFileRecord& source) {
  if (!source.database) return std::filesystem::path(source.path).filename().string();
  return source.database->table.empty() ? std::string("query (PostgreSQL)")
                                        : "table " + source.database->table + " (PostgreSQL)";
}

std::string cohortSourceName(const InputFileRecord& source) {
  return source.database ? databaseSourceName(source.path, *source.database) : source.path;
}

ValidationRequest validationRequestFor(const StudyState& study, const Model& model) {
  // The command line's request for this study (the one `calivera run` executes), with the model
  // the pipeline has already read or fitted, under the file's path where there is one.
  ValidationRequest request = studyRequests(study).validation;
  request.model = model;
  if (study.modelSource == ModelSource::File && study.modelFile) {
    request.modelLabel = study.modelFile->path;
  }
  return request;
}

AnalysisOutput runAnalysis(const std::shared_ptr<const Table>& table, Model model,
                           const StudyState& study, const ProgressCallback& progress) {
  if (!table) throw InputError("no cohort is loaded");
  if (study.import.outcomeColumn.empty()) throw InputError("no outcome column is chosen");
  ValidationRequest request = validationRequestFor(study, model);
  request.options.progress = progress;
  auto run = std::make_shared<ValidationRun>(
      runValidation(request, table, study.data ? study.data->sha256 : std::string()));
  if (study.modelSource == ModelSource::File && study.modelFile) {
    run->modelSha256 = study.modelFile->sha256;  // the file's bytes, as the command line hashes
  }
  auto cohort = std::make_shared<CohortData>();
  cohort->run = run;
  AnalysisOutput out;
  out.model = *run->model;
  out.exclusions = run->cohort.exclusions;
  out.result = std::shared_ptr<const ValidationResult>(run, &run->result);
  out.cohort = std::move(cohort);
  return out;
}

FittedModel fitModel(const Table& table, const ImportSettings& import, const FitSettings& fit,
                     const ProgressCallback& progress) {
  if (fit.predictors.empty()) throw InputError("choose at least one predictor to fit a model");
  CohortFitSpec spec;
  spec.outcome = OutcomeSpec{import.outcomeColumn, import.eventValue};
  spec.predictors = fit.predictors;
  spec.modelName = "Fitted on " + std::filesystem::path(table.sourceName).filename().string();
  spec.fit.firth = fit.firth;
  spec.splineKnots = fit.splineKnots;
  spec.profileIntervals = fit.profileIntervals && !fit.firth;
  spec.fit.progress = progress;
  // Separation and non-convergence without Firth are AnalysisErrors naming the terms; the fit
  // dialog shows them as the reason the fit failed.
  CohortFit fitted = fitCohortModel(table, spec);
  FittedModel out;
  out.model = std::move(fitted.model);
  out.model.outcome = import.outcomeColumn;
  out.fit = std::move(fitted.fit);
  out.exclusions = fitted.exclusions;
  if (const std::string text = problemText(out.fit.problem); !text.empty()) {
    out.warnings.push_back(text);
  }
  for (const std::string& w : out.fit.warnings) out.warnings.push_back(w);
  out.profile = std::move(fitted.profile);
  if (out.profile) {
    for (const std::string& w : out.profile->warnings) out.warnings.push_back("profile: " + w);
  }
  return out;
}

UpdateData updateDataOf(const CohortData& cohort) {
  UpdateData out;
  out.table = cohort.table().get();
  out.rows = cohort.rows();
  out.outcome = cohort.outcome();
  out.dataSha256 = cohort.run->dataSha256;
  out.analysedSha256 = cohort.run->analysedSha256;
  out.dataName = std::filesystem::path(cohort.run->request.dataPath).filename().string();
  return out;
}

}  // namespace calivera
