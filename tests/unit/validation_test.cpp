// Properties and edge cases of validate() and its parts on simulated cohorts (each test checks a
// property, never a number taken from simulated data).
#include "core/metrics/validation.h"

#include <gtest/gtest.h>

#include <cmath>
#include <random>

#include "core/metrics/hosmer_lemeshow.h"
#include "core/metrics/loess_calibration.h"
#include "core/metrics/sorted_cohort.h"
#include "core/util/errors.h"

namespace calivera {
namespace {

// A cohort whose outcomes are drawn from its own risks: perfectly calibrated by construction.
ValidationInput calibratedCohort(unsigned seed, std::size_t n) {
  std::mt19937_64 generator(seed);
  std::normal_distribution<double> lp(-1.0, 1.2);
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  ValidationInput input;
  for (std::size_t i = 0; i < n; ++i) {
    const double p = 1.0 / (1.0 + std::exp(-lp(generator)));
    input.risk.push_back(p);
    input.outcome.push_back(unit(generator) < p ? 1.0 : 0.0);
  }
  return input;
}

ValidationOptions fewThresholds() {
  ValidationOptions options;
  options.thresholds = {0.1, 0.2, 0.5};
  return options;
}

TEST(ThresholdRange, GivesFromPlusKStepWithoutAccumulatedRounding) {
  const std::vector<double> t = thresholdRange(0.01, 0.99, 0.01);
  ASSERT_EQ(t.size(), 99u);
  EXPECT_EQ(t.front(), 0.01);
  EXPECT_EQ(t[6], 0.07);  // a running sum of 0.01 gives 0.06999999999999999
  EXPECT_EQ(t[28], 0.29);
  EXPECT_EQ(t.back(), 0.99);
  for (std::size_t k = 0; k < t.size(); ++k) EXPECT_NEAR(t[k], 0.01 + 0.01 * k, 1e-15);
  EXPECT_EQ(thresholdRange(0.05, 0.5, 0.05).size(), 10u);
  EXPECT_EQ(thresholdRange(0.2, 0.2, 0.1), std::vector<double>{0.2});
  EXPECT_THROW(thresholdRange(0.5, 0.1, 0.1), InputError);
  EXPECT_THROW(thresholdRange(0.1, 0.5, 0.0), InputError);
}

TEST(Validate, PerfectlyCalibratedCohortsHaveSlopeOneAndInterceptZeroWithinTheirIntervals) {
  int slopeCovered = 0, interceptCovered = 0;
  constexpr int kSeeds = 100;
  for (int seed = 1; seed <= kSeeds; ++seed) {
    const ValidationResult r =
        validate(calibratedCohort(static_cast<unsigned>(seed), 400), fewThresholds());
    const Calibration& c = r.calibration;
    slopeCovered += c.slopeCi.lo <= 1.0 && 1.0 <= c.slopeCi.hi;
    interceptCovered += c.interceptCi.lo <= 0.0 && 0.0 <= c.interceptCi.hi;
  }
  // Nominal 95% coverage; >= 90 of 100 fails with probability < 3% for a correct interval.
  EXPECT_GE(slopeCovered, 90);
  EXPECT_GE(interceptCovered, 90);
}

TEST(Validate, RankMeasuresAreInvariantToMonotoneTransformsOfRisk) {
  const ValidationInput a = calibratedCohort(11, 2000);
  ValidationInput b = a;
  for (double& p : b.risk) p = p * p * p;  // strictly increasing on [0, 1]
  const ValidationResult ra = validate(a, fewThresholds());
  const ValidationResult rb = validate(b, fewThresholds());
  EXPECT_DOUBLE_EQ(ra.discrimination.auc, rb.discrimination.auc);
  EXPECT_DOUBLE_EQ(ra.discrimination.aucSe, rb.discrimination.aucSe);
  ASSERT_EQ(ra.discrimination.roc.size(), rb.discrimination.roc.size());
  for (std::size_t i = 0; i < ra.discrimination.roc.size(); ++i) {
    EXPECT_DOUBLE_EQ(ra.discrimination.roc[i].tpr, rb.discrimination.roc[i].tpr);
    EXPECT_DOUBLE_EQ(ra.discrimination.roc[i].fpr, rb.discrimination.roc[i].fpr);
  }
}

TEST(Validate, AucEqualsMannWhitneyCountedPairByPair) {
  ValidationInput in = calibratedCohort(5, 300);
  for (double& p : in.risk) p = std::round(p * 20.0) / 20.0;  // many ties
  double wins = 0, pairs = 0;
  for (std::size_t i = 0; i < in.risk.size(); ++i) {
    for (std::size_t j = 0; j < in.risk.size(); ++j) {
      if (in.outcome[i] == 1.0 && in.outcome[j] == 0.0) {
        wins += in.risk[i] > in.risk[j] ? 1.0 : in.risk[i] == in.risk[j] ? 0.5 : 0.0;
        pairs += 1;
      }
    }
  }
  EXPECT_NEAR(validate(in, fewThresholds()).discrimination.auc, wins / pairs, 1e-14);
}

TEST(Validate, ThresholdRowsAndDecisionCurveAgreeWithDirectCounts) {
  const ValidationInput in = calibratedCohort(3, 1000);
  const ValidationResult r = validate(in, fewThresholds());
  for (std::size_t k = 0; k < 3; ++k) {
    const double t = r.thresholds[k].threshold;
    std::size_t tp = 0, fp = 0;
    for (std::size_t i = 0; i < in.risk.size(); ++i) {
      if (in.risk[i] >= t) ++(in.outcome[i] == 1.0 ? tp : fp);
    }
    EXPECT_EQ(r.thresholds[k].tp, tp);
    EXPECT_EQ(r.thresholds[k].fp, fp);
    const double n = static_cast<double>(in.risk.size());
    EXPECT_NEAR(r.decisionCurve[k].netBenefit, tp / n - fp / n * t / (1 - t), 1e-15);
    EXPECT_NEAR(r.thresholds[k].flaggedPer1000, 1000.0 * (tp + fp) / n, 1e-12);
  }
}

TEST(Validate, OneOutcomeClassIsAnAnalysisError) {
  ValidationInput in;
  in.risk = {0.1, 0.2, 0.3};
  in.outcome = {0, 0, 0};
  EXPECT_THROW(validate(in, fewThresholds()), AnalysisError);
  in.outcome = {1, 1, 1};
  EXPECT_THROW(validate(in, fewThresholds()), AnalysisError);
  EXPECT_THROW(validate(ValidationInput{}, fewThresholds()), AnalysisError);
}

TEST(Validate, BadInputIsAnInputError) {
  ValidationInput in = calibratedCohort(1, 50);
  in.risk[7] = 1.2;
  EXPECT_THROW(validate(in, fewThresholds()), InputError);
  in.risk[7] = std::nan("");
  EXPECT_THROW(validate(in, fewThresholds()), InputError);
  in = calibratedCohort(1, 50);
  in.outcome.pop_back();
  EXPECT_THROW(validate(in, fewThresholds()), InputError);
  ValidationOptions bad = fewThresholds();
  bad.thresholds = {0.0};
  EXPECT_THROW(validate(calibratedCohort(1, 50), bad), InputError);
}

TEST(Validate, WarnsAboutSmallSamplesAndRisksOfZeroOrOne) {
  ValidationInput in = calibratedCohort(2, 150);
  in.risk[0] = 0.0;
  in.risk[1] = 1.0;
  const ValidationResult r = validate(in, fewThresholds());
  const auto has = [&r](const std::string& text) {
    for (const std::string& w : r.warnings) {
      if (w.find(text) != std::string::npos) return true;
    }
    return false;
  };
  EXPECT_TRUE(has("fewer than 100 events"));
  EXPECT_TRUE(has("fewer than 200 events"));
  EXPECT_TRUE(has("exactly 0 or 1"));
  EXPECT_TRUE(std::isfinite(r.calibration.slope));
}

TEST(HosmerLemeshow, TiedRisksStayInOneGroupAndDfUsesTheGroupsFormed) {
  // Three distinct risks (100 patients each): the type-7 deciles are 0.1 (k = 0..3), 0.3
  // (k = 4..6) and 0.6 (k = 7..10); with the lowest interval closed, [0.1, 0.3] and (0.3, 0.6]
  // remain, as R's cut(..., include.lowest = TRUE) gives.
  std::vector<double> risk, y;
  for (int i = 0; i < 300; ++i) {
    risk.push_back(i < 100 ? 0.1 : i < 200 ? 0.3 : 0.6);
    y.push_back(i % 10 < (i < 100 ? 1 : i < 200 ? 3 : 6) ? 1.0 : 0.0);
  }
  std::vector<std::string> warnings;
  const HosmerLemeshow hl = hosmerLemeshow(sortCohort(risk, y), 10, false, warnings);
  ASSERT_EQ(hl.groups.size(), 2u);
  EXPECT_EQ(hl.groups[0].n, 200u);
  EXPECT_LT(hl.groups[0].riskHi, hl.groups[1].riskLo);  // no tie split between groups
  EXPECT_EQ(hl.df, 2);
  EXPECT_NEAR(hl.statistic, 0.0, 1e-12);  // observed equals expected in every group
  EXPECT_FALSE(warnings.empty());
  std::vector<std::string> apparentWarnings;
  EXPECT_TRUE(std::isnan(hosmerLemeshow(sortCohort(risk, y), 10, true, apparentWarnings).pValue));
}

TEST(LoessCalibration, GridInterpolationStaysCloseToTheExactFit) {
  // Moderate n where both are affordable: the interpolated curve's summaries against exact fits.
  const ValidationInput in = calibratedCohort(21, 8000);
  const SortedCohort sorted = sortCohort(in.risk, in.outcome);
  LoessOptions exact;
  exact.exactMaxN = 100000;
  LoessOptions grid;
  grid.exactMaxN = 1000;
  const LoessCalibration e = loessCalibration(sorted, exact);
  const LoessCalibration g = loessCalibration(sorted, grid);
  ASSERT_FALSE(e.interpolated);
  ASSERT_TRUE(g.interpolated);
  double maxError = 0.0;
  for (std::size_t i = 0; i < sorted.size(); ++i) {
    maxError = std::max(maxError, std::abs(e.smoothed[i] - g.smoothed[i]));
  }
  std::printf(
      "loess grid (%d points) vs exact at n = 8000: max |difference| %.3g, ICI %.6g vs %.6g\n",
      grid.gridPoints, maxError, g.ici, e.ici);
  EXPECT_LT(maxError, 1e-4);
  EXPECT_NEAR(g.ici, e.ici, 1e-5);
  EXPECT_NEAR(g.e90, e.e90, 1e-4);
}

}  // namespace
}  // namespace calivera

namespace calivera {
namespace {

// The block-moment evaluation of the local sums against the definition summed point by point
// (tricube over the q nearest, weighted quadratic solved directly), at n large enough that most
// of each window goes through the block path.
TEST(LoessCalibration, BlockMomentFitsEqualDirectLocalFits) {
  const ValidationInput in = calibratedCohort(8, 20000);
  const SortedCohort sorted = sortCohort(in.risk, in.outcome);
  const std::vector<double> y(sorted.event.begin(), sorted.event.end());
  const std::size_t n = sorted.size();
  const auto q = static_cast<std::size_t>(std::floor(0.75 * n));
  std::vector<double> at;
  for (int k = 0; k <= 20; ++k) at.push_back(quantileType7(sorted.risk, k / 20.0));
  at.push_back(0.5 * (at[3] + at[4]));  // a point between patients
  std::sort(at.begin(), at.end());
  bool singular = false;
  const std::vector<double> fitted = loessFitAt(sorted.risk, y, at, 0.75, &singular);
  EXPECT_FALSE(singular);
  for (std::size_t k = 0; k < at.size(); ++k) {
    std::vector<double> distance(n);
    for (std::size_t i = 0; i < n; ++i) distance[i] = std::abs(sorted.risk[i] - at[k]);
    std::vector<double> copy = distance;
    std::nth_element(copy.begin(), copy.begin() + static_cast<std::ptrdiff_t>(q - 1), copy.end());
    const double h = copy[q - 1];
    double m[5] = {}, r[3] = {};
    for (std::size_t i = 0; i < n; ++i) {
      if (distance[i] >= h) continue;
      const double w = std::pow(1.0 - std::pow(distance[i] / h, 3), 3);
      const double u = sorted.risk[i] - at[k];
      for (int j = 0; j < 5; ++j) m[j] += w * std::pow(u, j);
      for (int j = 0; j < 3; ++j) r[j] += w * y[i] * std::pow(u, j);
    }
    const double det = m[0] * (m[2] * m[4] - m[3] * m[3]) - m[1] * (m[1] * m[4] - m[3] * m[2]) +
                       m[2] * (m[1] * m[3] - m[2] * m[2]);
    const double b0 = (r[0] * (m[2] * m[4] - m[3] * m[3]) - m[1] * (r[1] * m[4] - m[3] * r[2]) +
                       m[2] * (r[1] * m[3] - m[2] * r[2])) /
                      det;  // Cramer's rule for the constant term
    EXPECT_NEAR(fitted[k], b0, 1e-9) << "x0 = " << at[k];
  }
}

}  // namespace
}  // namespace calivera

namespace calivera {
namespace {

// One event (issue 11): the AUC's DeLong variance cannot be estimated, so no SE and no interval
// are reported, and a warning says why (the point estimate, a proportion of ordered pairs, stays).
TEST(Validate, OneEventGivesNoAucInterval) {
  ValidationInput in;
  for (int i = 0; i < 40; ++i) {
    in.risk.push_back(0.01 + 0.02 * i);
    in.outcome.push_back(i == 30 ? 1.0 : 0.0);
  }
  ValidationOptions options;
  options.thresholds = {0.1, 0.5};
  const ValidationResult r = validate(in, options);
  EXPECT_DOUBLE_EQ(r.discrimination.auc, 30.0 / 39.0);  // 30 of the 39 non-events rank lower
  EXPECT_TRUE(std::isnan(r.discrimination.aucSe));
  EXPECT_TRUE(std::isnan(r.discrimination.aucCi.lo) && std::isnan(r.discrimination.aucCi.hi));
  EXPECT_TRUE(std::isnan(r.discrimination.aucCiPlain.lo));
  bool said = false;
  for (const std::string& w : r.warnings) said = said || w.find("AUC interval not estimable") == 0;
  EXPECT_TRUE(said);
}

}  // namespace
}  // namespace calivera
