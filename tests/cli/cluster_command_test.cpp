// `calivera validate --cluster COLUMN` as users call it: the contract's JSON keys, the tables
// --csv-dir writes, the reproducing line, and clear refusals. Patients: the Aids2 cohort of
// tests/reference/data/aids2_sites.csv (Debian r-cran-mass); the numbers themselves are checked
// against R and metafor in tests/reference/aids2_sites_test.cpp.
#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>

#include "tests/reference/reference_csv.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

using testing::referencePath;
using testing::runCalivera;

std::vector<std::string> aids2Words() {
  return {"validate", "--data", referencePath("aids2_sites.csv"), "--outcome", "dead",
          "--risk",   "risk"};
}

TEST(ClusterCommand, JsonCarriesTheContractKeys) {
  const testing::TempDir dir("cluster_json");
  std::vector<std::string> words = aids2Words();
  words.insert(words.end(), {"--cluster", "state", "--json", dir.file("r.json")});
  const testing::CliRun run = runCalivera(words);
  ASSERT_EQ(run.status, 0) << run.err;
  std::ifstream in(dir.file("r.json"));
  const nlohmann::json json = nlohmann::json::parse(in);
  const nlohmann::json& clusters = json.at("clusters");
  for (const nlohmann::json& site : clusters.at("sites")) {
    for (const char* key :
         {"name", "n", "events", "auc", "auc_se", "oe_ratio", "log_oe_se", "calibration_intercept",
          "calibration_intercept_se", "calibration_slope", "calibration_slope_se"}) {
      EXPECT_TRUE(site.contains(key)) << key;
    }
  }
  const std::map<std::string, std::string> scales{{"c_statistic", "logit"},
                                                  {"oe_ratio", "log"},
                                                  {"calibration_intercept", "identity"},
                                                  {"calibration_slope", "identity"}};
  for (const auto& [measure, scale] : scales) {
    const nlohmann::json& p = clusters.at("pooled").at(measure);
    for (const char* key : {"estimate", "ci", "prediction_interval", "tau2", "i2", "k"}) {
      EXPECT_TRUE(p.contains(key)) << measure << " " << key;
    }
    EXPECT_EQ(p.at("scale"), scale);
    EXPECT_EQ(p.at("ci").size(), 2u);
    EXPECT_TRUE(p.at("fixed_effect").contains("estimate"));
    EXPECT_EQ(p.at("fixed_effect").at("ci").size(), 2u);
    // Natural scale: the pooled c-statistic is an AUC, the O/E a ratio near 1.
    const double estimate = p.at("estimate");
    EXPECT_LE(p.at("ci")[0].get<double>(), estimate);
    EXPECT_GE(p.at("ci")[1].get<double>(), estimate);
  }
  EXPECT_GT(clusters.at("pooled").at("c_statistic").at("estimate").get<double>(), 0.5);
  EXPECT_LT(clusters.at("pooled").at("c_statistic").at("estimate").get<double>(), 1.0);
}

TEST(ClusterCommand, TablesSummaryAndReproducingLine) {
  const testing::TempDir dir("cluster_tables");
  std::vector<std::string> words = aids2Words();
  words.insert(words.end(), {"--cluster", "state", "--csv-dir", dir.file("tables")});
  const testing::CliRun withTables = runCalivera(words);
  ASSERT_EQ(withTables.status, 0) << withTables.err;
  for (const char* name : {"sites.csv", "sites_pooled.csv", "sites_net_benefit.csv"}) {
    EXPECT_TRUE(std::filesystem::exists(std::filesystem::path(dir.file("tables")) / name)) << name;
  }
  const std::string pooled =
      testing::readWhole(std::filesystem::path(dir.file("tables")) / "sites_pooled.csv");
  EXPECT_NE(pooled.find("C-statistic (AUC),logit,4,"), std::string::npos) << pooled;

  words = aids2Words();
  words.insert(words.end(), {"--cluster", "state"});
  const testing::CliRun summary = runCalivera(words);
  ASSERT_EQ(summary.status, 0) << summary.err;
  EXPECT_NE(summary.out.find("sites by state"), std::string::npos);
  EXPECT_NE(summary.out.find("95% prediction interval"), std::string::npos);
  EXPECT_NE(summary.out.find("--cluster state"), std::string::npos) << summary.out;
  EXPECT_NE(summary.out.find("do not replace clinical judgment"), std::string::npos);
}

TEST(ClusterCommand, RefusalsNameTheProblem) {
  std::vector<std::string> twice = aids2Words();
  twice.insert(twice.end(), {"--cluster", "state", "--cluster", "dead"});
  const testing::CliRun a = runCalivera(twice);
  EXPECT_NE(a.status, 0);
  EXPECT_NE(a.err.find("--cluster: give one site column"), std::string::npos) << a.err;

  std::vector<std::string> absent = aids2Words();
  absent.insert(absent.end(), {"--cluster", "hospital"});
  const testing::CliRun b = runCalivera(absent);
  EXPECT_NE(b.status, 0);
  EXPECT_NE(b.err.find("hospital"), std::string::npos) << b.err;

  // The outcome as a site column: two "sites", each of one outcome class, so no measure can be
  // pooled; the run still succeeds and says why for every site.
  const testing::TempDir dir("cluster_one_class");
  std::vector<std::string> oneClass = aids2Words();
  oneClass.insert(oneClass.end(), {"--cluster", "dead", "--json", dir.file("r.json")});
  const testing::CliRun c = runCalivera(oneClass);
  ASSERT_EQ(c.status, 0) << c.err;
  std::ifstream in(dir.file("r.json"));
  const nlohmann::json json = nlohmann::json::parse(in);
  const nlohmann::json& auc = json.at("clusters").at("pooled").at("c_statistic");
  EXPECT_TRUE(auc.at("estimate").is_null());
  EXPECT_EQ(auc.at("excluded").size(), 2u);
  EXPECT_NE(auc.at("problem").get<std::string>().find("fewer than two"), std::string::npos);
}

}  // namespace
}  // namespace calivera
