// Profile-likelihood 95% intervals (core/fit/profile_ci.h) on MASS::birthwt (r-cran-mass):
// low ~ age + lwt + race + ftv against R 4.2.2's glm profiled exactly by uniroot, and against
// MASS's confint (which interpolates a profile grid, hence the looser tolerance). Values from
// tests/reference/scripts/birthwt_profile.R -> tests/reference/data/birthwt_profile.csv.
#include <gtest/gtest.h>

#include <cmath>

#include "core/data/csv_reader.h"
#include "core/fit/cohort_fit.h"
#include "core/fit/profile_ci.h"
#include "core/model/linear_predictor.h"
#include "core/util/errors.h"
#include "tests/reference/reference_csv.h"

namespace calivera {
namespace {

const std::string kDir = std::string(CALIVERA_SOURCE_DIR) + "/tests/reference/data/";
constexpr double kExactTolerance = 2e-6;  // bisection to 1e-6 SE, fits to 1e-10 in deviance
constexpr double kMassTolerance = 1e-4;   // MASS interpolates its profile grid

TEST(BirthwtProfile, IntervalsMatchRsExactProfileAndMassConfint) {
  const Table table = readCsvFile(kDir + "birthwt.csv", CsvOptions{}).table;
  CohortFitSpec spec;
  spec.outcome = OutcomeSpec{"low", std::nullopt};
  spec.predictors = {"age", "lwt", "race", "ftv"};
  const CohortFit fitted = fitCohortModel(table, spec);
  const AnalysisRows rows = selectCompleteCases(table, {"low", "age", "lwt", "race", "ftv"});
  const Eigen::MatrixXd design = designMatrix(fitted.model, table, rows.rows);
  Eigen::MatrixXd X(design.rows(), design.cols() + 1);
  X.col(0).setOnes();
  X.rightCols(design.cols()) = design;
  const std::vector<double> outcome = outcomeValues(table, spec.outcome, rows.rows);
  const Eigen::VectorXd y =
      Eigen::Map<const Eigen::VectorXd>(outcome.data(), static_cast<Eigen::Index>(outcome.size()));
  const ProfileIntervals profile = profileLikelihoodIntervals(X, y, fitted.fit, FitOptions{});
  EXPECT_TRUE(profile.warnings.empty());

  auto r = testing::readColumns(kDir + "birthwt_profile.csv");
  ASSERT_EQ(r["term"].size(), profile.ci.size());
  // R's order: (Intercept), age, lwt, raceother, racewhite, ftv; ours: intercept, age, lwt,
  // race=other, race=white, ftv (black, first in byte order, is the reference in both).
  for (std::size_t j = 0; j < profile.ci.size(); ++j) {
    EXPECT_NEAR(fitted.fit.beta[static_cast<Eigen::Index>(j)], std::stod(r["estimate"][j]), 1e-7);
    EXPECT_NEAR(profile.ci[j].lo, std::stod(r["exact_lo"][j]), kExactTolerance) << r["term"][j];
    EXPECT_NEAR(profile.ci[j].hi, std::stod(r["exact_hi"][j]), kExactTolerance) << r["term"][j];
    EXPECT_NEAR(profile.ci[j].lo, std::stod(r["mass_lo"][j]), kMassTolerance) << r["term"][j];
    EXPECT_NEAR(profile.ci[j].hi, std::stod(r["mass_hi"][j]), kMassTolerance) << r["term"][j];
  }
}

TEST(BirthwtProfile, FirthFitsAreRefused) {
  Eigen::MatrixXd X(4, 1);
  X << 1, 1, 1, 1;
  Eigen::VectorXd y(4);
  y << 0, 1, 0, 1;
  FitOptions firth;
  firth.firth = true;
  const FitResult fit = fitLogistic(X, y, nullptr, firth);
  EXPECT_THROW(profileLikelihoodIntervals(X, y, fit, firth), AnalysisError);
}

}  // namespace
}  // namespace calivera
