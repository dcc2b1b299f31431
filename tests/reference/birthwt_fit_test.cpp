// fitLogistic against R 4.2.2's glm on MASS::birthwt (Debian r-cran-mass, GPL-2 | GPL-3), values
// from tests/reference/scripts/birthwt_glm.R, and against the table printed in Hosmer &
// Lemeshow's Applied Logistic Regression (docs/methods.md, from memory).
#include <gtest/gtest.h>

#include "core/fit/logistic_fit.h"
#include "tests/reference/reference_csv.h"

namespace calivera {
namespace {

using testing::readColumns;
using testing::readReference;
using testing::referencePath;
using testing::relativeDifference;

constexpr double kCoefficientTolerance = 1e-7;  // relative, against glm(epsilon = 1e-14)
constexpr double kSeTolerance = 1e-6;
constexpr double kDevianceTolerance = 1e-9;

struct Birthwt {
  Eigen::VectorXd low, age, lwt, ftv, black, other;
};

Birthwt loadBirthwt() {
  auto columns = readColumns(referencePath("birthwt.csv"));
  const std::size_t n = columns["low"].size();
  Birthwt d;
  for (auto* v : {&d.low, &d.age, &d.lwt, &d.ftv, &d.black, &d.other}) v->resize(n);
  for (std::size_t i = 0; i < n; ++i) {
    const auto r = static_cast<Eigen::Index>(i);
    d.low[r] = std::stod(columns["low"][i]);
    d.age[r] = std::stod(columns["age"][i]);
    d.lwt[r] = std::stod(columns["lwt"][i]);
    d.ftv[r] = std::stod(columns["ftv"][i]);
    d.black[r] = columns["race"][i] == "black";
    d.other[r] = columns["race"][i] == "other";
  }
  return d;
}

TEST(BirthwtReference, MainModelMatchesRGlm) {
  const Birthwt d = loadBirthwt();
  ASSERT_EQ(d.low.size(), 189);
  Eigen::MatrixXd X(d.low.size(), 6);
  X << Eigen::VectorXd::Ones(d.low.size()), d.age, d.lwt, d.black, d.other, d.ftv;
  const FitResult fit = fitLogistic(X, d.low, nullptr, {});
  ASSERT_TRUE(fit.converged);
  EXPECT_EQ(fit.problem, FitProblem::None);
  const auto reference = readReference(referencePath("birthwt_glm.csv"));
  const char* terms[] = {"(Intercept)", "age", "lwt", "raceblack", "raceother", "ftv"};
  for (int j = 0; j < 6; ++j) {
    const auto& r = reference.at({"main", terms[j]});
    EXPECT_LT(relativeDifference(fit.beta[j], r.value), kCoefficientTolerance) << terms[j];
    EXPECT_LT(relativeDifference(fit.se[j], r.se), kSeTolerance) << terms[j];
  }
  EXPECT_LT(relativeDifference(fit.deviance, reference.at({"main", "deviance"}).value),
            kDevianceTolerance);
  EXPECT_LT(relativeDifference(fit.nullDeviance, reference.at({"main", "null_deviance"}).value),
            kDevianceTolerance);
  EXPECT_LT(relativeDifference(fit.aic, reference.at({"main", "aic"}).value), kDevianceTolerance);
}

TEST(BirthwtReference, MainModelMatchesPublishedTable) {
  // Hosmer & Lemeshow, Applied Logistic Regression, 2nd ed. (docs/methods.md; values from memory,
  // printed to 3 decimals, so the tolerance is half a unit in the last place).
  const Birthwt d = loadBirthwt();
  Eigen::MatrixXd X(d.low.size(), 6);
  X << Eigen::VectorXd::Ones(d.low.size()), d.age, d.lwt, d.black, d.other, d.ftv;
  const FitResult fit = fitLogistic(X, d.low, nullptr, {});
  const double published[] = {1.295, -0.024, -0.014, 1.004, 0.433, -0.049};
  for (int j = 0; j < 6; ++j) EXPECT_NEAR(fit.beta[j], published[j], 0.0005 + 1e-12) << j;
}

TEST(BirthwtReference, OffsetModelsMatchRGlm) {
  const Birthwt d = loadBirthwt();
  const auto reference = readReference(referencePath("birthwt_glm.csv"));
  const Eigen::Index n = d.low.size();
  {
    Eigen::MatrixXd X(n, 2);
    X << Eigen::VectorXd::Ones(n), d.age;
    const Eigen::VectorXd offset = d.lwt / 100.0;
    const FitResult fit = fitLogistic(X, d.low, &offset, {});
    ASSERT_TRUE(fit.converged);
    const char* terms[] = {"(Intercept)", "age"};
    for (int j = 0; j < 2; ++j) {
      const auto& r = reference.at({"offset", terms[j]});
      EXPECT_LT(relativeDifference(fit.beta[j], r.value), kCoefficientTolerance) << terms[j];
      EXPECT_LT(relativeDifference(fit.se[j], r.se), kSeTolerance) << terms[j];
    }
    EXPECT_LT(relativeDifference(fit.deviance, reference.at({"offset", "deviance"}).value),
              kDevianceTolerance);
    // R's null model with an offset: intercept + offset.
    EXPECT_LT(relativeDifference(fit.nullDeviance, reference.at({"offset", "null_deviance"}).value),
              kDevianceTolerance);
  }
  {
    Eigen::MatrixXd X = d.age;
    const Eigen::VectorXd offset = (d.lwt / 100.0).array() - 1.0;
    const FitResult fit = fitLogistic(X, d.low, &offset, {});
    ASSERT_TRUE(fit.converged);
    const auto& r = reference.at({"offset_no_intercept", "age"});
    EXPECT_LT(relativeDifference(fit.beta[0], r.value), kCoefficientTolerance);
    EXPECT_LT(relativeDifference(fit.se[0], r.se), kSeTolerance);
    // Without an intercept column the null model is the offset alone.
    EXPECT_LT(relativeDifference(fit.nullDeviance,
                                 reference.at({"offset_no_intercept", "null_deviance"}).value),
              kDevianceTolerance);
  }
}

TEST(BirthwtReference, FirthMatchesDirectMaximisationWithScipy) {
  // tests/reference/scripts/birthwt_firth.py maximises log L + 1/2 log det I with scipy's
  // general-purpose optimisers (no modified score); its precision (about 2e-7 relative) limits the tolerance.
  const Birthwt d = loadBirthwt();
  Eigen::MatrixXd X(d.low.size(), 6);
  X << Eigen::VectorXd::Ones(d.low.size()), d.age, d.lwt, d.black, d.other, d.ftv;
  FitOptions options;
  options.firth = true;
  const FitResult fit = fitLogistic(X, d.low, nullptr, options);
  ASSERT_TRUE(fit.converged);
  const auto reference = readReference(referencePath("birthwt_firth.csv"));
  const char* terms[] = {"(Intercept)", "age", "lwt", "raceblack", "raceother", "ftv"};
  for (int j = 0; j < 6; ++j) {
    const auto& r = reference.at({"", terms[j]});
    EXPECT_LT(relativeDifference(fit.beta[j], r.value), 1e-6) << terms[j];
    EXPECT_LT(relativeDifference(fit.se[j], r.se), 1e-6) << terms[j];
  }
  // Our maximum is at least as high as the optimiser's.
  EXPECT_GE(fit.penalizedLogLikelihood, reference.at({"", "penalized_loglik"}).value - 1e-10);
}

}  // namespace
}  // namespace calivera
