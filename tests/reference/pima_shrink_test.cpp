// The shrunk model's intercept (internal validation's --shrunk-out) against R's glm with the
// shrunk linear predictor as offset, on MASS::Pima.tr (Debian r-cran-mass, n = 200): values in
// tests/reference/data/pima_shrink.json from tests/reference/scripts/pima_shrink.R (R 4.2.2).
// The offset is large and uncentred, where the earlier plain Newton iteration diverged
// (issue 11: "the intercept of the shrunk model could not be re-estimated").
#include <gtest/gtest.h>

#include <fstream>
#include <nlohmann/json.hpp>

#include "core/data/cohort.h"
#include "core/data/csv_reader.h"
#include "core/fit/cohort_fit.h"
#include "core/uncertainty/optimism.h"

namespace calivera {
namespace {

TEST(PimaShrink, InterceptWithTheShrunkOffsetMatchesRGlm) {
  const std::string dir = std::string(CALIVERA_SOURCE_DIR) + "/tests/reference/data/";
  std::ifstream in(dir + "pima_shrink.json");
  const nlohmann::json ref = nlohmann::json::parse(in);
  const Table table = readCsvFile(dir + "pima_tr.csv", CsvOptions{}).table;
  CohortFitSpec spec;
  spec.outcome.column = "diabetic";
  spec.predictors = {"npreg", "glu", "bp", "skin", "bmi", "ped", "age"};
  const CohortFit fit = fitCohortModel(table, spec);
  ASSERT_EQ(fit.exclusions.rowsRead - fit.exclusions.rowsExcluded, ref["n"].get<std::size_t>());
  EXPECT_NEAR(fit.model.intercept.coefficient, ref["intercept_unshrunk"].get<double>(), 1e-7);
  AnalysisRows rows = selectCompleteCases(table, {"diabetic", "npreg", "glu", "bp", "skin", "bmi",
                                                  "ped", "age"});
  const std::vector<double> y = outcomeValues(table, spec.outcome, rows.rows);
  for (const auto& c : ref["cases"]) {
    const double s = c["shrinkage"].get<double>();
    const Model shrunk = shrinkModel(fit.model, s, table, rows.rows, y);
    EXPECT_NEAR(shrunk.intercept.coefficient, c["intercept"].get<double>(), 1e-7) << s;
    EXPECT_NEAR(shrunk.terms[1].estimate.coefficient, s * fit.model.terms[1].estimate.coefficient,
                1e-15);
  }
}

}  // namespace
}  // namespace calivera
