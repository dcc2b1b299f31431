// Chart details a reader relies on: on screen, every legend label is shown whole (wrapping onto
// more rows on a narrow chart) and helper series stay out of it; the decision curve drops its range
// entry when no range was chosen, axis labels are distinct, and the calibration histogram stays
// within the plotted risk range.
#include <QtCharts/QAreaSeries>
#include <QtCharts/QLegend>
#include <QtCharts/QLegendMarker>
#include <QtCharts/QLineSeries>
#include <QtCharts/QValueAxis>
#include <QtTest>

#include "render/charts/calibration_chart.h"
#include "render/charts/decision_curve_chart.h"
#include "ui/views/chart_panel.h"
#include "ui/views/legend_strip.h"

using namespace calivera;
using namespace calivera::ui;

namespace {

std::vector<DecisionCurvePoint> curveTo(double lastThreshold) {
  std::vector<DecisionCurvePoint> curve;
  for (double t = 0.05; t <= lastThreshold + 1e-9; t += 0.05) {
    DecisionCurvePoint p;
    p.threshold = t;
    p.netBenefit = 0.1 - t / 4;
    p.netBenefitTreatAll = 0.1 - t;
    curve.push_back(p);
  }
  return curve;
}

// Every legend entry (markers report isVisible() false until the chart is shown on screen).
QStringList legendLabels(QChart& chart) {
  QStringList labels;
  for (QLegendMarker* m : chart.legend()->markers()) labels << m->label();
  return labels;
}

}  // namespace

class ChartLegendTest : public QObject {
  Q_OBJECT

 private slots:
  void reasonableRangeLeavesTheLegendWhenCleared() {
    charts::DecisionCurveChart chart(curveTo(1.0), CohortSummary{1000, 100, 0.1, false});
    chart.setReasonableRange(0.05, 0.3);
    QVERIFY(legendLabels(chart).contains("Reasonable range"));
    chart.clearReasonableRange();
    QVERIFY(!legendLabels(chart).contains("Reasonable range"));
    QVERIFY(legendLabels(chart).contains("Model"));
    chart.setReasonableRange(0.1, 0.2);  // ignored once cleared, and no crash
  }

  void shortThresholdRangeHasDistinctTickLabels() {
    charts::DecisionCurveChart chart(curveTo(0.3), CohortSummary{1000, 100, 0.1, false});
    auto* x = qobject_cast<QValueAxis*>(chart.axes(Qt::Horizontal).first());
    QVERIFY(x != nullptr);
    QCOMPARE(x->max(), 0.3);
    // Ticks every 0.05 printed with two decimals (one decimal printed 0.1 and 0.2 twice).
    QCOMPARE(x->tickCount(), 7);
    QCOMPARE(x->labelFormat(), QString("%.2f"));
  }

  void screenLegendWrapsInsteadOfEliding() {
    Calibration c;
    CalibrationGroup g;
    g.meanRisk = 0.2;
    g.observedProportion = 0.2;
    g.observedCi = {0.15, 0.25};
    c.groups = {g, g};
    c.curve = {{0.05, 0.05}, {0.35, 0.33}};
    RiskHistogram h;
    h.binEdges = {0.0, 0.5, 1.0};
    h.eventCounts = {1, 1};
    h.nonEventCounts = {3, 3};
    auto* chart = new charts::CalibrationChart(c, h);
    chart->addComparison(QStringLiteral("A rival score with a rather long descriptive name"), c);
    ChartPanel panel(QStringLiteral("testPanel"));
    panel.setLinkedChart(chart);
    const LegendStrip* strip = panel.legendStrip();
    const QStringList labels = strip->labels();
    // Every named series once, whole; the unnamed CI bars (hidden from the legend) not at all.
    QVERIFY(labels.contains("Smoothed (loess)"));
    QVERIFY(labels.contains("A rival score with a rather long descriptive name"));
    for (const QString& l : labels) QVERIFY2(!l.contains(QChar(0x2026)), qPrintable(l));
    QCOMPARE(labels.count("Smoothed (loess)"), 1);
    QVERIFY(!labels.contains(QString()));
    QVERIFY(!chart->legend()->isVisible());  // the strip replaces Qt's one-row legend
    QVERIFY(strip->rowsForWidth(440) > strip->rowsForWidth(2400));
    QCOMPARE(strip->rowsForWidth(2400), 1);
    QVERIFY(strip->heightForWidth(440) > strip->heightForWidth(2400));
  }

  void calibrationHistogramStopsAtTheAxis() {
    Calibration c;
    c.slope = 1;
    CalibrationGroup g;
    g.meanRisk = 0.2;
    g.observedProportion = 0.2;
    g.observedCi = {0.15, 0.25};
    c.groups = {g};
    c.curve = {{0.05, 0.05}, {0.35, 0.33}};
    RiskHistogram h;
    for (int i = 0; i <= 10; ++i) h.binEdges.push_back(i / 10.0);
    h.eventCounts.assign(10, 1);
    h.nonEventCounts.assign(10, 3);
    charts::CalibrationChart chart(c, h);
    QVERIFY(chart.axisMax() < 1.0);
    for (QAbstractSeries* s : chart.series()) {
      auto* area = qobject_cast<QAreaSeries*>(s);
      if (area == nullptr || !area->name().startsWith("Risk distribution")) continue;
      for (const QPointF& p : area->upperSeries()->points()) {
        QVERIFY2(p.x() <= chart.axisMax() + 1e-12, qPrintable(QString::number(p.x())));
        // A strip of its own below the zero line, within its depth.
        QVERIFY(p.y() <= 0.0 && p.y() >= -chart.stripDepth());
      }
      // The summary numbers are in their box, not in the title.
      QCOMPARE(chart.title(), QString("Calibration"));
      QVERIFY(chart.summaryText().contains("Slope 1.00 (target 1)"));
      QVERIFY(chart.summaryText().contains("O/E"));
      return;
    }
    QFAIL("no histogram series");
  }
};

QTEST_MAIN(ChartLegendTest)
#include "chart_legend_test.moc"
