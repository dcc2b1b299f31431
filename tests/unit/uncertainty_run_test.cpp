// runUncertainty's comparison overlays on birthwt (r-cran-mass, tests/reference/data/birthwt.csv):
// each compared model is validated on the comparison rows with the run's own options, so a model
// compared with itself reproduces the run's numbers exactly and the paired AUC difference is 0.
#include "core/uncertainty/uncertainty_run.h"

#include <gtest/gtest.h>

#include <filesystem>

#include "core/fit/cohort_fit.h"
#include "core/metrics/validation_run.h"
#include "core/model/model_io.h"

namespace calivera {
namespace {

namespace fs = std::filesystem;

const std::string kData = std::string(CALIVERA_SOURCE_DIR) + "/tests/reference/data/birthwt.csv";

std::string writeFittedModel(const std::vector<std::string>& predictors, const std::string& name) {
  const Table table = readCsvFile(kData, CsvOptions{}).table;
  CohortFitSpec spec;
  spec.outcome = OutcomeSpec{"low", std::nullopt};
  spec.predictors = predictors;
  spec.modelName = name;
  const CohortFit fitted = fitCohortModel(table, spec);
  const fs::path path = fs::temp_directory_path() / ("calivera_uncertainty_run_" + name + ".json");
  writeModelFile(path.string(), fitted.model);
  return path.string();
}

ValidationRun validateWith(const std::string& modelPath) {
  ValidationRequest request;
  request.dataPath = kData;
  request.outcome = OutcomeSpec{"low", std::nullopt};
  request.modelPath = modelPath;
  return runValidation(request);
}

TEST(UncertaintyRun, ComparedResultsAreEachModelValidatedOnTheComparisonRows) {
  const std::string full = writeFittedModel({"age", "lwt", "race", "smoke", "ht", "ui"}, "full");
  const std::string small = writeFittedModel({"age", "lwt"}, "small");
  const ValidationRun run = validateWith(full);
  UncertaintyRequest request;
  request.compareModelPaths = {full, small};
  const UncertaintyResults results = runUncertainty(run, request);

  ASSERT_TRUE(results.comparison);
  ASSERT_EQ(results.comparedResults.size(), 3u);
  EXPECT_EQ(results.comparisonRows, run.cohort.rows.size());
  // The run's model against itself: the same numbers as the run, and a paired difference of 0.
  for (std::size_t m : {0u, 1u}) {
    const ValidationResult& r = results.comparedResults[m];
    EXPECT_DOUBLE_EQ(r.discrimination.auc, run.result.discrimination.auc);
    EXPECT_NEAR(r.overall.brier, run.result.overall.brier, 1e-15);
    EXPECT_NEAR(r.calibration.slope, run.result.calibration.slope, 1e-9);
    ASSERT_EQ(r.decisionCurve.size(), run.result.decisionCurve.size());
  }
  EXPECT_EQ(results.comparison->pairs[0].auc.difference, 0.0);
  // The smaller model: its own validation, agreeing with validating its file directly.
  const ValidationRun smallRun = validateWith(small);
  EXPECT_DOUBLE_EQ(results.comparedResults[2].discrimination.auc,
                   smallRun.result.discrimination.auc);
  EXPECT_DOUBLE_EQ(results.comparison->aucs[2], smallRun.result.discrimination.auc);
}

TEST(UncertaintyRun, ABorrowedSubjectGivesTheSameResultsAsTheRun) {
  const std::string full = writeFittedModel({"age", "lwt", "race", "smoke", "ht", "ui"}, "full");
  const ValidationRun run = validateWith(full);
  UncertaintyRequest request;
  request.bootstrapReplicates = 30;
  request.seed = 11;
  request.subgroupColumns = {"race"};
  const UncertaintyResults viaRun = runUncertainty(run, request);
  // The workstation's route: its own copies of the inputs, borrowed for the call.
  const ValidationInput input = run.cohort.input;
  const std::vector<std::uint32_t> rows = run.cohort.rows;
  const UncertaintySubject subject{*run.table,   run.request.outcome, &*run.model,
                                   std::nullopt, run.modelName,       rows,
                                   input,        run.request.options, run.result};
  const UncertaintyResults viaSubject = runUncertainty(subject, request);
  ASSERT_TRUE(viaRun.bootstrap && viaSubject.bootstrap);
  EXPECT_EQ(viaRun.bootstrap->auc.ci.lo, viaSubject.bootstrap->auc.ci.lo);
  EXPECT_EQ(viaRun.bootstrap->calibrationSlope.ci.hi, viaSubject.bootstrap->calibrationSlope.ci.hi);
  ASSERT_EQ(viaSubject.subgroups.size(), 1u);
  EXPECT_EQ(viaRun.subgroups[0].levels.size(), viaSubject.subgroups[0].levels.size());
}

}  // namespace
}  // namespace calivera
