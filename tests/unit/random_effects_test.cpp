// Random-effects pooling (core/sites/random_effects.h) against R's general-purpose meta-analysis
// package metafor 3.8-1 (Debian r-cran-metafor) on two published meta-analyses it ships:
// dat.bcg (log risk ratios, strong heterogeneity) and dat.hackshaw1998 (log odds ratios, little
// heterogeneity, where the never-narrower HKSJ rule changes the interval). Values and the script
// that made them: tests/reference/data/metafor_pooling.json, tests/reference/scripts/
// metafor_pooling.R.
#include "core/sites/random_effects.h"

#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <nlohmann/json.hpp>

#include "tests/reference/reference_csv.h"

namespace calivera {
namespace {

using testing::referencePath;

nlohmann::json metaforReference() {
  std::ifstream in(referencePath("metafor_pooling.json"));
  return nlohmann::json::parse(in);
}

void expectInterval(const Interval& ours, const nlohmann::json& reference, double tolerance,
                    const std::string& what) {
  EXPECT_NEAR(ours.lo, reference[0].get<double>(), tolerance) << what;
  EXPECT_NEAR(ours.hi, reference[1].get<double>(), tolerance) << what;
}

void expectMatchesMetafor(const std::string& name) {
  const nlohmann::json r = metaforReference().at(name);
  const auto y = r.at("yi").get<std::vector<double>>();
  const auto v = r.at("vi").get<std::vector<double>>();
  const RandomEffectsOutcome outcome = poolRandomEffects(y, v);
  ASSERT_TRUE(outcome.pool.has_value()) << outcome.problem;
  const RandomEffectsPool& p = *outcome.pool;
  constexpr double kTolerance = 1e-8;
  EXPECT_EQ(p.k, y.size());
  EXPECT_NEAR(p.tau2, r.at("tau2").get<double>(), kTolerance) << name;
  EXPECT_NEAR(p.estimate, r.at("estimate").get<double>(), kTolerance) << name;
  EXPECT_NEAR(p.se, r.at("se").get<double>(), kTolerance) << name;
  EXPECT_NEAR(p.i2, r.at("i2").get<double>(), kTolerance) << name;
  EXPECT_NEAR(p.q, r.at("q").get<double>(), kTolerance * r.at("q").get<double>()) << name;
  EXPECT_NEAR(p.qPValue, r.at("q_p").get<double>(), 1e-12) << name;
  expectInterval(p.ciWald, r.at("ci_plain"), kTolerance, name + " Wald");
  expectInterval(p.ciHksj, r.at("ci_knha"), kTolerance, name + " HKSJ");
  expectInterval(p.ci, r.at("ci_adhoc"), kTolerance, name + " HKSJ never narrower");
  ASSERT_TRUE(p.predictionInterval.has_value());
  expectInterval(*p.predictionInterval, r.at("pi"), kTolerance, name + " prediction");
  EXPECT_NEAR(p.fixedEstimate, r.at("fe_estimate").get<double>(), 1e-12) << name;
  expectInterval(p.fixedCi, r.at("fe_ci"), 1e-12, name + " fixed effect");
}

TEST(RandomEffectsMetafor, BcgTrialsStrongHeterogeneity) {
  expectMatchesMetafor("bcg");
}

TEST(RandomEffectsMetafor, HackshawStudiesTruncationWidensTheInterval) {
  expectMatchesMetafor("hackshaw");
  // The case the truncation exists for: q < 1, so the reported interval is wider.
  const nlohmann::json r = metaforReference().at("hackshaw");
  const auto pool = *poolRandomEffects(r.at("yi").get<std::vector<double>>(),
                                       r.at("vi").get<std::vector<double>>())
                         .pool;
  EXPECT_LT(pool.hksjScale, 1.0);
  EXPECT_GT(pool.ci.hi - pool.ci.lo, pool.ciHksj.hi - pool.ciHksj.lo);
}

TEST(RandomEffects, IdenticalEstimatesHaveNoHeterogeneity) {
  // Hand check: equal estimates give Q = 0, tau^2 = 0, I^2 = 0, the fixed-effect estimate, and
  // with q = 0 < 1 the truncated interval uses the plain SE with t on k - 1 = 2 df
  // (t(2, 0.975) = 4.3026527297494619 from R's qt).
  const RandomEffectsOutcome outcome = poolRandomEffects({0.5, 0.5, 0.5}, {0.04, 0.09, 0.01});
  ASSERT_TRUE(outcome.pool.has_value());
  const RandomEffectsPool& p = *outcome.pool;
  EXPECT_DOUBLE_EQ(p.tau2, 0.0);
  EXPECT_NEAR(p.q, 0.0, 1e-15);
  EXPECT_DOUBLE_EQ(p.i2, 0.0);
  EXPECT_NEAR(p.estimate, 0.5, 1e-15);
  const double se = 1.0 / std::sqrt(1.0 / 0.04 + 1.0 / 0.09 + 1.0 / 0.01);
  EXPECT_NEAR(p.ci.hi - p.estimate, 4.3026527297494619 * se, 1e-12);
  EXPECT_NEAR(p.ciHksj.hi - p.ciHksj.lo, 0.0, 1e-12);
}

TEST(RandomEffects, OneEstimateIsNotAPoolAndTwoHaveNoPredictionInterval) {
  const RandomEffectsOutcome one = poolRandomEffects({0.3}, {0.01});
  EXPECT_FALSE(one.pool.has_value());
  EXPECT_NE(one.problem.find("fewer than two"), std::string::npos);
  const RandomEffectsOutcome two = poolRandomEffects({0.3, 0.5}, {0.01, 0.02});
  ASSERT_TRUE(two.pool.has_value());
  EXPECT_FALSE(two.pool->predictionInterval.has_value());
}

}  // namespace
}  // namespace calivera
