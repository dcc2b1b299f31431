// The validation pipeline end to end: the model-file and risk-column routes agree, apparent vs
// new data follows the SHA-256 of the development data, and the real `calivera validate` command
// writes the contract JSON keys, with exit status 2 / 1 and no output file on failure.
#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <random>
#include <sstream>

#include "core/metrics/validation_run.h"
#include "core/model/linear_predictor.h"
#include "core/model/model_io.h"
#include "core/report/validation_summary.h"
#include "core/util/sha256.h"

namespace calivera {
namespace {

namespace fs = std::filesystem;

class ValidationPipeline : public ::testing::Test {
 protected:
  void SetUp() override {
    dir_ =
        fs::temp_directory_path() /
        ("calivera_validate_" + std::to_string(::testing::UnitTest::GetInstance()->random_seed()) +
         "_" + ::testing::UnitTest::GetInstance()->current_test_info()->name());
    fs::remove_all(dir_);
    fs::create_directories(dir_);
    model_.name = "two-marker test model";
    model_.outcome = "event";
    model_.intercept.coefficient = -1.2;
    Term a;
    a.name = "marker_a";
    a.variable = "marker_a";
    a.estimate.coefficient = 0.8;
    Term b = a;
    b.name = b.variable = "marker_b";
    b.estimate.coefficient = -0.5;
    model_.terms = {a, b};
    // A simulated cohort (a property check, not a reference): one row lacks marker_a.
    std::mt19937_64 generator(99);
    std::normal_distribution<double> marker(0.0, 1.0);
    std::uniform_real_distribution<double> unit(0.0, 1.0);
    std::ofstream out(data());
    out << "id,marker_a,marker_b,event,risk\n";
    char line[200];
    for (int i = 0; i < 600; ++i) {
      const double xa = marker(generator), xb = marker(generator);
      const double p = logisticRisk(-1.2 + 0.8 * xa - 0.5 * xb);
      const int y = unit(generator) < 0.8 * p + 0.05 ? 1 : 0;
      if (i == 17) {
        std::snprintf(line, sizeof line, "%d,,%.17g,%d,\n", i, xb, y);
      } else {
        std::snprintf(line, sizeof line, "%d,%.17g,%.17g,%d,%.17g\n", i, xa, xb, y, p);
      }
      out << line;
    }
  }
  void TearDown() override { fs::remove_all(dir_); }
  std::string data() const { return (dir_ / "cohort.csv").string(); }
  std::string path(const std::string& name) const { return (dir_ / name).string(); }
  ValidationRequest request() const {
    ValidationRequest r;
    r.dataPath = data();
    r.outcome.column = "event";
    r.options.thresholds = {0.1, 0.2, 0.3};
    return r;
  }

  fs::path dir_;
  Model model_;
};

TEST_F(ValidationPipeline, ModelFileAndRiskColumnRoutesGiveTheSameResults) {
  writeModelFile(path("model.json"), model_);
  ValidationRequest viaModel = request();
  viaModel.modelPath = path("model.json");
  ValidationRequest viaRisk = request();
  viaRisk.riskColumn = "risk";
  const ValidationRun m = runValidation(viaModel);
  const ValidationRun r = runValidation(viaRisk);
  EXPECT_EQ(m.result.cohort.n, 599u);
  EXPECT_EQ(r.result.cohort.n, 599u);
  EXPECT_EQ(m.cohort.exclusions.rowsExcluded, 1u);
  EXPECT_EQ(r.cohort.exclusions.rowsExcluded, 1u);
  // The risk column holds logisticRisk(LP) to 17 digits; the model route computes the same LP,
  // so ranks are identical and fit-based values agree to rounding of logit(risk) vs LP.
  constexpr double kRounding = 1e-9;
  EXPECT_DOUBLE_EQ(m.result.discrimination.auc, r.result.discrimination.auc);
  EXPECT_DOUBLE_EQ(m.result.discrimination.aucSe, r.result.discrimination.aucSe);
  EXPECT_NEAR(m.result.overall.brier, r.result.overall.brier, 1e-15);
  EXPECT_NEAR(m.result.calibration.intercept, r.result.calibration.intercept, kRounding);
  EXPECT_NEAR(m.result.calibration.slope, r.result.calibration.slope, kRounding);
  EXPECT_NEAR(m.result.calibration.slopeSe, r.result.calibration.slopeSe, kRounding);
  EXPECT_NEAR(m.result.calibration.ici, r.result.calibration.ici, kRounding);
  EXPECT_NEAR(m.result.hosmerLemeshow.statistic, r.result.hosmerLemeshow.statistic, kRounding);
  for (std::size_t k = 0; k < 3; ++k) {
    EXPECT_EQ(m.result.thresholds[k].tp, r.result.thresholds[k].tp);
    EXPECT_EQ(m.result.thresholds[k].fp, r.result.thresholds[k].fp);
  }
  EXPECT_EQ(m.performance, kPerformanceNewData);
  EXPECT_EQ(m.dataSha256, sha256OfFile(data()));
}

TEST_F(ValidationPipeline, SummaryTabulatesAShortThresholdListInFull) {
  ValidationRequest r = request();
  r.riskColumn = "risk";
  r.options.thresholds = {0.05, 0.10, 0.15, 0.20, 0.30};
  const std::string text = validationSummaryText(runValidation(r));
  const std::size_t table = text.find("Threshold  net benefit");
  ASSERT_NE(table, std::string::npos);
  for (const char* t :
       {"\n    0.05 ", "\n    0.10 ", "\n    0.15 ", "\n    0.20 ", "\n    0.30 "}) {
    EXPECT_NE(text.find(t, table), std::string::npos) << t;
  }
}

TEST_F(ValidationPipeline, DevelopmentDataFingerprintMakesThePerformanceApparent) {
  model_.development.dataSha256 = sha256OfFile(data());
  writeModelFile(path("model.json"), model_);
  ValidationRequest r = request();
  r.modelPath = path("model.json");
  const ValidationRun run = runValidation(r);
  EXPECT_EQ(run.performance, kPerformanceApparent);
  EXPECT_EQ(run.result.hosmerLemeshow.df,
            static_cast<int>(run.result.hosmerLemeshow.groups.size()) - 2);
}

int runCommand(const std::string& arguments, const std::string& stderrPath) {
  const std::string command =
      std::string(CALIVERA_BINARY) + " validate " + arguments + " > /dev/null 2> " + stderrPath;
  const int status = std::system(command.c_str());
  return WIFEXITED(status) ? WEXITSTATUS(status) : -1;
}

std::string readText(const std::string& file) {
  std::ifstream in(file);
  std::stringstream s;
  s << in.rdbuf();
  return s.str();
}

TEST_F(ValidationPipeline, CommandWritesTheContractJsonKeys) {
  const std::string json = path("report.json");
  ASSERT_EQ(runCommand("--data " + data() + " --outcome event --risk risk --json " + json +
                           " --csv-dir " + path("tables"),
                       path("err.txt")),
            0)
      << readText(path("err.txt"));
  const nlohmann::json report = nlohmann::json::parse(readText(json));
  const char* keys[][2] = {{"cohort", "n"},
                           {"cohort", "events"},
                           {"cohort", "prevalence"},
                           {"cohort", "excluded"},
                           {"discrimination", "auc"},
                           {"discrimination", "auc_se"},
                           {"discrimination", "auc_ci"},
                           {"overall", "brier"},
                           {"overall", "brier_scaled"},
                           {"calibration", "intercept"},
                           {"calibration", "intercept_se"},
                           {"calibration", "slope"},
                           {"calibration", "slope_se"},
                           {"calibration", "oe_ratio"},
                           {"calibration", "spiegelhalter_z"},
                           {"calibration", "spiegelhalter_p"},
                           {"calibration", "ici"},
                           {"calibration", "e50"},
                           {"calibration", "e90"},
                           {"calibration", "emax"},
                           {"hosmer_lemeshow", "statistic"},
                           {"hosmer_lemeshow", "df"},
                           {"hosmer_lemeshow", "p_value"},
                           {"hosmer_lemeshow", "groups"}};
  for (const auto& key : keys) {
    ASSERT_TRUE(report.contains(key[0]) && report[key[0]].contains(key[1]))
        << key[0] << "." << key[1];
  }
  EXPECT_EQ(report["cohort"]["n"], 599);
  EXPECT_EQ(report["cohort"]["excluded"], 1);
  EXPECT_EQ(report["discrimination"]["auc_ci"].size(), 2u);
  for (const char* k : {"n", "observed", "expected"}) {
    EXPECT_TRUE(report["hosmer_lemeshow"]["groups"][0].contains(k)) << k;
  }
  ASSERT_EQ(report["decision_curve"].size(), 99u);  // default 0.01:0.99:0.01
  for (const char* k : {"threshold", "net_benefit", "net_benefit_treat_all",
                        "standardized_net_benefit", "interventions_avoided_per_100"}) {
    EXPECT_TRUE(report["decision_curve"][0].contains(k)) << k;
  }
  ASSERT_EQ(report["thresholds"].size(), 99u);
  for (const char* k :
       {"threshold", "tp", "fp", "tn", "fn", "sensitivity", "specificity", "ppv", "npv"}) {
    EXPECT_TRUE(report["thresholds"][0].contains(k)) << k;
  }
  EXPECT_EQ(report["thresholds"][6]["threshold"].get<double>(), 0.07);
  EXPECT_EQ(report["cohort"]["performance"], "new data");
  EXPECT_TRUE(fs::exists(path("tables/thresholds.csv")));
  EXPECT_TRUE(fs::exists(path("tables/decision_curve.csv")));
  EXPECT_TRUE(fs::exists(path("tables/hosmer_lemeshow_groups.csv")));
  EXPECT_TRUE(fs::exists(path("tables/calibration_curve.csv")));
  EXPECT_TRUE(fs::exists(path("tables/roc.csv")));
}

TEST_F(ValidationPipeline, CommandFailuresExitWithStatusAndLeaveNoOutput) {
  {
    std::ofstream out(path("bad.csv"));
    out << "event,risk\n0,0.2\n1,0.7\n0,1.5\n";
  }
  const std::string json = path("report.json");
  EXPECT_EQ(runCommand("--data " + path("bad.csv") + " --outcome event --risk risk --json " + json,
                       path("err.txt")),
            2);
  const std::string error = readText(path("err.txt"));
  EXPECT_NE(error.find("error:"), std::string::npos);
  EXPECT_NE(error.find(":4:"), std::string::npos) << error;  // the line of 1.5
  EXPECT_FALSE(fs::exists(json));
  {
    std::ofstream out(path("one_class.csv"));
    out << "event,risk\n0,0.2\n0,0.7\n0,0.5\n";
  }
  EXPECT_EQ(
      runCommand("--data " + path("one_class.csv") + " --outcome event --risk risk --json " + json,
                 path("err.txt")),
      1);
  EXPECT_FALSE(fs::exists(json));
  EXPECT_EQ(runCommand("--data " + data() + " --outcome event", path("err.txt")), 2);
  EXPECT_EQ(runCommand("--data " + data() + " --outcome event --risk risk --thresholds 0:1:0.1",
                       path("err.txt")),
            2);
  EXPECT_EQ(runCommand("--help", path("err.txt")), 0);
}

}  // namespace
}  // namespace calivera
