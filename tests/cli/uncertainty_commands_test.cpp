// The real `calivera update`, `calivera internal` and `calivera validate --bootstrap ...`
// commands on birthwt (r-cran-mass, tests/reference/data/birthwt.csv): the files they write, their
// JSON keys, reproducibility across --threads, and exit status 2 with no output file on bad input.
#include <gtest/gtest.h>

#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>

#include "core/model/model_io.h"
#include "core/present/caution.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

namespace fs = std::filesystem;

const std::string kData = std::string(CALIVERA_SOURCE_DIR) + "/tests/reference/data/birthwt.csv";

class UncertaintyCommands : public ::testing::Test {
 protected:
  void SetUp() override {
    dir_ = fs::temp_directory_path() /
           ("calivera_uncertainty_" +
            std::string(::testing::UnitTest::GetInstance()->current_test_info()->name()));
    fs::remove_all(dir_);
    fs::create_directories(dir_);
    ASSERT_EQ(run("fit --data " + kData + " --outcome low --predictors age,lwt,race,smoke,ht,ui " +
                  "--out " + path("fitted.json")),
              0);
  }
  void TearDown() override { fs::remove_all(dir_); }
  std::string path(const std::string& name) const { return (dir_ / name).string(); }
  int run(const std::string& arguments) const {
    const std::string command = std::string(CALIVERA_BINARY) + " " + arguments + " > " +
                                path("stdout.txt") + " 2> " + path("stderr.txt");
    const int status = std::system(command.c_str());
    return WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  }
  std::string text(const std::string& name) const {
    std::ifstream in(path(name));
    std::ostringstream out;
    out << in.rdbuf();
    return out.str();
  }
  nlohmann::json json(const std::string& name) const {
    std::ifstream in(path(name));
    return nlohmann::json::parse(in);
  }
  fs::path dir_;
};

TEST_F(UncertaintyCommands, UpdateWritesAPlainModelWithProvenanceAndTheClosedTest) {
  ASSERT_EQ(
      run("update --data " + kData + " --outcome low --model " + path("fitted.json") +
          " --method recalibrate --out " + path("recal.json") + " --json " + path("update.json")),
      0);
  const Model updated = readModelFile(path("recal.json"));
  ASSERT_TRUE(updated.provenance);
  EXPECT_NE(updated.provenance->find("recalibration"), std::string::npos);
  const auto report = json("update.json");
  // The model was fitted on these data: recalibration changes nothing (a = 0, b = 1).
  EXPECT_NEAR(report["recalibration_slope"].get<double>(), 1.0, 1e-8);
  EXPECT_EQ(report["closed_test"]["suggested"], "none");
  EXPECT_EQ(report["closed_test"]["steps"].size(), 1u);
  // The printed closed test is the workstation's table (core/report/model_tool_tables.h), with
  // p at three decimals, and the output ends with the caution.
  const std::string out = text("stdout.txt");
  EXPECT_NE(out.find("Test               LR statistic  df      p  Decision"), std::string::npos)
      << out;
  EXPECT_NE(out.find("original vs refit         0.000"), std::string::npos) << out;
  EXPECT_EQ(out.substr(out.size() - std::string(kCautionText).size() - 1),
            std::string(kCautionText) + "\n");
}

TEST_F(UncertaintyCommands, UpdateRejectsAnUnknownMethodWithoutWritingAFile) {
  EXPECT_EQ(run("update --data " + kData + " --outcome low --model " + path("fitted.json") +
                " --method shrink --out " + path("never.json")),
            2);
  EXPECT_FALSE(fs::exists(path("never.json")));
}

TEST_F(UncertaintyCommands, InternalIsReproducibleAcrossThreadsAndWritesAShrunkModel) {
  const std::string base = "internal --data " + kData + " --outcome low --model " +
                           path("fitted.json") + " --bootstrap 40 --seed 5 --no-ici";
  ASSERT_EQ(run(base + " --threads 1 --json " + path("one.json")), 0);
  ASSERT_EQ(run(base + " --threads 2 --json " + path("two.json") + " --shrunk-out " +
                path("shrunk.json")),
            0);
  const auto one = json("one.json");
  const auto two = json("two.json");
  EXPECT_EQ(one["measures"], two["measures"]);
  const double shrinkage = two["shrinkage_factor"].get<double>();
  EXPECT_LT(shrinkage, 1.0);
  const Model fitted = readModelFile(path("fitted.json"));
  const Model shrunk = readModelFile(path("shrunk.json"));
  EXPECT_NEAR(shrunk.terms[0].estimate.coefficient,
              shrinkage * fitted.terms[0].estimate.coefficient, 1e-8);
  // Printed: the optimism table in our words, rounded to four decimals, then the caution.
  const std::string out = text("stdout.txt");
  EXPECT_NE(out.find("On new patients"), std::string::npos) << out;
  const double corrected = two["measures"][0]["corrected"].get<double>();
  char expected[32];
  std::snprintf(expected, sizeof expected, "%.4f", corrected);
  EXPECT_NE(out.find(expected), std::string::npos) << expected << "\n" << out;
  EXPECT_EQ(out.substr(out.size() - std::string(kCautionText).size() - 1),
            std::string(kCautionText) + "\n");
}

TEST_F(UncertaintyCommands, ValidateAddsSampleSizeBootstrapComparisonAndSubgroups) {
  ASSERT_EQ(run("update --data " + kData + " --outcome low --model " + path("fitted.json") +
                " --method intercept --out " + path("other.json")),
            0);
  ASSERT_EQ(
      run("fit --data " + kData + " --outcome low --predictors lwt --out " + path("small.json")),
      0);
  const std::string base = "validate --data " + kData + " --outcome low --model " +
                           path("fitted.json") + " --compare " + path("small.json") +
                           " --subgroup smoke --bootstrap 30 --seed 9";
  ASSERT_EQ(run(base + " --threads 1 --json " + path("v1.json")), 0);
  ASSERT_EQ(run(base + " --threads 2 --json " + path("v2.json")), 0);
  const auto v1 = json("v1.json");
  const auto v2 = json("v2.json");
  for (const char* key : {"sample_size", "bootstrap", "comparison", "subgroups"}) {
    ASSERT_TRUE(v1.contains(key)) << key;
  }
  EXPECT_EQ(v1["bootstrap"]["auc"], v2["bootstrap"]["auc"]);
  EXPECT_EQ(v1["bootstrap"]["net_benefit_band"], v2["bootstrap"]["net_benefit_band"]);
  EXPECT_FALSE(v1["sample_size"]["adequate"].get<bool>());  // 59 events
  EXPECT_EQ(v1["subgroups"].size(), 2u);
  EXPECT_EQ(v1["comparison"]["pairs"].size(), 1u);
  EXPECT_TRUE(v1["comparison"]["pairs"][0]["p_value"].is_number());
}

#ifdef CALIVERA_HAVE_PDF
using testing::pdfText;

TEST_F(UncertaintyCommands, ValidatePdfAndCsvCarryTheUncertaintySections) {
  ASSERT_EQ(
      run("fit --data " + kData + " --outcome low --predictors lwt --out " + path("small.json")),
      0);
  ASSERT_EQ(
      run("validate --data " + kData + " --outcome low --model " + path("fitted.json") +
          " --compare " + path("small.json") + " --subgroup smoke --bootstrap 20 --seed 2" +
          " --json " + path("v.json") + " --pdf " + path("v.pdf") + " --csv-dir " + path("tables")),
      0);
  const std::string text = pdfText(path("v.pdf"));
  for (const char* part :
       {"Is the cohort large enough? (sample size)", "Sample size: rules of thumb",
        "precision-based minimum", "Bootstrap 95% CI", "Comparison with other models",
        "Paired DeLong test", "Subgroups by 'smoke'", "too few patients", "small.json"}) {
    EXPECT_NE(text.find(part), std::string::npos) << part;
  }
  EXPECT_EQ(text.find(dir_.string()), std::string::npos);  // file names, never folders
  // Each subgroup row starts with the level, its n and its events, as the JSON has them.
  const auto v = json("v.json");
  ASSERT_EQ(v["subgroups"].size(), 2u);
  for (const auto& level : v["subgroups"]) {
    const std::vector<std::string> expected{level["level"].get<std::string>(),
                                            std::to_string(level["n"].get<int>()),
                                            std::to_string(level["events"].get<int>())};
    bool found = false;
    std::istringstream lines(text.substr(text.find("Subgroups by 'smoke'")));
    for (std::string line; std::getline(lines, line) && !found;) {
      std::istringstream words(line);
      std::vector<std::string> tokens;
      for (std::string word; tokens.size() < 3 && words >> word;) tokens.push_back(word);
      found = tokens == expected;
    }
    EXPECT_TRUE(found) << expected[0];
  }
  for (const char* table :
       {"sample_size.csv", "bootstrap_intervals.csv", "net_benefit_band.csv",
        "calibration_band.csv", "compared_models.csv", "model_comparison_auc.csv",
        "model_comparison_net_benefit.csv", "subgroups.csv", "thresholds.csv"}) {
    EXPECT_TRUE(fs::exists(dir_ / "tables" / table)) << table;
  }
}

TEST_F(UncertaintyCommands, AnIdentifierLikeSubgroupColumnIsRefusedWithoutOutput) {
  // birthwt's bwt (birth weight in grams) has over a hundred distinct values.
  EXPECT_EQ(run("validate --data " + kData + " --outcome low --model " + path("fitted.json") +
                " --subgroup bwt --json " + path("never.json")),
            2);
  EXPECT_FALSE(fs::exists(path("never.json")));
  std::ifstream err(path("stderr.txt"));
  const std::string message((std::istreambuf_iterator<char>(err)), {});
  EXPECT_NE(message.find("'bwt'"), std::string::npos) << message;
  EXPECT_NE(message.find("distinct values"), std::string::npos) << message;
}

TEST_F(UncertaintyCommands, ReasonableRangeIsStatedInTheReportAndCheckedOnInput) {
  const std::string base = "validate --data " + kData + " --outcome low --model " +
                           path("fitted.json") + " --pdf " + path("r.pdf");
  ASSERT_EQ(run(base + " --reasonable-range 0.10:0.40"), 0);
  const std::string text = pdfText(path("r.pdf"));
  EXPECT_NE(text.find("0.10 to 0.40"), std::string::npos);
  EXPECT_EQ(text.find("no reasonable threshold range was set"), std::string::npos);
  for (const char* bad : {"0.40:0.10", "0.1", "0:0.5", "a:b"}) {
    EXPECT_EQ(run(base.substr(0, base.find(" --pdf")) + " --pdf " + path("bad.pdf") +
                  " --reasonable-range " + bad),
              2)
        << bad;
    EXPECT_FALSE(fs::exists(path("bad.pdf"))) << bad;
  }
  // Without --pdf the option has nothing to act on.
  EXPECT_EQ(run("validate --data " + kData + " --outcome low --model " + path("fitted.json") +
                " --reasonable-range 0.1:0.3"),
            2);
}
#endif

}  // namespace
}  // namespace calivera
