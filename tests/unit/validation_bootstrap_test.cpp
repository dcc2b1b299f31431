// Bootstrap intervals of a validation: reproducible for any thread count, bracketing their
// estimates, one-class resamples counted; net-benefit differences of a comparison.
#include "core/uncertainty/validation_bootstrap.h"

#include <gtest/gtest.h>

#include <random>

#include "core/uncertainty/model_comparison.h"

namespace calivera {
namespace {

ValidationInput simulate(std::size_t n, double prevalenceShift, std::uint64_t seed) {
  std::mt19937_64 generator(seed);
  std::normal_distribution<double> normal;
  std::uniform_real_distribution<double> uniform;
  ValidationInput input;
  std::vector<double> lp;
  for (std::size_t i = 0; i < n; ++i) {
    const double l = -1.2 + 1.1 * normal(generator);
    lp.push_back(l);
    input.risk.push_back(1.0 / (1.0 + std::exp(-l)));
    const double truth = 1.0 / (1.0 + std::exp(-(l + prevalenceShift)));
    input.outcome.push_back(uniform(generator) < truth ? 1.0 : 0.0);
  }
  input.linearPredictor = lp;
  return input;
}

ValidationBootstrap run(const ValidationInput& input, unsigned threads) {
  const ValidationResult apparent = validate(input, {});
  ValidationBootstrapOptions options;
  options.bootstrap.replicates = 40;
  options.bootstrap.seed = 77;
  options.bootstrap.threads = threads;
  return bootstrapValidation(input, {}, apparent, options);
}

TEST(ValidationBootstrap, SameSeedIdenticalForAnyThreadCountAndBracketsEstimates) {
  const ValidationInput input = simulate(1500, 0.3, 1);
  const ValidationBootstrap one = run(input, 1);
  const ValidationBootstrap two = run(input, 2);
  EXPECT_EQ(one.auc.ci.lo, two.auc.ci.lo);
  EXPECT_EQ(one.ici.ci.hi, two.ici.ci.hi);
  ASSERT_EQ(one.netBenefit.size(), two.netBenefit.size());
  for (std::size_t t = 0; t < one.netBenefit.size(); ++t) {
    EXPECT_EQ(one.netBenefit[t].ci.lo, two.netBenefit[t].ci.lo);
  }
  ASSERT_EQ(one.calibrationCurve.size(), two.calibrationCurve.size());
  ASSERT_FALSE(one.calibrationCurve.empty());
  for (std::size_t g = 0; g < one.calibrationCurve.size(); ++g) {
    EXPECT_EQ(one.calibrationCurve[g].ci.hi, two.calibrationCurve[g].ci.hi);
  }
  for (const BootstrapEstimate* e : {&one.auc, &one.brier, &one.calibrationSlope, &one.oeRatio}) {
    EXPECT_LE(e->ci.lo, e->estimate);
    EXPECT_GE(e->ci.hi, e->estimate);
    EXPECT_EQ(e->replicatesUsed, 40u);
  }
  EXPECT_GT(one.oeRatio.ci.lo, 1.0);  // outcomes simulated with a higher intercept
}

TEST(ValidationBootstrap, OneClassResamplesAreCountedNotHidden) {
  ValidationInput input;
  for (int i = 0; i < 12; ++i) {
    input.risk.push_back(0.05 + 0.07 * i);
    input.outcome.push_back(i == 11 ? 1.0 : 0.0);  // one event: many resamples lack it
  }
  const ValidationResult apparent = validate(input, {});
  ValidationBootstrapOptions options;
  options.bootstrap.replicates = 50;
  const ValidationBootstrap b = bootstrapValidation(input, {}, apparent, options);
  EXPECT_GT(b.run.failed, 0u);
  EXPECT_EQ(b.auc.replicatesUsed + b.run.failed, 50u);
  EXPECT_FALSE(b.warnings.empty());
}

TEST(ModelComparison, NetBenefitDifferenceMatchesDirectCounting) {
  const ValidationInput a = simulate(2000, 0.0, 4);
  std::vector<double> weaker;
  std::mt19937_64 generator(9);
  std::normal_distribution<double> noise;
  for (double lp : *a.linearPredictor)
    weaker.push_back(1.0 / (1.0 + std::exp(-(lp + noise(generator)))));
  ComparisonOptions options;
  options.thresholds = {0.1, 0.2, 0.3};
  options.bootstrap.replicates = 30;
  const ModelComparison c = compareModels({"a", "b"}, {a.risk, weaker}, a.outcome, options);
  ASSERT_EQ(c.pairs.size(), 1u);
  EXPECT_GT(c.pairs[0].auc.difference, 0.0);
  EXPECT_LT(c.pairs[0].auc.pValue, 0.05);
  for (const auto& point : c.pairs[0].netBenefit) {
    const double t = point.threshold;
    double nbA = 0.0, nbB = 0.0;
    for (std::size_t i = 0; i < a.outcome.size(); ++i) {
      const double w = t / (1.0 - t);
      const double yi = a.outcome[i];
      if (a.risk[i] >= t) nbA += yi > 0.5 ? 1.0 : -w;
      if (weaker[i] >= t) nbB += yi > 0.5 ? 1.0 : -w;
    }
    EXPECT_NEAR(point.netBenefitFirst, nbA / 2000.0, 1e-12);
    EXPECT_NEAR(point.difference, (nbA - nbB) / 2000.0, 1e-12);
    EXPECT_LE(point.ci.lo, point.difference);
    EXPECT_GE(point.ci.hi, point.difference);
  }
}

}  // namespace
}  // namespace calivera
