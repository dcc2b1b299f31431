// The shipped demo files (sample_data/, synthetic) stay readable by the current code: the
// published model parses and evaluates on the local cohort. No number here is a check value.
#include <gtest/gtest.h>

#include <cmath>

#include "core/data/cohort.h"
#include "core/data/csv_reader.h"
#include "core/model/linear_predictor.h"
#include "core/model/model_io.h"

namespace calivera {
namespace {

TEST(SampleData, PublishedModelEvaluatesOnTheLocalCohort) {
  const std::string dir = std::string(CALIVERA_SOURCE_DIR) + "/sample_data/";
  const Model model = readModelFile(dir + "published_model.json");
  EXPECT_EQ(model.terms.size(), 12u);
  const CsvReadResult read = readCsvFile(dir + "local_cohort.csv", {});
  const AnalysisRows rows = selectCompleteCases(read.table, requiredColumns(model));
  EXPECT_GT(rows.exclusions.rowsExcluded, 0u);  // the demo has missing values on purpose
  const std::vector<double> lp = linearPredictor(model, read.table, rows.rows);
  ASSERT_EQ(lp.size(), rows.rows.size());
  for (const double value : lp) ASSERT_TRUE(std::isfinite(value));
}

}  // namespace
}  // namespace calivera
