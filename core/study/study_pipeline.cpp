#include "core/study/study_pipeline.h"

#include <filesystem>

#include "core/model/category_levels.h"
#include "core/model/model_io.h"
#include "core/study/study_file.h"
#include "core/study/study_uncertainty.h"
#include "core/util/errors.h"
#include "core/util/sha256.h"

namespace calivera {

std::vector<std::string> unmappedVariables(const Model& model,
                                           const std::map<std::string, std::string>& mapping,
                                           const Table& table) {
  std::vector<std::string> out;
  for (const std::string& variable : modelVariables(model)) {
    std::string column = variable;
    if (const auto it = mapping.find(variable); it != mapping.end()) column = it->second;
    if (const auto it = model.columnMapping.find(variable);
        mapping.count(variable) == 0 && it != model.columnMapping.end()) {
      column = it->second;
    }
    if (table.find(column) == nullptr) out.push_back(variable);
  }
  return out;
}

PipelineOutput runPipeline(const PipelineRequest& request, const ProgressCallback& progress) {
  PipelineOutput out;
  out.study = request.study;
  StudyState& s = out.study;
  s.result.reset();
  s.run.reset();
  s.exclusions = {};
  const std::shared_ptr<const UncertaintyResults> previousUncertainty = std::move(s.uncertainty);
  s.uncertainty.reset();
  reportProgress(progress, 0.0);

  if (!s.data) throw InputError("no cohort file is chosen");
  const StudyState recorded = s;  // the fingerprints as saved, for the changed-input check
  if (request.table && request.table->sourceName == cohortSourceName(*s.data)) {
    out.table = request.table;
  } else {
    LoadedTable loaded = loadCohort(*s.data, s.import, [&](double) {
      return progress ? progress(0.0) : true;  // a database is polled between batches
    });
    s.data = loaded.record;
    out.table = loaded.table;
  }
  if (s.data->sha256.empty()) {
    // A table the import dialog read: a file is hashed here, a database result carries its own.
    s.data->sha256 = s.data->database
                         ? (out.table->database ? out.table->database->resultSha256 : "")
                         : sha256OfFile(s.data->path);
  }
  if (request.checkRecordedInputs) {
    // The cohort was hashed as it was read; only the (small) model files are hashed here.
    out.inputWarnings = s.pathNotes;
    for (const InputCheck& c : checkInputs(recorded, s.data->sha256)) {
      out.inputWarnings.push_back("The " + c.role + " " + c.path + " is " + c.problem + ".");
    }
  }
  reportProgress(progress, 0.2);

  switch (s.modelSource) {
    case ModelSource::None:
      s.model.reset();
      break;
    case ModelSource::File: {
      if (!s.modelFile) throw InputError("no model file is chosen");
      s.model = readModelFile(s.modelFile->path);
      s.modelFile->path = std::filesystem::absolute(s.modelFile->path).string();
      s.modelFile->sha256 = sha256OfFile(s.modelFile->path);
      s.modelWarnings.clear();
      break;
    }
    case ModelSource::Fitted: {
      if (!s.model || request.refit) {
        FittedModel fitted = fitModel(*out.table, s.import, s.fit, [&](double f) {
          return progress ? progress(0.2 + 0.2 * f) : true;
        });
        s.model = std::move(fitted.model);
        s.modelWarnings = fitted.warnings;
      }
      // As `calivera fit` records it: the fingerprint of the data the model was fitted on, so the
      // model saved from the workstation knows its development data too.
      if (!s.model->development.dataSha256) s.model->development.dataSha256 = s.data->sha256;
      s.analysis.apparent = true;  // performance on the data the model was fitted on
      break;
    }
  }
  reportProgress(progress, 0.4);
  if (!s.model) {
    out.notes.push_back("Load a model file or fit a model to run the validation.");
    return out;
  }
  if (s.import.outcomeColumn.empty()) {
    out.notes.push_back("Choose the outcome column (File → Import cohort) to run the validation.");
    return out;
  }
  out.unmappedVariables = unmappedVariables(*s.model, s.columnMapping, *out.table);
  if (!out.unmappedVariables.empty()) {
    std::string list;
    for (const auto& v : out.unmappedVariables) list += (list.empty() ? "" : ", ") + v;
    out.notes.push_back("The model uses variables the cohort does not have under these names: " +
                        list + ". Pair them with cohort columns (Model → Map variables).");
    return out;
  }
  const bool fullUncertainty = request.withUncertainty && s.uncertaintySettings.anyRequested();
  const double analysisEnd = fullUncertainty ? 0.6 : 1.0;
  AnalysisOutput analysis;
  try {
    analysis = runAnalysis(out.table, *s.model, s, [&](double f) {
      return progress ? progress(0.4 + (analysisEnd - 0.4) * f) : true;
    });
  } catch (const UnknownLevelError& e) {
    out.problems.push_back(e.what());
    return out;
  }
  s.exclusions = analysis.exclusions;
  s.result = analysis.result;
  s.run = analysis.cohort->run;
  out.cohort = analysis.cohort;

  const std::string basis = validationBasis(s);
  if (previousUncertainty && s.uncertaintyBasis == basis && !fullUncertainty) {
    s.uncertainty = previousUncertainty;
    return out;
  }
  s.uncertaintyBasis = basis;
  if (fullUncertainty) {
    try {
      UncertaintyResults u =
          computeUncertainty(*out.cohort, *s.result, s.uncertaintySettings, [&](double f) {
            return progress ? progress(analysisEnd + (1.0 - analysisEnd) * f) : true;
          });
      s.uncertaintySettings = withComparedHashes(s.uncertaintySettings, u);
      s.uncertainty = std::make_shared<const UncertaintyResults>(std::move(u));
      return out;
    } catch (const Cancelled&) {
      throw;
    } catch (const std::runtime_error& e) {  // InputError, AnalysisError: the study still opens
      out.notes.push_back(std::string("The uncertainty analysis could not run: ") + e.what());
    }
  }
  // The sample-size assessment alone: cheap, and always shown before the results.
  UncertaintySettings sizeOnly;
  sizeOnly.sizeThresholds = s.uncertaintySettings.sizeThresholds;
  try {
    s.uncertainty = std::make_shared<const UncertaintyResults>(
        computeUncertainty(*out.cohort, *s.result, sizeOnly, nullptr));
  } catch (const AnalysisError& e) {
    out.notes.push_back(std::string("No sample-size assessment: ") + e.what());
  }
  return out;
}

}  // namespace calivera
