// Small-cell suppression (core/report/audit_suppression.h): primary cells, complementary cells
// per published equation, all-or-none groups, and the report-wide plan (audit_disclosure.h).
// Properties are checked directly: after solving, no relation holds exactly one hidden cell.
#include "core/report/audit_suppression.h"

#include <gtest/gtest.h>

#include <random>

#include "core/report/audit_disclosure.h"

namespace calivera {
namespace {

using S = CellState;

TEST(AuditSuppression, OffBelowTwoHidesNothing) {
  SuppressionProblem problem;
  const auto a = problem.addCell(1);
  const auto b = problem.addCell(3);
  problem.addRelation({a, b});
  for (const std::size_t below : {0u, 1u}) {
    EXPECT_EQ(problem.solve(below), (std::vector<CellState>{S::Shown, S::Shown}));
  }
}

TEST(AuditSuppression, PrimaryIsOneToNMinusOneAndZeroStaysVisible) {
  SuppressionProblem problem;
  for (const std::size_t count : {0u, 1u, 4u, 5u, 100u}) problem.addCell(count);
  EXPECT_EQ(problem.solve(5),
            (std::vector<CellState>{S::Shown, S::Primary, S::Primary, S::Shown, S::Shown}));
}

TEST(AuditSuppression, FormatsPrimaryComplementaryAndShown) {
  EXPECT_EQ(formatSuppressedCount(3, S::Primary, 5), "<5");
  EXPECT_EQ(formatSuppressedCount(40, S::Complementary, 5), kComplementaryMark);
  EXPECT_EQ(formatSuppressedCount(40, S::Shown, 5), "40");
  EXPECT_EQ(formatSuppressedCount(0, S::Shown, 5), "0");
}

TEST(AuditSuppression, RowWithKnownTotalHidesAComplement) {
  // events + non-events = n with n published: hiding events alone would leave n - non-events.
  SuppressionProblem problem;
  const auto n = problem.addCell(120, /*keepVisible=*/true);
  const auto events = problem.addCell(3);
  const auto nonEvents = problem.addCell(117);
  problem.addRelation({events, nonEvents, n});
  EXPECT_EQ(problem.solve(5), (std::vector<CellState>{S::Shown, S::Primary, S::Complementary}));
}

TEST(AuditSuppression, ComplementIsSmallestPositiveNotZero) {
  // Hiding the zero would leak: the residual 3 < 5 with a zero complement pins the hidden cell.
  SuppressionProblem problem;
  const auto a = problem.addCell(3);
  const auto zero = problem.addCell(0);
  const auto big = problem.addCell(50);
  const auto bigger = problem.addCell(70);
  problem.addRelation({a, zero, big, bigger});
  const auto states = problem.solve(5);
  EXPECT_EQ(states[a], S::Primary);
  EXPECT_EQ(states[zero], S::Shown);
  EXPECT_EQ(states[big], S::Complementary);
  EXPECT_EQ(states[bigger], S::Shown);
}

TEST(AuditSuppression, KeepVisibleCellIsTheLastResort) {
  SuppressionProblem problem;
  const auto read = problem.addCell(203);
  const auto excluded = problem.addCell(3);
  const auto analysed = problem.addCell(200, /*keepVisible=*/true);
  problem.addRelation({read, excluded, analysed});
  const auto states = problem.solve(5);
  EXPECT_EQ(states[excluded], S::Primary);
  EXPECT_EQ(states[read], S::Complementary);
  EXPECT_EQ(states[analysed], S::Shown);

  SuppressionProblem onlyChoice;
  const auto small = onlyChoice.addCell(2);
  const auto kept = onlyChoice.addCell(90, /*keepVisible=*/true);
  onlyChoice.addRelation({small, kept});
  EXPECT_EQ(onlyChoice.solve(5)[kept], S::Complementary);
}

TEST(AuditSuppression, AllOrNoneHidesTheWholeConfusionRow) {
  SuppressionProblem problem;
  const auto tp = problem.addCell(2);
  const auto fp = problem.addCell(40);
  const auto fn = problem.addCell(60);
  const auto tn = problem.addCell(300);
  problem.addAllOrNone({tp, fp, fn, tn});
  EXPECT_EQ(problem.solve(5), (std::vector<CellState>{S::Primary, S::Complementary,
                                                      S::Complementary, S::Complementary}));
  EXPECT_EQ(problem.solve(2), (std::vector<CellState>(4, S::Shown)));
}

TEST(AuditSuppression, SecondarySuppressionCascadesAcrossTables) {
  // Two-way table: rows g with totals, columns adding to published totals. A hidden cell in row
  // 0 forces a complement in row 0, which then forces one in its column, and so on.
  SuppressionProblem problem;
  const auto e0 = problem.addCell(2), ne0 = problem.addCell(18), n0 = problem.addCell(20);
  const auto e1 = problem.addCell(10), ne1 = problem.addCell(10), n1 = problem.addCell(20);
  const auto e2 = problem.addCell(30), ne2 = problem.addCell(50), n2 = problem.addCell(80);
  problem.addRelation({e0, ne0, n0});
  problem.addRelation({e1, ne1, n1});
  problem.addRelation({e2, ne2, n2});
  problem.addRelation({e0, e1, e2});
  problem.addRelation({ne0, ne1, ne2});
  problem.addRelation({n0, n1, n2});
  const auto states = problem.solve(5);
  EXPECT_EQ(states[e0], S::Primary);
  // Every relation now has zero or at least two hidden cells.
  for (const auto& relation : std::vector<std::vector<std::size_t>>{{e0, ne0, n0},
                                                                    {e1, ne1, n1},
                                                                    {e2, ne2, n2},
                                                                    {e0, e1, e2},
                                                                    {ne0, ne1, ne2},
                                                                    {n0, n1, n2}}) {
    int hidden = 0;
    for (const auto cell : relation) hidden += isHidden(states[cell]) ? 1 : 0;
    EXPECT_NE(hidden, 1);
  }
}

TEST(AuditSuppression, RandomTablesNeverLeaveASingleHiddenCellInARelation) {
  // Property test on simulated two-way tables with all margins published.
  std::mt19937 rng(20261201);
  std::uniform_int_distribution<int> countDist(0, 30);
  for (int trial = 0; trial < 300; ++trial) {
    const int rows = 2 + trial % 5, cols = 2 + (trial / 5) % 4;
    SuppressionProblem problem;
    std::vector<std::vector<std::size_t>> cell(rows, std::vector<std::size_t>(cols));
    for (auto& row : cell) {
      for (auto& c : row) c = problem.addCell(static_cast<std::size_t>(countDist(rng)));
    }
    std::vector<std::vector<std::size_t>> relations;
    for (int r = 0; r < rows; ++r) relations.push_back(cell[r]);
    for (int c = 0; c < cols; ++c) {
      std::vector<std::size_t> column;
      for (int r = 0; r < rows; ++r) column.push_back(cell[r][c]);
      relations.push_back(column);
    }
    for (const auto& relation : relations) problem.addRelation(relation);
    const auto states = problem.solve(10);
    for (std::size_t i = 0; i < problem.cellCount(); ++i) {
      const std::size_t count = problem.count(i);
      EXPECT_EQ(states[i] == S::Primary, count >= 1 && count < 10);
    }
    for (const auto& relation : relations) {
      int hidden = 0;
      for (const auto c : relation) hidden += isHidden(states[c]) ? 1 : 0;
      EXPECT_NE(hidden, 1) << "trial " << trial;
    }
  }
}

TEST(AuditSuppression, RelationNamingNoCellIsAProgrammerError) {
  SuppressionProblem problem;
  problem.addCell(1);
  EXPECT_THROW(problem.addRelation({0, 7}), std::out_of_range);
  EXPECT_THROW(problem.addAllOrNone({3, 0}), std::out_of_range);
}

TEST(AuditSuppression, SmallNumbersInWarningTextAreHidden) {
  EXPECT_EQ(suppressSmallNumbersInText("3 of 200 rows excluded; 12 risks of exactly 0", 5),
            "<5 of 200 rows excluded; 12 risks of exactly 0");
  EXPECT_EQ(suppressSmallNumbersInText("slope 0.8 at 1.5, 4 rows, 12,003 rows", 5),
            "slope 0.8 at 1.5, <5 rows, 12,003 rows");
  EXPECT_EQ(suppressSmallNumbersInText("line 7", 0), "line 7");
  EXPECT_EQ(suppressSmallNumbersInText("10 events", 11), "<11 events");
}

ValidationResult smallResult() {
  ValidationResult result;
  result.cohort.n = 200;
  result.cohort.events = 60;
  result.cohort.prevalence = 0.3;
  CalibrationGroup g1;
  g1.n = 100;
  g1.observed = 3;  // primary
  CalibrationGroup g2;
  g2.n = 100;
  g2.observed = 57;
  result.hosmerLemeshow.groups = {g1, g2};
  result.distribution.binEdges = {0.0, 0.5, 1.0};
  result.distribution.eventCounts = {2, 58};  // bin 0 primary
  result.distribution.nonEventCounts = {120, 20};
  ThresholdRow row;
  row.threshold = 0.9;
  row.tp = 4;
  row.fp = 1;
  row.fn = 56;
  row.tn = 139;
  ThresholdRow safe;
  safe.threshold = 0.3;
  safe.tp = 50;
  safe.fp = 30;
  safe.fn = 10;
  safe.tn = 110;
  result.thresholds = {safe, row};
  result.decisionCurve = {DecisionCurvePoint{0.3, 0.1, 0.0, 0.0, 0.0},
                          DecisionCurvePoint{0.9, 0.01, 0.0, 0.0, 0.0}};
  result.discrimination.roc = {RocPoint{1.0, 0.0, 0.0}, RocPoint{0.9, 1.0 / 140, 4.0 / 60},
                               RocPoint{0.3, 30.0 / 140, 50.0 / 60}, RocPoint{0.0, 1.0, 1.0}};
  return result;
}

TEST(AuditDisclosure, HidesGroupCountsWithComplementsAndDerivedFigures) {
  const ValidationResult result = smallResult();
  ExclusionReport exclusions;
  exclusions.rowsRead = 203;
  exclusions.rowsExcluded = 3;
  exclusions.rowsAnalysed = 200;
  exclusions.byColumn = {ColumnExclusion{"age", 3}};
  const DisclosurePlan plan(result, exclusions, result.thresholds, 5);
  EXPECT_TRUE(plan.anyHidden());
  EXPECT_EQ(plan.rowsExcluded(), "<5");
  EXPECT_EQ(plan.excludedByColumn(0), "<5");
  EXPECT_EQ(plan.rowsRead(), "s");  // complement; n stays visible
  EXPECT_EQ(plan.rowsAnalysed(), "200");
  EXPECT_EQ(plan.groupEvents(0), "<5");
  // Group 0: 3 events + 97 non-events = 100: a complement in the row, and the events column
  // (adding up to the 60 events) needs a second hidden cell.
  int hiddenInRow = (plan.groupN(0) == "s") + (plan.groupNonEvents(0) == "s");
  EXPECT_GE(hiddenInRow, 1);
  EXPECT_TRUE(plan.groupProportionHidden(0));
  EXPECT_NE(plan.groupEvents(1), "57");  // the events column's complement
  // Threshold row 0.9 (TP 4, FP 1) is hidden entirely; row 0.3 is shown.
  EXPECT_FALSE(plan.rowHidden(0));
  EXPECT_EQ(plan.rowTp(0), "50");
  EXPECT_TRUE(plan.rowHidden(1));
  EXPECT_EQ(plan.rowTp(1), "<5");
  EXPECT_EQ(plan.rowFp(1), "<5");
  EXPECT_EQ(plan.rowFn(1), "s");
  EXPECT_EQ(plan.rowTn(1), "s");

  const ValidationResult chart = plan.chartData(result);
  EXPECT_EQ(chart.distribution.eventCounts[0], 0u);
  EXPECT_EQ(chart.distribution.eventCounts[1], 0u);  // complement within the event series
  EXPECT_EQ(chart.distribution.nonEventCounts[0], 120u);
  EXPECT_EQ(plan.hiddenBins(), 2u);
  ASSERT_EQ(chart.decisionCurve.size(), 1u);
  EXPECT_DOUBLE_EQ(chart.decisionCurve[0].threshold, 0.3);
  ASSERT_EQ(chart.discrimination.roc.size(), 3u);  // the point with TP 4, FP 1 is left out
  EXPECT_DOUBLE_EQ(chart.discrimination.roc[1].threshold, 0.3);
  EXPECT_TRUE(chart.hosmerLemeshow.groups.empty() || chart.hosmerLemeshow.groups.size() == 1u);
}

TEST(AuditDisclosure, OffShowsEverything) {
  const ValidationResult result = smallResult();
  ExclusionReport exclusions;
  exclusions.rowsRead = 200;
  exclusions.rowsAnalysed = 200;
  const DisclosurePlan plan(result, exclusions, result.thresholds, 0);
  EXPECT_FALSE(plan.anyHidden());
  EXPECT_EQ(plan.groupEvents(0), "3");
  EXPECT_EQ(plan.rowTp(1), "4");
  const ValidationResult chart = plan.chartData(result);
  EXPECT_EQ(chart.discrimination.roc.size(), 4u);
  EXPECT_EQ(chart.decisionCurve.size(), 2u);
  EXPECT_EQ(chart.distribution.eventCounts[0], 2u);
}

}  // namespace
}  // namespace calivera
