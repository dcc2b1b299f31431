// Subgroup metrics equal the metrics computed on each subset alone; small subgroups warned.
#include "core/uncertainty/subgroups.h"

#include <gtest/gtest.h>

#include <random>

namespace calivera {
namespace {

struct Simulated {
  ValidationInput input;
  std::vector<std::string> labels;
};

Simulated simulate(std::size_t n) {
  std::mt19937_64 generator(5);
  std::normal_distribution<double> normal;
  std::uniform_real_distribution<double> uniform;
  Simulated s;
  std::vector<double> lp;
  const char* sites[] = {"north", "south", "east"};
  for (std::size_t i = 0; i < n; ++i) {
    const std::size_t site = i % 3;
    const double l = -1.0 + normal(generator) + 0.3 * static_cast<double>(site);
    lp.push_back(l);
    const double p = 1.0 / (1.0 + std::exp(-l));
    s.input.risk.push_back(p);
    s.input.outcome.push_back(uniform(generator) < p * (site == 1 ? 0.7 : 1.0) ? 1.0 : 0.0);
    s.labels.push_back(i % 97 == 0 ? kMissingLevel : sites[site]);
  }
  s.input.linearPredictor = lp;
  return s;
}

TEST(Subgroups, EachLevelEqualsValidatingItsSubsetAlone) {
  const Simulated s = simulate(3000);
  ValidationBootstrapOptions bootstrap;
  bootstrap.bootstrap.replicates = 20;
  bootstrap.bootstrap.seed = 3;
  const SubgroupAnalysis a = validateSubgroups("site", s.labels, s.input, {}, bootstrap);
  ASSERT_EQ(a.levels.size(), 4u);
  EXPECT_EQ(a.levels.back().level, kMissingLevel);
  std::size_t total = 0;
  for (const SubgroupResult& level : a.levels) {
    total += level.n;
    ValidationInput subset;
    std::vector<double> lp;
    for (std::size_t i = 0; i < s.labels.size(); ++i) {
      if (s.labels[i] != level.level) continue;
      subset.outcome.push_back(s.input.outcome[i]);
      subset.risk.push_back(s.input.risk[i]);
      lp.push_back((*s.input.linearPredictor)[i]);
    }
    subset.linearPredictor = lp;
    ASSERT_EQ(level.n, subset.outcome.size());
    if (!level.metrics) continue;
    const ValidationResult alone = validate(subset, {});
    EXPECT_EQ(level.metrics->discrimination.auc, alone.discrimination.auc) << level.level;
    EXPECT_EQ(level.metrics->calibration.slope, alone.calibration.slope) << level.level;
    EXPECT_EQ(level.metrics->calibration.intercept, alone.calibration.intercept);
    EXPECT_EQ(level.metrics->calibration.oeRatio, alone.calibration.oeRatio);
    EXPECT_EQ(level.metrics->calibration.ici, alone.calibration.ici);
    EXPECT_EQ(level.metrics->overall.brier, alone.overall.brier);
    ValidationBootstrap subsetBootstrap = bootstrapValidation(subset, {}, alone, bootstrap);
    ASSERT_TRUE(level.bootstrap);
    EXPECT_EQ(level.bootstrap->auc.ci.lo, subsetBootstrap.auc.ci.lo);
    EXPECT_EQ(level.bootstrap->calibrationSlope.ci.hi, subsetBootstrap.calibrationSlope.ci.hi);
  }
  EXPECT_EQ(total, 3000u);  // nobody dropped, missing labels included
}

TEST(Subgroups, ProgressRunsOnceFromZeroToOneOverAllLevels) {
  const Simulated s = simulate(3000);
  ValidationBootstrapOptions bootstrap;
  bootstrap.bootstrap.replicates = 20;
  bootstrap.bootstrap.threads = 1;
  std::vector<double> seen;
  bootstrap.bootstrap.progress = [&](double f) {
    seen.push_back(f);
    return true;
  };
  validateSubgroups("site", s.labels, s.input, {}, bootstrap);
  ASSERT_FALSE(seen.empty());
  for (std::size_t i = 1; i < seen.size(); ++i) EXPECT_GE(seen[i], seen[i - 1] - 1e-12) << i;
  EXPECT_DOUBLE_EQ(seen.back(), 1.0);
}

TEST(Subgroups, SmallOrOneClassLevelsAreWarnedNotDropped) {
  ValidationInput input;
  std::vector<std::string> labels;
  for (int i = 0; i < 400; ++i) {
    const bool tiny = i < 10;
    input.risk.push_back(0.1 + 0.8 * (i % 10) / 10.0);
    input.outcome.push_back(tiny ? 0.0 : (i % 3 == 0 ? 1.0 : 0.0));
    labels.push_back(tiny ? "tiny" : "large");
  }
  const SubgroupAnalysis a = validateSubgroups("g", labels, input, {}, {});
  ASSERT_EQ(a.levels.size(), 2u);
  const SubgroupResult& tiny = a.levels[1].level == "tiny" ? a.levels[1] : a.levels[0];
  EXPECT_TRUE(tiny.tooSmall);
  EXPECT_FALSE(tiny.metrics);  // one outcome class
  EXPECT_EQ(tiny.n, 10u);
  EXPECT_GE(tiny.warnings.size(), 2u);
}

TEST(Subgroups, NumericLevelsSortNumerically) {
  ValidationInput input;
  std::vector<std::string> labels;
  for (int i = 0; i < 60; ++i) {
    input.risk.push_back(0.2 + 0.01 * i);
    input.outcome.push_back(i % 2);
    labels.push_back(std::to_string(i % 3 == 0 ? 10 : (i % 3 == 1 ? 9 : 100)));
  }
  const SubgroupAnalysis a = validateSubgroups("band", labels, input, {}, {});
  ASSERT_EQ(a.levels.size(), 3u);
  EXPECT_EQ(a.levels[0].level, "9");
  EXPECT_EQ(a.levels[1].level, "10");
  EXPECT_EQ(a.levels[2].level, "100");
}

}  // namespace
}  // namespace calivera
