// `calivera validate --imputation-column` (the real executable) on MASS::Pima.tr2 imputed by mice
// 3.15.0 (m = 5, predictive mean matching, seed 2026), with a model fitted by R's glm on
// MASS::Pima.te (Debian r-cran-mass and r-cran-mice): every pooled estimate, variance component,
// fraction of missing information, df and interval against Rubin's rules computed by hand in R
// and checked there against mice's pool.scalar (tests/reference/scripts/pima_imputation.R,
// tests/reference/data/pima_imputation.json).
#include <gtest/gtest.h>

#include <filesystem>
#include <nlohmann/json.hpp>

#include "tests/reference/reference_csv.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

using nlohmann::json;
using testing::referencePath;
using testing::relativeDifference;

// validate on the stacked Pima.tr2 copies with the Pima.te model, plus `extra` options.
testing::CliRun validatePima(const std::vector<std::string>& extra) {
  std::vector<std::string> words{
      "validate", "--data",  referencePath("pima_tr2_imputed.csv"),       "--outcome",
      "diabetic", "--model", referencePath("pima_imputation_model.json"), "--imputation-column",
      ".imp"};
  words.insert(words.end(), extra.begin(), extra.end());
  return testing::runCalivera(words);
}

TEST(PimaImputationReference, PooledMeasuresMatchRubinsRulesInR) {
  const testing::TempDir dir("pima_imputation");
  const std::string out = dir.file("pooled.json");
  const testing::CliRun run = validatePima({"--json", out});
  ASSERT_EQ(run.status, 0) << run.err;
  const json got = json::parse(testing::readWhole(out));
  const json reference = json::parse(testing::readWhole(referencePath("pima_imputation.json")));
  EXPECT_EQ(got["missing_data"]["method"], "imputed_elsewhere");
  EXPECT_EQ(got["missing_data"]["m"], 5);
  EXPECT_EQ(got["missing_data"]["patients_per_copy"], 300);
  // The complete-case results keep their keys: Pima.tr2's 200 complete records.
  EXPECT_EQ(got["cohort"]["n"], reference["complete_cases"]);
  for (const auto& [measure, expected] : reference["pooled"].items()) {
    const json& pooled = got["pooled"][measure];
    ASSERT_TRUE(pooled.is_object()) << measure;
    EXPECT_EQ(pooled["scale"], expected["scale"]) << measure;
    EXPECT_TRUE(pooled["problem"].is_null()) << measure;
    for (const char* key :
         {"estimate", "estimate_on_scale", "within_variance", "between_variance", "total_variance",
          "fraction_missing_information", "df", "complete_data_df"}) {
      EXPECT_LT(relativeDifference(pooled[key].get<double>(), expected[key].get<double>()), 1e-8)
          << measure << "." << key << ": " << pooled[key] << " vs " << expected[key];
    }
    for (int end = 0; end < 2; ++end) {
      EXPECT_LT(
          relativeDifference(pooled["ci"][end].get<double>(), expected["ci"][end].get<double>()),
          1e-8)
          << measure << ".ci";
    }
    for (std::size_t i = 0; i < 5; ++i) {
      EXPECT_LT(relativeDifference(pooled["per_imputation"][i].get<double>(),
                                   expected["per_imputation"][i].get<double>()),
                1e-8)
          << measure << " copy " << i;
    }
  }
}

TEST(PimaImputationReference, SummaryNamesThePatternsAndThePooledMeasures) {
  const testing::CliRun run = validatePima({});
  ASSERT_EQ(run.status, 0) << run.err;
  // MASS::Pima.tr2: 98 records lack skin (84 of them skin alone).
  EXPECT_NE(run.out.find("  skin: 84 rows, 29 / 84"), std::string::npos) << run.out;
  EXPECT_NE(run.out.find("Pooled over 5 imputed copies (column '.imp', 300 patients each"),
            std::string::npos)
      << run.out;
  EXPECT_NE(run.out.find("Hosmer-Lemeshow per copy (not pooled)"), std::string::npos);
  EXPECT_NE(run.out.find("--imputation-column .imp"), std::string::npos);  // reproduce line
}

TEST(PimaImputationReference, CsvTablesCarryThePooledMeasuresAndPatterns) {
  const testing::TempDir dir("pima_imputation_csv");
  const testing::CliRun run = validatePima({"--csv-dir", dir.file("tables")});
  ASSERT_EQ(run.status, 0) << run.err;
  const auto pooled = testing::readColumns(dir.file("tables/pooled_imputations.csv"));
  const json reference = json::parse(testing::readWhole(referencePath("pima_imputation.json")));
  ASSERT_EQ(pooled.at("measure").size(), 5u);
  EXPECT_EQ(pooled.at("measure")[0], "c_statistic");
  EXPECT_LT(relativeDifference(std::stod(pooled.at("estimate")[0]),
                               reference["pooled"]["c_statistic"]["estimate"].get<double>()),
            1e-8);  // written with 10 significant digits
  const auto patterns = testing::readColumns(dir.file("tables/missing_patterns.csv"));
  EXPECT_EQ(patterns.at("missing_columns")[1], "skin");
  EXPECT_EQ(patterns.at("rows")[1], "84");
  EXPECT_TRUE(std::filesystem::exists(dir.file("tables/imputed_decision_curve.csv")));
}

#ifdef CALIVERA_HAVE_PDF  // a build without the UI has no PDF writer
TEST(PimaImputationReference, ReportShowsPatternsMergedUnderSuppressionAndThePooledTable) {
  const testing::TempDir dir("pima_imputation_pdf");
  const std::string pdf = dir.file("report.pdf");
  const testing::CliRun run = validatePima({"--pdf", pdf, "--suppress-below", "11"});
  ASSERT_EQ(run.status, 0) << run.err;
  const std::string text = testing::pdfText(pdf);
  EXPECT_NE(text.find("Columns missing together"), std::string::npos);
  // Pima.tr2's small patterns (skin and bmi: 2, bmi: 1, bp: 1) make 4 < 11 rows, so the
  // smallest other incomplete pattern (bp and skin: 12) joins them: 16 rows, 4 patterns.
  EXPECT_NE(text.find("4 other patterns together"), std::string::npos) << text;
  const std::size_t table = text.find("Columns missing together");
  EXPECT_EQ(text.find("bp, skin", table), std::string::npos);
  EXPECT_NE(text.find("Complete cases and imputed copies pooled"), std::string::npos);
  EXPECT_NE(text.find("pooled by Rubin's rules"), std::string::npos);
}
#endif

}  // namespace
}  // namespace calivera
