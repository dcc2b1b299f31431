#pragma once
// A real validation run on birthwt (MASS::birthwt from Debian r-cran-mass, shipped under
// tests/reference/data/birthwt.csv) with models fitted by core's fitCohortModel, for tests of
// what is built from a run (report content, CSV tables, charts). The numbers these tests check
// are the run's own results carried into another form, never values of their own.

#include <filesystem>
#include <string>
#include <vector>

#include "core/data/csv_reader.h"
#include "core/fit/cohort_fit.h"
#include "core/metrics/validation_run.h"
#include "core/model/model_io.h"

namespace calivera::testing {

inline std::string birthwtPath() {
  return std::string(CALIVERA_SOURCE_DIR) + "/tests/reference/data/birthwt.csv";
}

// Fits low ~ predictors on birthwt and writes the model file to `path`.
inline void writeBirthwtModel(const std::string& path, const std::vector<std::string>& predictors,
                              const std::string& name) {
  const Table table = readCsvFile(birthwtPath(), CsvOptions{}).table;
  CohortFitSpec spec;
  spec.outcome.column = "low";
  spec.predictors = predictors;
  spec.modelName = name;
  writeModelFile(path, fitCohortModel(table, spec).model);
}

// Validates the model file at `modelPath` on birthwt (outcome low), thresholds 0.01..0.99.
inline ValidationRun birthwtRun(const std::string& modelPath) {
  ValidationRequest request;
  request.dataPath = birthwtPath();
  request.outcome.column = "low";
  request.modelPath = modelPath;
  return runValidation(request);
}

}  // namespace calivera::testing
