#pragma once
// A study on a cohort file and a model file, as the workstation saves one: outcome `low`
// (MASS::birthwt's), 8 risk groups, fingerprints of the files as they are now. Shared by the
// command-line and workstation parity tests.

#include <string>
#include <vector>

#include "core/data/csv_reader.h"
#include "core/fit/cohort_fit.h"
#include "core/model/model_io.h"
#include "core/study/study.h"
#include "core/study/study_file.h"
#include "core/util/sha256.h"

namespace calivera::testing {

inline StudyState birthwtFileStudy(const std::string& data, const std::string& model) {
  StudyState study;
  study.data = InputFileRecord{data, sha256OfFile(data)};
  study.import.outcomeColumn = "low";
  study.modelSource = ModelSource::File;
  study.modelFile = InputFileRecord{model, sha256OfFile(model)};
  study.analysis.groups = 8;
  return study;
}

// Fits `low` on `predictors` of the birthwt file at `data` and writes the model file to `path`.
inline void writeBirthwtModel(const std::string& data, const std::vector<std::string>& predictors,
                              const std::string& path) {
  CohortFitSpec spec;
  spec.outcome = OutcomeSpec{"low", std::nullopt};
  spec.predictors = predictors;
  writeModelFile(path, fitCohortModel(readCsvFile(data, CsvOptions{}).table, spec).model);
}

// The birthwt study the workstation tests open: model low ~ age + lwt + smoke written to
// `folder`/m.json, the study to `folder`/s.cvstudy (the study file's path is returned). Needs
// study_file.h.
inline std::string writeBirthwtStudy(const std::string& data, const std::string& folder) {
  const std::string model = folder + "/m.json";
  writeBirthwtModel(data, {"age", "lwt", "smoke"}, model);
  const std::string study = folder + "/s.cvstudy";
  writeStudyFile(study, birthwtFileStudy(data, model));
  return study;
}

}  // namespace calivera::testing
