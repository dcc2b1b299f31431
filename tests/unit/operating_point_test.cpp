// The one operating point (core/metrics/operating_point.h) against the threshold table and the
// decision curve of a real run (MASS::birthwt from Debian r-cran-mass), and its single behaviour
// at t = 0, t = 1 and outside (0, 1). The numbers compared are the run's own (two routes through
// core), so no reference value is involved; the net-benefit formula is checked by hand below
// (Vickers & Elkin, Med Decis Making 2006: NB = TP/n - FP/n * t/(1-t)).
#include "core/metrics/operating_point.h"

#include <gtest/gtest.h>

#include <cmath>

#include "core/metrics/threshold_index.h"
#include "core/study/threshold_state.h"
#include "tests/unit/birthwt_run.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

void expectSameOrBothNaN(double a, double b) {
  if (std::isnan(a) || std::isnan(b)) {
    EXPECT_TRUE(std::isnan(a) && std::isnan(b)) << a << " vs " << b;
  } else {
    EXPECT_EQ(a, b);
  }
}

TEST(OperatingPoint, EqualsTheTableAndTheCurveAtEveryGridThreshold) {
  testing::TempDir dir("operating_point");
  const std::string model = dir.file("m.json");
  testing::writeBirthwtModel(model, {"age", "lwt", "smoke", "ht"}, "birthwt four terms");
  const ValidationRun run = testing::birthwtRun(model);
  const ThresholdIndex index(run.cohort.input.risk, run.cohort.input.outcome);
  ASSERT_EQ(run.result.thresholds.size(), run.result.decisionCurve.size());
  for (std::size_t i = 0; i < run.result.thresholds.size(); ++i) {
    const ThresholdRow& row = run.result.thresholds[i];
    const DecisionCurvePoint& point = run.result.decisionCurve[i];
    const OperatingPoint p = operatingPointAt(row.threshold, index.countsAt(row.threshold));
    EXPECT_EQ(p.row.tp, row.tp);
    EXPECT_EQ(p.row.fp, row.fp);
    EXPECT_EQ(p.row.tn, row.tn);
    EXPECT_EQ(p.row.fn, row.fn);
    expectSameOrBothNaN(p.row.sensitivity, row.sensitivity);
    expectSameOrBothNaN(p.row.ppv, row.ppv);
    expectSameOrBothNaN(p.row.flaggedPer1000, row.flaggedPer1000);
    expectSameOrBothNaN(p.decision.netBenefit, point.netBenefit);
    expectSameOrBothNaN(p.decision.netBenefitTreatAll, point.netBenefitTreatAll);
    // The workstation's slider reads the same function.
    const ThresholdSnapshot s = snapshotFromCounts(row.threshold, index.countsAt(row.threshold));
    expectSameOrBothNaN(s.netBenefit, point.netBenefit);
    expectSameOrBothNaN(s.sensitivity, row.sensitivity);
    expectSameOrBothNaN(s.eventsMissedPer1000, row.eventsMissedPer1000);
  }
}

TEST(OperatingPoint, NetBenefitByHandAtOneHalf) {
  // 30 events, 70 non-events; at t = 0.5 the odds are 1: NB = 20/100 - 10/100 = 0.10, treat all
  // = 0.30 - 0.70 = -0.40.
  const OperatingPoint p = operatingPointAt(0.5, ConfusionCounts{20, 10, 60, 10});
  EXPECT_DOUBLE_EQ(p.decision.netBenefit, 0.10);
  EXPECT_DOUBLE_EQ(p.decision.netBenefitTreatAll, -0.40);
  EXPECT_DOUBLE_EQ(p.row.sensitivity, 20.0 / 30.0);
  EXPECT_DOUBLE_EQ(p.falsePositiveRate, 10.0 / 70.0);
  EXPECT_DOUBLE_EQ(p.row.flaggedPer1000, 300.0);
}

TEST(OperatingPoint, OutsideTheOpenIntervalNetBenefitIsNotDefined) {
  const ConfusionCounts everyone{30, 70, 0, 0};
  for (const double t : {0.0, 1.0, -0.2, 1.5}) {
    const OperatingPoint p = operatingPointAt(t, everyone);
    EXPECT_TRUE(std::isnan(p.decision.netBenefit)) << t;
    EXPECT_TRUE(std::isnan(p.decision.netBenefitTreatAll)) << t;
    EXPECT_EQ(p.row.tp, 30u);  // counts stay defined
    EXPECT_DOUBLE_EQ(p.row.sensitivity, 1.0);
    const ThresholdSnapshot s = snapshotFromCounts(t, everyone);
    EXPECT_TRUE(std::isnan(s.netBenefit)) << t;
  }
  EXPECT_FALSE(netBenefitDefinedAt(0.0));
  EXPECT_TRUE(netBenefitDefinedAt(0.01));
  // An empty cohort: every ratio and net benefit not defined.
  const OperatingPoint empty = operatingPointAt(0.2, ConfusionCounts{});
  EXPECT_TRUE(std::isnan(empty.row.sensitivity));
  EXPECT_TRUE(std::isnan(empty.decision.netBenefit));
}

}  // namespace
}  // namespace calivera
