// Fitting a restricted cubic spline (core/fit/cohort_fit.h, spline_knots.h) against R's glm with
// a natural cubic spline on MASS::birthwt (r-cran-mass): the two bases span the same functions,
// so knots, deviance and fitted risks must agree (tests/reference/scripts/birthwt_spline.R wrote
// tests/reference/data/birthwt_spline.csv; R 4.2.2).
#include <gtest/gtest.h>

#include <cmath>

#include "core/data/csv_reader.h"
#include "core/fit/cohort_fit.h"
#include "core/fit/spline_knots.h"
#include "core/model/linear_predictor.h"
#include "core/util/errors.h"
#include "tests/reference/reference_csv.h"

namespace calivera {
namespace {

const std::string kDir = std::string(CALIVERA_SOURCE_DIR) + "/tests/reference/data/";
constexpr double kDevianceTolerance = 1e-7;  // both fits converged to 1e-10 or better
constexpr double kRiskTolerance = 1e-7;

std::map<std::string, double> reference() {
  auto columns = testing::readColumns(kDir + "birthwt_spline.csv");
  std::map<std::string, double> out;
  for (std::size_t i = 0; i < columns["key"].size(); ++i) {
    out[columns["key"][i]] = std::stod(columns["value"][i]);
  }
  return out;
}

CohortFitSpec splineSpec() {
  CohortFitSpec spec;
  spec.outcome = OutcomeSpec{"low", std::nullopt};
  spec.predictors = {"age", "lwt", "race", "smoke"};
  spec.splineKnots["age"] = 4;
  return spec;
}

TEST(BirthwtSpline, KnotsDevianceAndRisksMatchRNaturalSpline) {
  const Table table = readCsvFile(kDir + "birthwt.csv", CsvOptions{}).table;
  const CohortFit fitted = fitCohortModel(table, splineSpec());
  const auto r = reference();
  // Terms: age spline 0..2 (one per basis function of 4 knots), then lwt, race, smoke.
  ASSERT_EQ(fitted.model.terms[0].name, "age spline 0");
  ASSERT_EQ(fitted.model.terms[2].name, "age spline 2");
  ASSERT_EQ(fitted.model.terms[0].knots.size(), 4u);
  for (int k = 0; k < 4; ++k) {
    EXPECT_DOUBLE_EQ(fitted.model.terms[0].knots[static_cast<std::size_t>(k)],
                     r.at("knot" + std::to_string(k + 1)));
  }
  EXPECT_NEAR(fitted.fit.deviance, r.at("deviance"), kDevianceTolerance);
  std::vector<std::uint32_t> rows(10);
  for (std::uint32_t i = 0; i < 10; ++i) rows[i] = i;
  const std::vector<double> lp = linearPredictor(fitted.model, table, rows);
  for (std::size_t i = 0; i < rows.size(); ++i) {
    EXPECT_NEAR(logisticRisk(lp[i]), r.at("risk" + std::to_string(i + 1)), kRiskTolerance) << i;
  }
}

TEST(BirthwtSpline, BadSplineRequestsAreInputErrors) {
  const Table table = readCsvFile(kDir + "birthwt.csv", CsvOptions{}).table;
  CohortFitSpec spec = splineSpec();
  spec.splineKnots = {{"race", 3}};  // a text column
  EXPECT_THROW(fitCohortModel(table, spec), InputError);
  spec.splineKnots = {{"bwt", 3}};  // not a predictor
  EXPECT_THROW(fitCohortModel(table, spec), InputError);
  spec.splineKnots = {{"age", 9}};
  EXPECT_THROW(fitCohortModel(table, spec), InputError);
  // smoke is 0/1: every knot quantile ties, which is an AnalysisError naming the column.
  spec.splineKnots = {{"smoke", 3}};
  try {
    fitCohortModel(table, spec);
    FAIL() << "no error";
  } catch (const AnalysisError& e) {
    EXPECT_NE(std::string(e.what()).find("'smoke'"), std::string::npos) << e.what();
  }
}

}  // namespace
}  // namespace calivera
