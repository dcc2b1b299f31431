// CALIVERA_STAGE_TIMES (core/util/stage_times.h) only adds stage lines to standard error: the
// summary, the JSON report and the fitted model file are the same with it as without it.
// Data: MASS::birthwt from Debian r-cran-mass (tests/reference/data/birthwt.csv).
#include <gtest/gtest.h>

#include <cstdlib>
#include <string>

#include "tests/unit/birthwt_run.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

using testing::CliRun;
using testing::runCalivera;
using testing::TempDir;

// Runs fit and validate on birthwt into `dir`, returning the two runs' standard error.
std::string fitAndValidate(const TempDir& dir, const std::string& tag) {
  const std::string model = dir.file("model_" + tag + ".json");
  const CliRun fit = runCalivera({"fit", "--data", testing::birthwtPath(), "--outcome", "low",
                                  "--predictors", "age,lwt,smoke,ptl", "--out", model});
  EXPECT_EQ(fit.status, 0) << fit.err;
  const CliRun validate =
      runCalivera({"validate", "--data", testing::birthwtPath(), "--outcome", "low", "--model",
                   model, "--json", dir.file("report_" + tag + ".json")});
  EXPECT_EQ(validate.status, 0) << validate.err;
  return fit.err + validate.err;
}

TEST(StageTimes, OnlyAddStageLinesToStandardError) {
  const TempDir dir("stage_times");
  ::unsetenv("CALIVERA_STAGE_TIMES");
  const std::string quiet = fitAndValidate(dir, "quiet");
  ::setenv("CALIVERA_STAGE_TIMES", "1", 1);
  const std::string timed = fitAndValidate(dir, "timed");
  ::unsetenv("CALIVERA_STAGE_TIMES");

  EXPECT_EQ(quiet.find("stage "), std::string::npos) << quiet;
  EXPECT_NE(timed.find("stage cohort parsed"), std::string::npos) << timed;
  EXPECT_NE(timed.find("stage analysed-data fingerprint"), std::string::npos) << timed;
  EXPECT_NE(timed.find("stage fitted"), std::string::npos) << timed;
  EXPECT_EQ(testing::readWhole(dir.file("model_quiet.json")),
            testing::readWhole(dir.file("model_timed.json")));
  // The reports name their model file, which differs by name only.
  std::string quietReport = testing::readWhole(dir.file("report_quiet.json"));
  std::string timedReport = testing::readWhole(dir.file("report_timed.json"));
  for (std::string* report : {&quietReport, &timedReport}) {
    for (const char* name : {"model_quiet.json", "model_timed.json"}) {
      for (std::size_t at = report->find(name); at != std::string::npos; at = report->find(name)) {
        report->replace(at, std::string(name).size(), "model.json");
      }
    }
  }
  EXPECT_EQ(quietReport, timedReport);
}

}  // namespace
}  // namespace calivera
