// The analysed-data fingerprint (core/model/analysed_fingerprint.h): the same values in another
// layout give the same fingerprint, any changed value or row another one. Data: MASS::birthwt
// (Debian r-cran-mass) and copies of it rewritten here; the checks compare fingerprints with
// each other, so no reference value is involved.
#include "core/model/analysed_fingerprint.h"

#include <gtest/gtest.h>

#include <string>

#include "core/data/cohort.h"
#include "core/data/csv_reader.h"
#include "core/fit/cohort_fit.h"
#include "core/model/linear_predictor.h"
#include "tests/unit/birthwt_run.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

std::string fingerprintOf(const Model& model, const std::string& path, char delimiter = 0) {
  CsvOptions csv;
  csv.delimiter = delimiter;
  const Table table = readCsvFile(path, csv).table;
  std::vector<std::string> columns = requiredColumns(model);
  columns.push_back("low");
  const AnalysisRows rows = selectCompleteCases(table, columns);
  const std::vector<double> outcome = outcomeValues(table, OutcomeSpec{"low", {}}, rows.rows);
  return analysedDataFingerprint(model, table, rows.rows, outcome);
}

TEST(AnalysedFingerprint, SameValuesInAnotherLayoutMatchOthersDoNot) {
  testing::TempDir dir("analysed_fingerprint");
  const Table table = readCsvFile(testing::birthwtPath(), CsvOptions{}).table;
  CohortFitSpec spec;
  spec.outcome = OutcomeSpec{"low", std::nullopt};
  spec.predictors = {"age", "lwt", "race"};
  Model model = fitCohortModel(table, spec).model;
  const std::string original = fingerprintOf(model, testing::birthwtPath());
  ASSERT_TRUE(model.development.analysedSha256.has_value());
  EXPECT_EQ(*model.development.analysedSha256, original);  // the fit records it
  EXPECT_EQ(original.size(), 64u);

  // Semicolons, quoted fields: other bytes, the same values.
  std::string text = testing::readWhole(testing::birthwtPath());
  std::string semicolons;
  for (char c : text) semicolons += c == ',' ? ';' : c;
  EXPECT_EQ(fingerprintOf(model, dir.write("semi.csv", semicolons), ';'), original);

  // 'age' renamed and mapped back: the model variable is what is fingerprinted.
  std::string renamed = text;
  renamed.replace(renamed.find("age"), 3, "mother_age");
  Model mapped = model;
  mapped.columnMapping["age"] = "mother_age";
  EXPECT_EQ(fingerprintOf(mapped, dir.write("renamed.csv", renamed)), original);

  // A respelled level read through the level mapping.
  std::string respelled = text;
  for (std::size_t at = respelled.find(",black,"); at != std::string::npos;
       at = respelled.find(",black,", at)) {
    respelled.replace(at, 7, ",Black,");
  }
  const std::string respelledPath = dir.write("respelled.csv", respelled);
  EXPECT_NE(fingerprintOf(model, respelledPath), original);
  Model levels = model;
  levels.levelMapping["race"]["Black"] = "black";
  EXPECT_EQ(fingerprintOf(levels, respelledPath), original);

  // One value changed, or one row fewer: another fingerprint.
  std::string changed = text;
  changed.replace(changed.find("\n0,19,182,"), 10, "\n0,20,182,");
  EXPECT_NE(fingerprintOf(model, dir.write("changed.csv", changed)), original);
  std::string fewer = text;
  fewer.erase(fewer.rfind('\n', fewer.size() - 2) + 1);
  EXPECT_NE(fingerprintOf(model, dir.write("fewer.csv", fewer)), original);
}

}  // namespace
}  // namespace calivera
