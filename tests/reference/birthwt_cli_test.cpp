// `calivera fit` (the real executable) on birthwt against R 4.2.2's glm
// (tests/reference/scripts/birthwt_glm.R; data MASS::birthwt from Debian r-cran-mass, GPL-2 |
// GPL-3), reading the coefficients back from the model file it writes.
#include <gtest/gtest.h>

#include <filesystem>

#include "core/model/model_io.h"
#include "tests/reference/reference_csv.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

using testing::referencePath;
using testing::relativeDifference;

TEST(BirthwtCliReference, FitCommandMatchesRGlm) {
  const testing::TempDir dir("birthwt_cli");
  const std::string out = dir.file("birthwt_model.json");
  const testing::CliRun run = testing::runCalivera(
      {"fit", "--data", referencePath("birthwt.csv"), "--outcome", "low", "--predictors",
       "age,lwt,race,ftv", "--reference", "race=white", "--out", out});
  ASSERT_EQ(run.status, 0) << run.err;
  EXPECT_NE(run.out.find("race=black"), std::string::npos);
  EXPECT_NE(run.out.find("events 59 of 189"), std::string::npos) << run.out;
  const Model model = readModelFile(out);
  const auto reference = testing::readReference(referencePath("birthwt_glm.csv"));
  const auto check = [&](const Estimate& estimate, const std::string& term) {
    const auto& r = reference.at({"main", term});
    EXPECT_LT(relativeDifference(estimate.coefficient, r.value), 1e-7) << term;
    ASSERT_TRUE(estimate.se.has_value());
    EXPECT_LT(relativeDifference(*estimate.se, r.se), 1e-6) << term;
  };
  check(model.intercept, "(Intercept)");
  const char* rNames[] = {"age", "lwt", "raceblack", "raceother", "ftv"};
  const char* ourNames[] = {"age", "lwt", "race=black", "race=other", "ftv"};
  ASSERT_EQ(model.terms.size(), 5u);
  for (int j = 0; j < 5; ++j) {
    EXPECT_EQ(model.terms[static_cast<std::size_t>(j)].name, ourNames[j]);
    check(model.terms[static_cast<std::size_t>(j)].estimate, rNames[j]);
  }
  EXPECT_EQ(model.development.n, 189);
  EXPECT_EQ(model.development.events, 59);
  EXPECT_EQ(model.development.dataSha256->size(), 64u);
}

}  // namespace
}  // namespace calivera
