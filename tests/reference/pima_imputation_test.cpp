// `calivera validate --imputation-column` (the real executable) on MASS::Pima.tr2 imputed by mice
// 3.15.0 (m = 5, predictive mean matching, seed 2026), with a model fitted by R's glm on
// MASS::Pima.te (Debian r-cran-mass and r-cran-mice): every pooled estimate, variance component,
// fraction of missing information, df and interval against Rubin's rules computed by hand in R
// and checked there against mice's pool.scalar (tests/reference/scripts/pima_imputation.R,
// tests/reference/data/pima_imputation.json).
#include <gtest/gtest.h>

#include <cmath>
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
  EXPECT_EQ(got["missing_data"]["imputation_column"], ".imp");
  EXPECT_EQ(got["settings"]["imputation_column"], ".imp");
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

// --- Calivera's own imputation (validate --impute) on the same cohort -------------------------
// Reference: mice with m = 100 copies (tests/reference/scripts/pima_mice_reference.R,
// tests/reference/data/pima_mice_reference.json), pooled by the same Rubin's rules.

testing::CliRun imputePima(const std::vector<std::string>& extra) {
  std::vector<std::string> words{"validate",
                                 "--data",
                                 referencePath("pima_tr2.csv"),
                                 "--outcome",
                                 "diabetic",
                                 "--model",
                                 referencePath("pima_imputation_model.json")};
  words.insert(words.end(), extra.begin(), extra.end());
  return testing::runCalivera(words);
}

json imputePimaJson(const std::vector<std::string>& extra, const std::string& name) {
  const testing::TempDir dir(name);
  const std::string out = dir.file("imputed.json");
  std::vector<std::string> words = extra;
  words.insert(words.end(), {"--json", out});
  const testing::CliRun run = imputePima(words);
  EXPECT_EQ(run.status, 0) << run.err;
  return run.status == 0 ? json::parse(testing::readWhole(out)) : json();
}

TEST(PimaImputationReference, ChainedEquationsAgreeWithMiceWithinMonteCarloError) {
  constexpr int kCopies = 100;
  const json got =
      imputePimaJson({"--impute", std::to_string(kCopies), "--seed", "5"}, "pima_chained");
  ASSERT_TRUE(got.is_object());
  const json reference = json::parse(testing::readWhole(referencePath("pima_mice_reference.json")));
  const json& missing = got["missing_data"];
  EXPECT_EQ(missing["method"], "chained_equations");
  EXPECT_EQ(missing["m"], kCopies);
  EXPECT_TRUE(missing["imputation_column"].is_null());
  EXPECT_EQ(missing["patients_per_copy"], 300);
  // MASS::Pima.tr2: bp missing in 13 records, skin in 98, bmi in 3; numbers all.
  const json& columns = missing["chained_equations"]["imputed_columns"];
  ASSERT_EQ(columns.size(), 3u);
  EXPECT_EQ(columns[0],
            json({{"column", "bp"}, {"method", "predictive_mean_matching"}, {"imputed", 13}}));
  EXPECT_EQ(columns[1]["imputed"], 98);
  EXPECT_EQ(columns[2]["imputed"], 3);
  EXPECT_EQ(got["cohort"]["n"], 200);  // the complete-case results keep their keys
  for (const auto& [measure, expected] : reference["pooled"].items()) {
    const json& pooled = got["pooled"][measure];
    ASSERT_TRUE(pooled.is_object()) << measure;
    // Two independent Monte Carlo estimates of one pooled value: their difference has standard
    // error sqrt(B_ours / m_ours + B_mice / m_mice); 4 standard errors.
    const double ours = pooled["estimate_on_scale"].get<double>();
    const double theirs = expected["estimate_on_scale"].get<double>();
    const double error = std::sqrt(pooled["between_variance"].get<double>() / kCopies +
                                   std::pow(expected["monte_carlo_se"].get<double>(), 2));
    EXPECT_LT(std::abs(ours - theirs), 4.0 * error)
        << measure << ": " << ours << " vs mice " << theirs << ", error " << error;
    // The within-imputation variance hardly depends on the imputations; between-imputation
    // variance and the fraction of missing information are themselves estimates from m copies:
    // within a factor of two of mice's (common practice for a Monte Carlo check).
    EXPECT_LT(relativeDifference(pooled["within_variance"].get<double>(),
                                 expected["within_variance"].get<double>()),
              0.02)
        << measure;
    const double ratio =
        pooled["between_variance"].get<double>() / expected["between_variance"].get<double>();
    EXPECT_GT(ratio, 0.5) << measure;
    EXPECT_LT(ratio, 2.0) << measure;
  }
}

TEST(PimaImputationReference, ChainedEquationsGiveTheSameResultsOnOneOrTwoThreads) {
  const json one = imputePimaJson({"--impute", "6", "--seed", "11", "--threads", "1"}, "pima_t1");
  const json two = imputePimaJson({"--impute", "6", "--seed", "11", "--threads", "2"}, "pima_t2");
  ASSERT_TRUE(one.is_object() && two.is_object());
  EXPECT_EQ(one["pooled"], two["pooled"]);
  EXPECT_EQ(one["missing_data"], two["missing_data"]);
  const json other = imputePimaJson({"--impute", "6", "--seed", "12"}, "pima_seed12");
  EXPECT_NE(one["pooled"]["c_statistic"]["per_imputation"],
            other["pooled"]["c_statistic"]["per_imputation"]);
}

TEST(PimaImputationReference, ChainedEquationsSummaryAndReproduceLine) {
  const testing::CliRun run = imputePima({"--impute", "3", "--impute-iterations", "4"});
  ASSERT_EQ(run.status, 0) << run.err;
  EXPECT_NE(run.out.find("Pooled over 3 copies imputed by chained equations (4 iterations, seed "
                         "1; bp: 13 values by predictive mean matching"),
            std::string::npos)
      << run.out;
  EXPECT_NE(run.out.find("complete cases of the cohort as read"), std::string::npos);
  EXPECT_NE(run.out.find("--impute 3 --impute-iterations 4 --seed 1"), std::string::npos);
}

TEST(PimaImputationReference, StackedCopiesGiveTheSameResultsOnOneOrTwoThreads) {
  const testing::TempDir dir("pima_stacked_threads");
  json got[2];
  for (int t = 0; t < 2; ++t) {
    const std::string out = dir.file("t" + std::to_string(t + 1) + ".json");
    const testing::CliRun run = validatePima({"--threads", std::to_string(t + 1), "--json", out});
    ASSERT_EQ(run.status, 0) << run.err;
    got[t] = json::parse(testing::readWhole(out));
  }
  EXPECT_EQ(got[0]["pooled"], got[1]["pooled"]);
  EXPECT_EQ(got[0]["missing_data"], got[1]["missing_data"]);
}

TEST(PimaImputationReference, ImputationSeedApartFromTheBootstrapSeed) {
  const json alone = imputePimaJson({"--impute", "4", "--seed", "7"}, "pima_seed7");
  const json apart = imputePimaJson(
      {"--impute", "4", "--impute-seed", "7", "--seed", "3", "--bootstrap", "20"}, "pima_apart");
  ASSERT_TRUE(alone.is_object() && apart.is_object());
  // The copies depend on the imputation's seed only.
  EXPECT_EQ(alone["pooled"], apart["pooled"]);
  EXPECT_EQ(apart["missing_data"]["chained_equations"]["seed"], 7);
  const testing::CliRun run =
      imputePima({"--impute", "3", "--impute-seed", "7", "--seed", "3", "--bootstrap", "20"});
  ASSERT_EQ(run.status, 0) << run.err;
  EXPECT_NE(run.out.find("--bootstrap 20 --seed 3 --impute 3 --impute-iterations 10 "
                         "--impute-seed 7"),
            std::string::npos)
      << run.out;
}

TEST(PimaImputationReference, ImputeOptionsRefuseWhatCannotWork) {
  const auto refused = [](const std::vector<std::string>& extra, const std::string& words) {
    const testing::CliRun run = imputePima(extra);
    EXPECT_EQ(run.status, 2) << run.out;
    EXPECT_NE(run.err.find(words), std::string::npos) << run.err;
  };
  refused({"--impute", "1"}, "--impute: give 2 to 1000 copies");
  refused({"--impute", "x"}, "--impute");
  refused({"--impute-iterations", "3"}, "--impute-iterations: needs --impute M");
  refused({"--impute-seed", "3"}, "--impute-seed: needs --impute M");
  refused({"--impute", "5", "--impute-seed", "-1"}, "--impute-seed: give a whole number");
  refused({"--impute", "5", "--impute-iterations", "0"}, "give 1 to 1000 iterations");
  refused({"--impute", "5", "--imputation-column", "npreg"}, "not both");
  // A cohort without missing values in the model's columns: nothing to impute.
  const testing::CliRun complete = testing::runCalivera(
      {"validate", "--data", referencePath("pima_tr.csv"), "--outcome", "diabetic", "--model",
       referencePath("pima_imputation_model.json"), "--impute", "5"});
  EXPECT_EQ(complete.status, 2);
  EXPECT_NE(complete.err.find("nothing to impute"), std::string::npos) << complete.err;
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

// The text with every run of white space (line breaks of the layout included) as one space.
std::string oneLine(const std::string& text) {
  std::string out;
  for (const char c : text) {
    const bool space = c == ' ' || c == '\n' || c == '\r' || c == '\t' || c == '\f';
    if (!space) {
      out += c;
    } else if (!out.empty() && out.back() != ' ') {
      out += ' ';
    }
  }
  return out;
}

TEST(PimaImputationReference, ReportSaysHowTheCopiesWereImputed) {
  const testing::TempDir dir("pima_chained_pdf");
  const std::string pdf = dir.file("report.pdf");
  const testing::CliRun run = imputePima({"--impute", "3", "--pdf", pdf});
  ASSERT_EQ(run.status, 0) << run.err;
  const std::string text = oneLine(testing::pdfText(pdf));
  EXPECT_NE(text.find("imputed 3 times by chained equations (10 iterations, seed 1)"),
            std::string::npos)
      << text;
  EXPECT_NE(text.find("'skin' (98 values, predictive mean matching)"), std::string::npos);
  EXPECT_NE(text.find("the outcome itself was never imputed"), std::string::npos);
}
#endif

}  // namespace
}  // namespace calivera
