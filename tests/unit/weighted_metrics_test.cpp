// The weighted replicate measures equal validate()'s values on the expanded data (each patient
// repeated as often as its weight) — the two implementations must agree.
#include "core/uncertainty/weighted_metrics.h"

#include <gtest/gtest.h>

#include <random>

#include "core/metrics/validation.h"

namespace calivera {
namespace {

constexpr double kTolerance = 1e-9;

TEST(WeightedMeasures, EqualValidateOnTheExpandedData) {
  std::mt19937_64 generator(17);
  std::normal_distribution<double> normal;
  std::uniform_real_distribution<double> uniform;
  std::uniform_int_distribution<int> copies(0, 3);
  std::vector<double> lp, y, weights;
  ValidationInput expanded;
  std::vector<double> expandedLp;
  for (int i = 0; i < 800; ++i) {
    const double l = std::round(4.0 * (-0.7 + 1.2 * normal(generator))) / 4.0;  // ties
    const double outcome = uniform(generator) < 1.0 / (1.0 + std::exp(-(0.3 + 0.8 * l))) ? 1 : 0;
    const int w = copies(generator);
    lp.push_back(l);
    y.push_back(outcome);
    weights.push_back(w);
    for (int c = 0; c < w; ++c) {
      expanded.outcome.push_back(outcome);
      expanded.risk.push_back(1.0 / (1.0 + std::exp(-l)));
      expandedLp.push_back(l);
    }
  }
  expanded.linearPredictor = expandedLp;
  const WeightedMeasures m = weightedMeasures(lp, y, ascendingOrder(lp), weights);
  const ValidationResult v = validate(expanded, {});
  EXPECT_NEAR(m.auc, v.discrimination.auc, kTolerance);
  EXPECT_NEAR(m.calibrationIntercept, v.calibration.intercept, 1e-8);
  EXPECT_NEAR(m.calibrationSlope, v.calibration.slope, 1e-8);
  EXPECT_NEAR(m.brier, v.overall.brier, kTolerance);
  // Unit weights equal no weights.
  const WeightedMeasures unit =
      weightedMeasures(lp, y, ascendingOrder(lp), std::vector<double>(lp.size(), 1.0));
  const WeightedMeasures none = weightedMeasures(lp, y, ascendingOrder(lp), {});
  EXPECT_DOUBLE_EQ(unit.auc, none.auc);
  EXPECT_DOUBLE_EQ(unit.calibrationSlope, none.calibrationSlope);
}

TEST(WeightedMeasures, OneClassGivesNanAuc) {
  const std::vector<double> lp = {0.1, 0.2}, y = {1, 1};
  EXPECT_TRUE(std::isnan(weightedAuc(lp, y, ascendingOrder(lp), {})));
}

}  // namespace
}  // namespace calivera

namespace calivera {
namespace {

// A large, uncentred offset (issue 11): plain Newton from 0 meets expit(a + offset) of 1 for
// every patient and diverges; the bracketed Newton finds the one root of the score. Checked by
// the defining property, the score at the returned intercept is zero, and against the
// closed form for a constant offset (logit of the event rate minus the offset).
TEST(WeightedOffsetIntercept, ConvergesWithALargeUncentredOffset) {
  std::vector<double> offset, y;
  for (int i = 0; i < 400; ++i) {
    offset.push_back(40.0 + 0.01 * (i % 97));
    y.push_back(i % 7 == 0 ? 1.0 : 0.0);
  }
  const double a = weightedOffsetIntercept(offset, y, {});
  ASSERT_TRUE(std::isfinite(a));
  double score = 0.0;
  for (std::size_t i = 0; i < y.size(); ++i) score += y[i] - 1.0 / (1.0 + std::exp(-(a + offset[i])));
  EXPECT_NEAR(score, 0.0, 1e-6);  // of 400 patients: the root to the fit's tolerance
  EXPECT_NEAR(a, -42.2, 0.3);
  const std::vector<double> constant(400, 55.0);
  const double rate = 58.0 / 400.0;  // 58 of the 400 rows have i % 7 == 0
  EXPECT_NEAR(weightedOffsetIntercept(constant, y, {}), std::log(rate / (1 - rate)) - 55.0, 1e-9);
  // One outcome class: no finite intercept.
  EXPECT_TRUE(std::isnan(weightedOffsetIntercept(offset, std::vector<double>(400, 0.0), {})));
}

}  // namespace
}  // namespace calivera
