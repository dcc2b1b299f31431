// fitLogistic against statsmodels 0.13.5 Logit on the Wisconsin diagnostic breast-cancer data
// bundled with scikit-learn (Debian python3-sklearn), values from
// tests/reference/scripts/breast_cancer_logit.py.
#include <gtest/gtest.h>

#include "core/fit/logistic_fit.h"
#include "tests/reference/reference_csv.h"

namespace calivera {
namespace {

using testing::readColumns;
using testing::readReference;
using testing::referencePath;
using testing::relativeDifference;

constexpr double kCoefficientTolerance = 1e-8;  // both fits converge to machine precision
constexpr double kSeTolerance = 1e-7;

TEST(BreastCancerReference, FourPredictorsMatchStatsmodels) {
  auto columns = readColumns(referencePath("breast_cancer.csv"));
  const char* names[] = {"mean_radius", "mean_texture", "mean_smoothness", "mean_symmetry"};
  const auto n = static_cast<Eigen::Index>(columns["malignant"].size());
  ASSERT_EQ(n, 569);
  Eigen::MatrixXd X(n, 5);
  Eigen::VectorXd y(n);
  for (Eigen::Index i = 0; i < n; ++i) {
    const auto row = static_cast<std::size_t>(i);
    y[i] = std::stod(columns["malignant"][row]);
    X(i, 0) = 1.0;
    for (int j = 0; j < 4; ++j) X(i, j + 1) = std::stod(columns[names[j]][row]);
  }
  const FitResult fit = fitLogistic(X, y, nullptr, {});
  ASSERT_TRUE(fit.converged);
  EXPECT_EQ(fit.problem, FitProblem::None);
  const auto reference = readReference(referencePath("breast_cancer_logit.csv"));
  const char* terms[] = {"(Intercept)", "mean_radius", "mean_texture", "mean_smoothness",
                         "mean_symmetry"};
  for (int j = 0; j < 5; ++j) {
    const auto& r = reference.at({"", terms[j]});
    EXPECT_LT(relativeDifference(fit.beta[j], r.value), kCoefficientTolerance) << terms[j];
    EXPECT_LT(relativeDifference(fit.se[j], r.se), kSeTolerance) << terms[j];
  }
  EXPECT_LT(relativeDifference(fit.deviance, reference.at({"", "deviance"}).value), 1e-10);
  // statsmodels fits its null model iteratively at its default tolerance; ours is closed form.
  EXPECT_LT(relativeDifference(fit.nullDeviance, reference.at({"", "null_deviance"}).value), 1e-9);
}

}  // namespace
}  // namespace calivera
