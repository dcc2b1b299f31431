// Metric functions against published worked examples (values and provenance marks as listed in
// docs/methods.md; "read" = read in the source, "computed" = recomputed from the formula,
// "memory" = recalled).
#include <gtest/gtest.h>

#include <cmath>
#include <vector>

#include "core/metrics/auc_delong.h"
#include "core/metrics/calibration_statistics.h"
#include "core/metrics/decision_curve.h"
#include "core/metrics/overall_metrics.h"
#include "core/metrics/proportion_ci.h"
#include "core/metrics/roc_curve.h"
#include "core/metrics/sorted_cohort.h"

namespace calivera {
namespace {

// Tolerances: half a unit in the last printed digit of each published value.
constexpr double kFourDecimals = 0.5e-4;
constexpr double kSixDecimals = 0.5e-6;
constexpr double kThreeDecimals = 0.5e-3;
constexpr double kTwoDecimals = 0.5e-2;

void append(std::vector<double>& risk, std::vector<double>& y, double r, int outcome, int count) {
  for (int i = 0; i < count; ++i) {
    risk.push_back(r);
    y.push_back(outcome);
  }
}

// Hanley & McNeil, Radiology 1982;143:29-36, rating example: 58 non-diseased with ratings 1..5
// counted 33,6,6,11,2 and 51 diseased counted 3,2,2,11,33 (table memory; AUC and SE computed and
// matching the paper's printed 0.893 / 0.032). Ratings are mapped to risks r/6 (monotone; AUC is
// rank based).
SortedCohort hanleyMcNeilCohort() {
  std::vector<double> risk, y;
  const int healthy[] = {33, 6, 6, 11, 2};
  const int diseased[] = {3, 2, 2, 11, 33};
  for (int rating = 1; rating <= 5; ++rating) {
    append(risk, y, rating / 6.0, 0, healthy[rating - 1]);
    append(risk, y, rating / 6.0, 1, diseased[rating - 1]);
  }
  return sortCohort(risk, y);
}

TEST(PublishedHanleyMcNeil, AucDelongSeAndBothIntervals) {
  const AucEstimate e = aucWithDelong(hanleyMcNeilCohort());
  EXPECT_NEAR(e.auc, 0.8932, kFourDecimals);         // docs/methods.md: computed, matches paper's 0.893
  EXPECT_NEAR(e.se, 0.030724, kSixDecimals);         // docs/methods.md: DeLong SE, computed
  EXPECT_NEAR(e.ciLogit.lo, 0.816, kThreeDecimals);  // docs/methods.md: computed
  EXPECT_NEAR(e.ciLogit.hi, 0.940, kThreeDecimals);
  EXPECT_NEAR(e.ciPlain.lo, 0.833, kThreeDecimals);
  EXPECT_NEAR(e.ciPlain.hi, 0.953, kThreeDecimals);
}

TEST(PublishedHanleyMcNeil, ComponentsReproduceTheEstimateAndTheRocArea) {
  const SortedCohort cohort = hanleyMcNeilCohort();
  const DelongPlacements c = delongPlacements(cohort);
  const AucEstimate e = aucWithDelong(cohort);
  ASSERT_EQ(c.v10.size(), 51u);
  ASSERT_EQ(c.v01.size(), 58u);
  double mean10 = 0, mean01 = 0;
  for (double v : c.v10) mean10 += v / 51.0;
  for (double v : c.v01) mean01 += v / 58.0;
  EXPECT_NEAR(mean10, e.auc, 1e-12);
  EXPECT_NEAR(mean01, e.auc, 1e-12);
  EXPECT_NEAR(std::sqrt(c.variance), e.se, 1e-12);
  EXPECT_NEAR(areaUnderCurve(rocCurve(cohort)), e.auc, 1e-12);
}

// Newcombe, Stat Med 1998;17:857-72 cases (cases memory, intervals computed; docs/methods.md).
TEST(PublishedNewcombe, WilsonIntervals) {
  const struct {
    std::size_t k, n;
    double lo, hi;
  } cases[] = {{81, 263, 0.2553, 0.3662},
               {15, 148, 0.0624, 0.1605},
               {0, 20, 0.0, 0.1611},
               {1, 29, 0.0061, 0.1718}};
  for (const auto& c : cases) {
    const Interval ci = wilsonInterval(c.k, c.n);
    EXPECT_NEAR(ci.lo, c.lo, kFourDecimals) << c.k << "/" << c.n;
    EXPECT_NEAR(ci.hi, c.hi, kFourDecimals) << c.k << "/" << c.n;
  }
  EXPECT_EQ(wilsonInterval(0, 20).lo, 0.0);
}

TEST(PublishedNewcombe, ClopperPearson81Of263) {
  const Interval ci = clopperPearsonInterval(81, 263);
  EXPECT_NEAR(ci.lo, 0.2527, kFourDecimals);  // docs/methods.md: computed
  EXPECT_NEAR(ci.hi, 0.3676, kFourDecimals);
  EXPECT_EQ(clopperPearsonInterval(0, 20).lo, 0.0);
  EXPECT_EQ(clopperPearsonInterval(20, 20).hi, 1.0);
}

// Rufibach, J Clin Epidemiol 2010;63:938 (read, recomputed; docs/methods.md): y = (1, 0).
TEST(PublishedRufibach, BrierAndSpiegelhalter) {
  const std::vector<double> y{1, 0};
  const std::vector<double> p1{0.2, 0.2};
  const std::vector<double> p2{0.4, 0.5};
  EXPECT_NEAR(brierScores(p1, y).brier, 0.34, kTwoDecimals / 10);
  EXPECT_NEAR(spiegelhalter(p1, y).z, 1.06, kTwoDecimals);
  EXPECT_NEAR(brierScores(p2, y).brier, 0.305, kThreeDecimals);
  EXPECT_NEAR(spiegelhalter(p2, y).z, 1.22, kTwoDecimals);
  // Two-sided normal p of z = 1.96 is 0.05 (standard normal table).
  EXPECT_NEAR(twoSidedNormalP(1.959963984540054), 0.05, 1e-12);
}

// Vickers, van Calster & Steyerberg, Diagn Progn Res 2019;3:18, worked table with prevalence 0.30
// (read; docs/methods.md). The table gives NB values per threshold, not the cohort, so a cohort of 1000
// patients (300 events) is built whose flagged counts reproduce the model's NB exactly:
// t = 0.10: TP 290, FP 441 (0.290 - 441/9000 = 0.241); t = 0.20: TP 250, FP 176
// (0.250 - 176/4000 = 0.206); t = 0.50: TP 150, FP 15 (0.150 - 0.015 = 0.135). The check is that
// the decision curve reproduces the table's treat-all NB and interventions avoided from the
// counts, with the flag-risk->=t convention.
TEST(PublishedVickers2019, DecisionCurveWorkedTable) {
  std::vector<double> risk, y;
  append(risk, y, 0.60, 1, 150);
  append(risk, y, 0.60, 0, 15);
  append(risk, y, 0.30, 1, 100);
  append(risk, y, 0.30, 0, 161);
  append(risk, y, 0.15, 1, 40);
  append(risk, y, 0.15, 0, 265);
  append(risk, y, 0.05, 1, 10);
  append(risk, y, 0.05, 0, 259);
  ASSERT_EQ(risk.size(), 1000u);
  const auto curve = decisionCurve(sortCohort(risk, y), {0.10, 0.20, 0.50});
  const struct {
    double all, model, avoided;
  } table[] = {{0.222, 0.241, 17}, {0.125, 0.206, 32}, {-0.400, 0.135, 54}};
  for (int i = 0; i < 3; ++i) {
    EXPECT_NEAR(curve[i].netBenefitTreatAll, table[i].all, kThreeDecimals);
    EXPECT_NEAR(curve[i].netBenefit, table[i].model, kThreeDecimals);
    // Avoided per 100 is printed as a whole number; the table's model NB is itself rounded to
    // three decimals, so allow rounding of both.
    EXPECT_NEAR(curve[i].interventionsAvoidedPer100, table[i].avoided, 0.5 + 1e-9);
    EXPECT_NEAR(curve[i].standardizedNetBenefit, curve[i].netBenefit / 0.30, 1e-12);
  }
}

}  // namespace
}  // namespace calivera
