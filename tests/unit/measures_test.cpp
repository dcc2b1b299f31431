// The catalog of measures (core/present/measures.h): one entry per key, every output lists from
// it, and its formatting follows the one policy (core/present/number_text.h). The values are a
// real run on MASS::birthwt (Debian r-cran-mass) carried into text; no reference value is involved.
#include "core/present/measures.h"

#include <gtest/gtest.h>

#include <cmath>
#include <set>
#include <sstream>
#include <string>

#include "core/report/validation_summary.h"
#include "core/report/validation_tables.h"
#include "core/uncertainty/bootstrap_measures.h"
#include "tests/unit/birthwt_run.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

TEST(MeasureCatalog, KeysAreUniqueAndBootstrappedMeasuresComeFromIt) {
  std::set<std::string> keys;
  for (const Measure& m : measureCatalog()) {
    EXPECT_TRUE(keys.insert(m.key).second) << m.key;
    EXPECT_NE(m.estimate, nullptr) << m.key;
    EXPECT_FALSE(std::string(m.label).empty()) << m.key;
  }
  for (const BootstrappedMeasure& b : bootstrappedMeasures()) {
    const Measure& m = measureByKey(b.key);
    EXPECT_EQ(std::string(b.label), m.label);
    EXPECT_EQ(b.decimals, m.decimals);
    EXPECT_EQ(b.interval, m.bootstrap);
  }
}

TEST(MeasureCatalog, FormattingFollowsThePolicy) {
  ValidationResult r;
  r.discrimination.auc = std::nan("");
  r.discrimination.aucCi = {std::nan(""), std::nan("")};
  r.calibration.spiegelhalterP = 0.00002;
  r.calibration.slope = 0.80012;
  r.calibration.slopeCi = {0.7, 0.9};
  r.hosmerLemeshow.df = 8;
  EXPECT_EQ(measureText(measureByKey("auc"), r), "not defined");
  EXPECT_EQ(measureWithCiText(measureByKey("auc"), r), "not defined");  // no made-up interval
  EXPECT_EQ(measureText(measureByKey("spiegelhalter_p"), r), "< 0.001");
  EXPECT_EQ(measureText(measureByKey("hosmer_lemeshow_df"), r), "8");
  EXPECT_EQ(measureWithCiText(measureByKey("calibration_slope"), r),
            "0.800 (95% CI 0.700 to 0.900)");
}

// summary.csv has one row per catalog entry, in its order, after the four cohort rows; the text
// summary prints each catalog label it shows with the catalog's text for the value.
TEST(MeasureCatalog, SummaryCsvAndTextListFromTheCatalog) {
  testing::TempDir dir("measures");
  testing::writeBirthwtModel(dir.file("m.json"), {"age", "lwt", "smoke", "ht"}, "four terms");
  const ValidationRun run = testing::birthwtRun(dir.file("m.json"));
  std::string summaryCsv;
  for (const auto& [name, text] : validationTables(run)) {
    if (name == "summary.csv") summaryCsv = text;
  }
  std::istringstream lines(summaryCsv);
  std::string line;
  for (int skip = 0; skip < 5; ++skip) std::getline(lines, line);  // header and cohort rows
  for (const Measure& m : measureCatalog()) {
    ASSERT_TRUE(std::getline(lines, line)) << m.key;
    EXPECT_EQ(line.substr(0, line.find(',')), m.key);
  }
  EXPECT_FALSE(std::getline(lines, line));

  const std::string text = validationSummaryText(run);
  for (const char* key : {"auc", "calibration_intercept", "calibration_slope", "oe_ratio"}) {
    const Measure& m = measureByKey(key);
    EXPECT_NE(text.find(std::string(m.label) + " "), std::string::npos) << key;
    EXPECT_NE(text.find(measureWithCiText(m, run.result)), std::string::npos) << key;
  }
  EXPECT_NE(text.find(measureText(measureByKey("brier"), run.result)), std::string::npos);
}

}  // namespace
}  // namespace calivera
