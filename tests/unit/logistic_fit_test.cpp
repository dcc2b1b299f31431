#include "core/fit/logistic_fit.h"

#include <gtest/gtest.h>

#include <cmath>
#include <random>

namespace calivera {
namespace {

// Rows of a 2x2 table: `events` and `nonEvents` at covariate value x.
void addCell(std::vector<double>& x, std::vector<double>& y, double value, int events,
             int nonEvents) {
  for (int i = 0; i < events; ++i) x.push_back(value), y.push_back(1);
  for (int i = 0; i < nonEvents; ++i) x.push_back(value), y.push_back(0);
}

Eigen::MatrixXd withIntercept(const std::vector<double>& x) {
  Eigen::MatrixXd X(static_cast<Eigen::Index>(x.size()), 2);
  for (std::size_t i = 0; i < x.size(); ++i) X.row(static_cast<Eigen::Index>(i)) << 1.0, x[i];
  return X;
}

Eigen::VectorXd vec(const std::vector<double>& v) {
  return Eigen::Map<const Eigen::VectorXd>(v.data(), static_cast<Eigen::Index>(v.size()));
}

TEST(LogisticFit, FirthMatchesHalfCountCorrectionForOneBinaryCovariate) {
  // docs/methods.md (computed): 5/0 events/non-events at x = 1 and 3/7 at x = 0; with one binary
  // covariate Firth's estimate equals the log odds ratio after adding 1/2 to every cell.
  std::vector<double> x, y;
  addCell(x, y, 1, 5, 0);
  addCell(x, y, 0, 3, 7);
  FitOptions options;
  options.firth = true;
  const FitResult fit = fitLogistic(withIntercept(x), vec(y), nullptr, options);
  ASSERT_TRUE(fit.converged);
  EXPECT_EQ(fit.problem, FitProblem::None);
  EXPECT_NEAR(fit.beta[1], 3.1600, 5e-5);
  EXPECT_NEAR(fit.beta[0], -0.7621, 5e-5);
  // The closed form itself, to full precision.
  EXPECT_NEAR(fit.beta[1], std::log(5.5 / 0.5) - std::log(3.5 / 7.5), 1e-9);
  EXPECT_NEAR(fit.beta[0], std::log(3.5 / 7.5), 1e-9);
  EXPECT_TRUE(std::isfinite(fit.se[1]));
}

TEST(LogisticFit, SameTableWithoutFirthIsQuasiSeparated) {
  std::vector<double> x, y;
  addCell(x, y, 1, 5, 0);
  addCell(x, y, 0, 3, 7);
  const FitResult fit = fitLogistic(withIntercept(x), vec(y), nullptr, {});
  EXPECT_EQ(fit.problem, FitProblem::QuasiSeparation);
  EXPECT_EQ(fit.problemColumns, std::vector<int>{1});
  EXPECT_GT(fit.beta[1], 10.0);
}

TEST(LogisticFit, CompleteSeparationNamesTheColumns) {
  // y = 1 exactly when x > 3; a noise column that does not separate is not named.
  std::vector<double> x, y;
  for (int i = 0; i < 8; ++i) x.push_back(i), y.push_back(i > 3 ? 1 : 0);
  Eigen::MatrixXd X(8, 3);
  const double noise[] = {0.3, -1.2, 0.8, 0.1, -0.4, 1.5, -0.9, 0.2};
  for (int i = 0; i < 8; ++i) X.row(i) << 1.0, x[static_cast<std::size_t>(i)], noise[i];
  const FitResult fit = fitLogistic(X, vec(y), nullptr, {});
  EXPECT_EQ(fit.problem, FitProblem::CompleteSeparation);
  EXPECT_EQ(fit.problemColumns, std::vector<int>{1});
  FitOptions firth;
  firth.firth = true;
  const FitResult penalized = fitLogistic(X, vec(y), nullptr, firth);
  EXPECT_TRUE(penalized.converged);
  EXPECT_EQ(penalized.problem, FitProblem::None);
  EXPECT_TRUE(penalized.beta.allFinite());
}

TEST(LogisticFit, OneOutcomeClassIsSeparationOfTheIntercept) {
  const std::vector<double> x{1, 2, 3, 4, 5};
  const std::vector<double> y{0, 0, 0, 0, 0};
  const FitResult fit = fitLogistic(withIntercept(x), vec(y), nullptr, {});
  EXPECT_NE(fit.problem, FitProblem::None);
  EXPECT_FALSE(fit.warnings.empty());
}

TEST(LogisticFit, CollinearColumnsAreNamed) {
  std::mt19937 random(7);
  std::normal_distribution<double> normal;
  const int n = 200;
  Eigen::MatrixXd X(n, 5);
  Eigen::VectorXd y(n);
  for (int i = 0; i < n; ++i) {
    const double a = normal(random), b = normal(random), c = normal(random);
    X.row(i) << 1.0, a, b, c, 2.0 * a - b;  // column 4 = 2 * column 1 - column 2
    y[i] = normal(random) + a > 0 ? 1 : 0;
  }
  const FitResult fit = fitLogistic(X, y, nullptr, {});
  EXPECT_EQ(fit.problem, FitProblem::RankDeficient);
  EXPECT_EQ(fit.problemColumns, (std::vector<int>{1, 2, 4}));
}

TEST(LogisticFit, SecondConstantColumnIsRankDeficient) {
  const std::vector<double> y{0, 1, 0, 1, 1, 0};
  Eigen::MatrixXd X(6, 3);
  X << 1, 0.5, 3, 1, 1.5, 3, 1, 2.0, 3, 1, 0.1, 3, 1, 0.7, 3, 1, 1.1, 3;
  const FitResult fit = fitLogistic(X, vec(y), nullptr, {});
  EXPECT_EQ(fit.problem, FitProblem::RankDeficient);
  EXPECT_EQ(fit.problemColumns, (std::vector<int>{0, 2}));
  X.col(2).setZero();
  const FitResult zero = fitLogistic(X, vec(y), nullptr, {});
  EXPECT_EQ(zero.problem, FitProblem::RankDeficient);
  EXPECT_EQ(zero.problemColumns, std::vector<int>{2});
}

TEST(LogisticFit, IterationLimitIsReportedAsNotConverged) {
  std::vector<double> x, y;
  addCell(x, y, 1, 30, 10);
  addCell(x, y, 0, 10, 30);
  FitOptions options;
  options.maxIterations = 1;
  const FitResult fit = fitLogistic(withIntercept(x), vec(y), nullptr, options);
  EXPECT_FALSE(fit.converged);
  EXPECT_EQ(fit.problem, FitProblem::NotConverged);
  const FitResult full = fitLogistic(withIntercept(x), vec(y), nullptr, {});
  EXPECT_TRUE(full.converged);
  EXPECT_NEAR(full.beta[1], std::log(9.0), 1e-9);  // odds ratio (30/10)/(10/30)
}

TEST(LogisticFit, ResultDoesNotDependOnThreadCount) {
  // Property on simulated data: several row blocks, summed in block order.
  std::mt19937 random(11);
  std::normal_distribution<double> normal;
  const int n = 150000, p = 4;
  Eigen::MatrixXd X(n, p);
  Eigen::VectorXd y(n);
  for (int i = 0; i < n; ++i) {
    X(i, 0) = 1.0;
    for (int j = 1; j < p; ++j) X(i, j) = normal(random);
    const double eta = -1 + 0.5 * X(i, 1) - 0.3 * X(i, 2);
    y[i] = std::uniform_real_distribution<double>()(random) < 1 / (1 + std::exp(-eta));
  }
  FitOptions one, two;
  one.threads = 1;
  two.threads = 2;
  const FitResult a = fitLogistic(X, y, nullptr, one);
  const FitResult b = fitLogistic(X, y, nullptr, two);
  EXPECT_EQ(a.beta, b.beta);
  EXPECT_EQ(a.se, b.se);
  EXPECT_EQ(a.deviance, b.deviance);
}

TEST(LogisticFit, CalibrationSlopeAndInterceptPaths) {
  // Property: with y generated from logit P = 0.2 + 0.8 LP, the slope fit recovers 0.8 and the
  // offset fit returns a finite intercept; the null deviance is below the offset deviance rule.
  std::mt19937 random(3);
  std::normal_distribution<double> normal;
  const int n = 100000;
  Eigen::MatrixXd X(n, 2);
  Eigen::VectorXd y(n), lp(n);
  for (int i = 0; i < n; ++i) {
    lp[i] = normal(random) - 1;
    X.row(i) << 1.0, lp[i];
    const double p = 1 / (1 + std::exp(-(0.2 + 0.8 * lp[i])));
    y[i] = std::uniform_real_distribution<double>()(random) < p;
  }
  const FitResult slope = fitLogistic(X, y, nullptr, {});
  ASSERT_TRUE(slope.converged);
  EXPECT_NEAR(slope.beta[1], 0.8, 4 * slope.se[1]);
  const Eigen::MatrixXd ones = Eigen::MatrixXd::Ones(n, 1);
  const FitResult large = fitLogistic(ones, y, &lp, {});
  ASSERT_TRUE(large.converged);
  // The offset model is the null model with an offset (R's definition): same deviance.
  EXPECT_NEAR(large.deviance, large.nullDeviance, 1e-9 * large.deviance);
}

}  // namespace
}  // namespace calivera
