// `calivera internal` refuses a model that was not developed on the cohort (issue 12): optimism
// correction of a published model would print "corrected" figures that mean nothing. Exit 2, the
// reason named, no output file; --development-data states the cohort is its development data.
// Data: MASS::birthwt (Debian r-cran-mass).
#include <gtest/gtest.h>

#include <filesystem>

#include "core/model/model_io.h"
#include "tests/unit/birthwt_run.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

TEST(InternalRefusal, ModelFromElsewhereIsRefusedUnlessStated) {
  testing::TempDir dir("internal_refusal");
  const std::string model = dir.file("published.json");
  // Fitted by core, then stripped of its development record, as a published model's file would
  // be (a model fitted here records the analysed-data fingerprint and would be accepted).
  testing::writeBirthwtModel(model, {"age", "lwt", "smoke"}, "published elsewhere");
  {
    Model published = readModelFile(model);
    EXPECT_TRUE(published.development.analysedSha256.has_value());
    published.development = DevelopmentRecord{};
    writeModelFile(model, published);
  }
  const std::vector<std::string> base{
      "internal",          "--data", testing::birthwtPath(), "--outcome", "low",
      "--model",           model,    "--bootstrap",          "20",        "--json",
      dir.file("out.json")};
  const testing::CliRun refused = testing::runCalivera(base);
  EXPECT_EQ(refused.status, 2);
  EXPECT_NE(refused.err.find("is for a model fitted on this cohort"), std::string::npos)
      << refused.err;
  EXPECT_NE(refused.err.find("calivera validate"), std::string::npos);
  EXPECT_FALSE(std::filesystem::exists(dir.file("out.json")));

  std::vector<std::string> stated = base;
  stated.push_back("--development-data");
  const testing::CliRun run = testing::runCalivera(stated);
  EXPECT_EQ(run.status, 0) << run.err;
  EXPECT_TRUE(std::filesystem::exists(dir.file("out.json")));
}

}  // namespace
}  // namespace calivera
