// Unknown category levels (issue 11): a level the model does not know is an error naming the
// file, the column, the unknown levels with their counts and the model's levels, never scored as
// the reference; no output file appears. Data: MASS::birthwt (Debian r-cran-mass) with one level
// respelled, as a cohort exported with another capitalisation would be.
#include "core/model/category_levels.h"

#include <gtest/gtest.h>

#include <filesystem>
#include <nlohmann/json.hpp>
#include <string>

#include "core/model/model_io.h"
#include "tests/unit/birthwt_run.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

using testing::readWhole;
using testing::runCalivera;
using testing::TempDir;

// birthwt with every 'black' written 'Black' (case differs, as from another export).
std::string respelled(const TempDir& dir) {
  std::string text = readWhole(testing::birthwtPath());
  for (std::size_t at = text.find(",black,"); at != std::string::npos;
       at = text.find(",black,", at)) {
    text.replace(at, 7, ",Black,");
  }
  return dir.write("respelled.csv", text);
}

TEST(CategoryLevels, UnknownLevelIsAnErrorNotTheReference) {
  TempDir dir("category_levels");
  const std::string model = dir.file("m.json");
  const testing::CliRun fit =
      runCalivera({"fit", "--data", testing::birthwtPath(), "--outcome", "low", "--predictors",
                   "age,lwt,race,smoke", "--reference", "race=white", "--out", model});
  ASSERT_EQ(fit.status, 0) << fit.err;
  // calivera fit records the reference level, so the model knows all of race's levels.
  EXPECT_EQ(readModelFile(model).referenceLevels.at("race"), std::vector<std::string>{"white"});

  const std::string data = respelled(dir);
  const testing::CliRun run = runCalivera({"validate", "--data", data, "--outcome", "low",
                                           "--model", model, "--json", dir.file("out.json")});
  EXPECT_EQ(run.status, 2);
  EXPECT_NE(run.err.find("respelled.csv"), std::string::npos) << run.err;
  EXPECT_NE(run.err.find("column 'race'"), std::string::npos) << run.err;
  EXPECT_NE(run.err.find("'Black' (26 rows)"), std::string::npos) << run.err;  // 26 in birthwt
  EXPECT_NE(run.err.find("'white' (reference)"), std::string::npos) << run.err;
  EXPECT_FALSE(std::filesystem::exists(dir.file("out.json")));
}

// Mapping the respelled level back (--map-level) gives, number for number, the validation of the
// original file: the mapping is read exactly where the model is evaluated. A mapping onto a level
// the model does not know, or of a numeric column, is refused naming it; the study file keeps it.
TEST(CategoryLevels, MappedLevelsGiveTheOriginalNumbers) {
  TempDir dir("level_mapping");
  const std::string model = dir.file("m.json");
  ASSERT_EQ(
      runCalivera({"fit", "--data", testing::birthwtPath(), "--outcome", "low", "--predictors",
                   "age,lwt,race,smoke", "--reference", "race=white", "--out", model})
          .status,
      0);
  const std::string data = respelled(dir);
  const testing::CliRun original =
      runCalivera({"validate", "--data", testing::birthwtPath(), "--outcome", "low", "--model",
                   model, "--json", dir.file("original.json")});
  ASSERT_EQ(original.status, 0) << original.err;
  const testing::CliRun mapped =
      runCalivera({"validate", "--data", data, "--outcome", "low", "--model", model, "--map-level",
                   "race:Black=black", "--json", dir.file("mapped.json")});
  ASSERT_EQ(mapped.status, 0) << mapped.err;
  const auto a = nlohmann::json::parse(readWhole(dir.file("original.json")));
  const auto b = nlohmann::json::parse(readWhole(dir.file("mapped.json")));
  EXPECT_EQ(a["discrimination"], b["discrimination"]);
  EXPECT_EQ(a["calibration"], b["calibration"]);
  // (The original file is the model's development data, so its Hosmer-Lemeshow has g - 2 df; the
  // respelled copy is new data by its fingerprint. The statistic and groups are the same.)
  EXPECT_EQ(a["hosmer_lemeshow"]["statistic"], b["hosmer_lemeshow"]["statistic"]);
  EXPECT_EQ(a["hosmer_lemeshow"]["groups"], b["hosmer_lemeshow"]["groups"]);
  EXPECT_EQ(b["settings"]["level_mapping"]["race"]["Black"], "black");

  const std::pair<std::vector<std::string>, std::string> refused[] = {
      {{"--map-level", "race:Black=purple"}, "maps 'Black' to 'purple', which is not a level"},
      {{"--map-level", "age:30=31"}, "no categorical variable"},
      {{"--map-level", "race=black"}, "is not VARIABLE:LEVEL=MODEL_LEVEL"},
      {{"--map-level", "race:Black=black", "--map-level", "race:Black=other"}, "mapped twice"},
  };
  for (const auto& [extra, message] : refused) {
    std::vector<std::string> words = {"validate", "--data", data,     "--outcome",           "low",
                                      "--model",  model,    "--json", dir.file("never.json")};
    words.insert(words.end(), extra.begin(), extra.end());
    const testing::CliRun run = runCalivera(words);
    EXPECT_EQ(run.status, 2) << message;
    EXPECT_NE(run.err.find(message), std::string::npos) << run.err;
    EXPECT_FALSE(std::filesystem::exists(dir.file("never.json")));
  }
}

TEST(CategoryLevels, WithoutARecordedReferenceOneUnmatchedLevelIsNamedTwoAreAnError) {
  Table table;
  table.sourceName = "cohort.csv";
  table.rowCount = 4;
  Column urgency;
  urgency.name = "urgency";
  urgency.kind = ColumnKind::Text;
  urgency.levels = {"Emergency", "elective", "emergency"};
  urgency.codes = {0, 1, 2, 1};
  table.columns = {urgency};
  Model model;
  Term term;
  term.name = "urgency=emergency";
  term.variable = "urgency";
  term.kind = TransformKind::Indicator;
  term.level = "emergency";
  model.terms = {term};
  // 'Emergency' and 'elective' both match no term and no reference is recorded: refused.
  try {
    checkCategoryLevels(model, table, {0, 1, 2, 3});
    ADD_FAILURE() << "expected InputError";
  } catch (const InputError& error) {
    const std::string text = error.what();
    EXPECT_NE(text.find("'Emergency' (1 row), 'elective' (2 rows)"), std::string::npos) << text;
  }
  // Only 'elective' unmatched: taken as the reference, and said so.
  const std::vector<std::string> warnings = checkCategoryLevels(model, table, {1, 2, 3});
  ASSERT_EQ(warnings.size(), 1u);
  EXPECT_NE(warnings[0].find("'elective' (2 rows)"), std::string::npos) << warnings[0];
  EXPECT_NE(warnings[0].find("taken as its reference level"), std::string::npos);
}

TEST(CategoryLevels, EchoedTextIsCutAndControlCharactersShown) {
  EXPECT_EQ(shownText(std::string("a\0b", 3)), "a\\0b");
  EXPECT_EQ(shownText("tab\there"), "tab\\x09here");
  EXPECT_EQ(shownText(std::string(100, 'x'), 10), std::string(10, 'x') + "...");
}

}  // namespace
}  // namespace calivera
