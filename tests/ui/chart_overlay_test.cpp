// The chart API of the uncertainty layer (render/charts/overlay_series.h and the band and
// comparison methods of the ROC, calibration and decision-curve charts), on a real run: birthwt
// (Debian r-cran-mass) validated with a model fitted by core, its bootstrap bands from core's
// bootstrapValidation, and a second fitted model as the overlay. The checks are on what the charts
// hold (the band series carry exactly the BandPoint values given, one named series per overlay,
// axes that contain the band), not on the statistics themselves.
#include <QApplication>
#include <QTemporaryDir>
#include <QtCharts/QAreaSeries>
#include <QtCharts/QLegend>
#include <QtCharts/QLegendMarker>
#include <QtCharts/QLineSeries>
#include <QtTest>
#include <cmath>

#include "core/uncertainty/validation_bootstrap.h"
#include "render/charts/charts.h"
#include "render/charts/overlay_series.h"
#include "tests/unit/birthwt_run.h"

using namespace calivera;
using namespace calivera::charts;
using calivera::snapshotFromCounts;

namespace {

struct Fixture {
  ValidationRun run;
  ValidationResult other;  // the second model on the same patients
  ValidationBootstrap bootstrap;
};

const Fixture& fixture() {
  static const Fixture f = [] {
    QTemporaryDir dir;
    const std::string full = dir.filePath(QStringLiteral("full.json")).toStdString();
    const std::string small = dir.filePath(QStringLiteral("small.json")).toStdString();
    testing::writeBirthwtModel(full, {"age", "lwt", "race", "smoke", "ht", "ui"}, "full");
    testing::writeBirthwtModel(small, {"lwt"}, "weight only");
    Fixture out{testing::birthwtRun(full), testing::birthwtRun(small).result, {}};
    ValidationBootstrapOptions options;
    options.bootstrap.replicates = 25;
    options.bootstrap.seed = 11;
    options.bootstrap.threads = 1;
    out.bootstrap =
        bootstrapValidation(out.run.cohort.input, out.run.request.options, out.run.result, options);
    return out;
  }();
  return f;
}

// The (x, lo) and (x, hi) points of the band's finite intervals, exactly, in band order.
void expectBandPoints(const QAreaSeries* area, const std::vector<BandPoint>& band) {
  QList<QPointF> upper, lower;
  for (const BandPoint& p : band) {
    if (!std::isfinite(p.ci.lo) || !std::isfinite(p.ci.hi)) continue;
    upper.append(QPointF(p.x, p.ci.hi));
    lower.append(QPointF(p.x, p.ci.lo));
  }
  QVERIFY(!upper.isEmpty());
  QCOMPARE(area->upperSeries()->points(), upper);
  QCOMPARE(area->lowerSeries()->points(), lower);
}

QAbstractSeries* seriesNamed(const QChart& chart, const QString& name) {
  for (QAbstractSeries* s : chart.series()) {
    if (s->name() == name) return s;
  }
  return nullptr;
}

// The legend has an entry for the series, labelled with its name.
bool legendShows(QChart& chart, QAbstractSeries* series) {
  const auto markers = chart.legend()->markers(series);
  return markers.size() == 1 && markers.front()->label() == series->name();
}

// A point on the curve (interpolated) at the risk in [from, to] farthest from every risk group of
// `result`: the tooltip there is about the curves, not a group marker.
QPointF awayFromGroups(const std::vector<CalibrationCurvePoint>& curve,
                       const ValidationResult& result, double from, double to) {
  QPointF best(from, interpolateCurve(curve, from));
  double bestDistance = -1.0;
  for (double x = from; x <= to; x += 0.001) {
    double distance = 1.0;
    for (const CalibrationGroup& g : result.calibration.groups) {
      distance = std::min(distance, std::abs(g.meanRisk - x));
    }
    const double y = interpolateCurve(curve, x);
    if (distance > bestDistance && std::isfinite(y)) {
      bestDistance = distance;
      best = QPointF(x, y);
    }
  }
  return best;
}

}  // namespace

class ChartOverlayTest : public QObject {
  Q_OBJECT

 private slots:
  void calibrationBandHoldsTheBandPoints() {
    const Fixture& f = fixture();
    CalibrationChart chart(f.run.result.calibration, f.run.result.distribution);
    const int before = static_cast<int>(chart.series().size());
    chart.setCurveBand(f.bootstrap.calibrationCurve);
    QCOMPARE(static_cast<int>(chart.series().size()), before + 1);
    QVERIFY(chart.curveBand() != nullptr);
    expectBandPoints(chart.curveBand(), f.bootstrap.calibrationCurve);
    QCOMPARE(chart.curveBand()->name(), QStringLiteral("Bootstrap 95% band"));
    QVERIFY(legendShows(chart, chart.curveBand()));
    // Replacing the band keeps one band series.
    chart.setCurveBand(f.bootstrap.calibrationCurve);
    QCOMPARE(static_cast<int>(chart.series().size()), before + 1);
    // The threshold marker still follows.
    chart.setThreshold(snapshotFromCounts(0.3, ConfusionCounts{10, 10, 10, 10}));
    QCOMPARE(chart.markedThreshold(), 0.3);
    // The tooltip on the smoothed curve names the band there.
    const std::vector<BandPoint>& band = f.bootstrap.calibrationCurve;
    const QPointF mid =
        awayFromGroups(f.run.result.calibration.curve, f.run.result, band.front().x, band.back().x);
    QVERIFY(chart.describeAt(mid).contains(QStringLiteral("bootstrap 95% band")));
  }

  void decisionBandHoldsTheBandPointsInsideTheAxis() {
    const Fixture& f = fixture();
    const ValidationResult& r = f.run.result;
    DecisionCurveChart chart(r.decisionCurve, r.cohort);
    chart.setNetBenefitBand(f.bootstrap.netBenefit);
    expectBandPoints(chart.netBenefitBand(), f.bootstrap.netBenefit);
    QCOMPARE(chart.netBenefitBand()->name(), QStringLiteral("Bootstrap 95% band"));
    for (const BandPoint& p : f.bootstrap.netBenefit) {
      if (!std::isfinite(p.ci.lo) || p.x > 1.0) continue;
      QVERIFY2(p.ci.hi <= chart.yMax() + 1e-12, qPrintable(QString::number(p.x)));
      QVERIFY2(p.ci.lo >= chart.yMin() - 1e-12 || p.ci.lo < -chart.yMax(),
               qPrintable(QString::number(p.x)));
    }
    // A band reaching beyond the first axis range widens it, and the marker spans the new range.
    const double top = chart.yMax();
    std::vector<BandPoint> wide = f.bootstrap.netBenefit;
    for (BandPoint& p : wide) p.ci.hi = p.estimate + top;
    chart.setNetBenefitBand(wide);
    QVERIFY(chart.yMax() >= top + wide.front().estimate - 1e-12);
    chart.setThreshold(snapshotFromCounts(0.2, ConfusionCounts{10, 10, 10, 10}));
    QCOMPARE(chart.markedThreshold(), 0.2);
    // Without a reasonable range (as in reports that set none) the band still widens the axis.
    DecisionCurveChart bare(r.decisionCurve, r.cohort);
    bare.clearReasonableRange();
    bare.setNetBenefitBand(wide);
    expectBandPoints(bare.netBenefitBand(), wide);
    QCOMPARE(bare.yMax(), chart.yMax());
    const QString text = chart.describeAt(QPointF(0.2, 0.0));
    QVERIFY2(text.contains(QStringLiteral("bootstrap 95% band")), qPrintable(text));
  }

  void overlaysAddOneNamedSeriesEach() {
    const Fixture& f = fixture();
    const ValidationResult& r = f.run.result;
    const QString name = QStringLiteral("weight only");

    RocChart roc(r.discrimination);
    int before = static_cast<int>(roc.series().size());
    roc.addComparison(name, f.other.discrimination);
    roc.addComparison(QStringLiteral("again"), f.other.discrimination);
    QCOMPARE(static_cast<int>(roc.series().size()), before + 2);
    QCOMPARE(roc.comparisonCount(), std::size_t{2});
    const QString rocName =
        QStringLiteral("weight only (AUC %1)").arg(f.other.discrimination.auc, 0, 'f', 3);
    auto* rocLine = qobject_cast<QLineSeries*>(seriesNamed(roc, rocName));
    QVERIFY2(rocLine != nullptr, qPrintable(rocName));
    QVERIFY(legendShows(roc, rocLine));
    QCOMPARE(rocLine->count(), static_cast<int>(f.other.discrimination.roc.size()));
    auto* again = qobject_cast<QLineSeries*>(seriesNamed(
        roc, QStringLiteral("again (AUC %1)").arg(f.other.discrimination.auc, 0, 'f', 3)));
    QVERIFY(again != nullptr);
    // Told apart without colour: different dash patterns, and different colours as well.
    QVERIFY(rocLine->pen().dashPattern() != again->pen().dashPattern());
    QVERIFY(rocLine->pen().color() != again->pen().color());
    QVERIFY(rocLine->pen().color() != roleColor(SeriesRole::Model));
    roc.setThreshold(snapshotFromCounts(0.3, ConfusionCounts{20, 30, 100, 39}));
    QCOMPARE(roc.operatingPoint(), QPointF(30.0 / 130.0, 20.0 / 59.0));

    CalibrationChart calibration(r.calibration, r.distribution);
    before = static_cast<int>(calibration.series().size());
    calibration.addComparison(name, f.other.calibration);
    QCOMPARE(static_cast<int>(calibration.series().size()), before + 1);
    auto* calLine = qobject_cast<QLineSeries*>(seriesNamed(calibration, name));
    QVERIFY(calLine != nullptr);
    QCOMPARE(calLine->count(), static_cast<int>(f.other.calibration.curve.size()));
    const QPointF p = awayFromGroups(f.other.calibration.curve, r, 0.05, 0.5);
    QVERIFY(calibration.describeAt(p).contains(name));

    DecisionCurveChart decision(r.decisionCurve, r.cohort);
    before = static_cast<int>(decision.series().size());
    decision.addComparison(name, f.other.decisionCurve);
    QCOMPARE(static_cast<int>(decision.series().size()), before + 1);
    auto* dcLine = qobject_cast<QLineSeries*>(seriesNamed(decision, name));
    QVERIFY(dcLine != nullptr);
    QCOMPARE(dcLine->count(), static_cast<int>(f.other.decisionCurve.size()));
    QVERIFY(
        decision.describeAt(QPointF(0.2, 0.05)).contains(name + QStringLiteral(": net benefit")));
  }

  // With CALIVERA_SCREENSHOT_DIR set: the three charts with bands and an overlay as PNG, to look
  // at.
  void screenshots() {
    const QByteArray dir = qgetenv("CALIVERA_SCREENSHOT_DIR");
    if (dir.isEmpty()) QSKIP("set CALIVERA_SCREENSHOT_DIR to write the PNGs");
    const Fixture& f = fixture();
    const ValidationResult& r = f.run.result;
    const QString name = QStringLiteral("weight only");
    const auto snapshot = snapshotFromCounts(0.3, ConfusionCounts{20, 30, 100, 39});
    RocChart roc(r.discrimination);
    roc.addComparison(name, f.other.discrimination);
    roc.setThreshold(snapshot);
    CalibrationChart calibration(r.calibration, r.distribution);
    calibration.setCurveBand(f.bootstrap.calibrationCurve);
    calibration.addComparison(name, f.other.calibration);
    calibration.setThreshold(snapshot);
    DecisionCurveChart decision(r.decisionCurve, r.cohort);
    decision.setReasonableRange(0.1, 0.4);
    decision.setNetBenefitBand(f.bootstrap.netBenefit);
    decision.addComparison(name, f.other.decisionCurve);
    decision.setThreshold(snapshot);
    for (LinkedChart* chart :
         {static_cast<LinkedChart*>(&roc), static_cast<LinkedChart*>(&calibration),
          static_cast<LinkedChart*>(&decision)}) {
      const QString path = QString::fromLocal8Bit(dir) + QStringLiteral("/overlay_") +
                           chart->exportName() + QStringLiteral(".png");
      QCOMPARE(exportChartPng(*chart, path, QSize(640, 480)), QString());
    }
  }

  void clampedBandKeepsTheBandInsideTheWindow() {
    const std::vector<BandPoint>& band = fixture().bootstrap.calibrationCurve;
    const PlotWindow window{0.5, 0.0, 0.4};
    const std::vector<BandPoint> clamped = clampedBand(band, window);
    std::size_t kept = 0;
    for (const BandPoint& p : band) {
      if (p.x > window.xMax) continue;
      const BandPoint& c = clamped.at(kept++);
      QCOMPARE(c.x, p.x);
      QCOMPARE(c.estimate, p.estimate);
      if (!std::isfinite(p.ci.lo)) {
        QVERIFY(std::isnan(c.ci.lo));
        continue;
      }
      QCOMPARE(c.ci.lo, std::clamp(p.ci.lo, 0.0, 0.4));
      QCOMPARE(c.ci.hi, std::clamp(p.ci.hi, 0.0, 0.4));
    }
    QCOMPARE(clamped.size(), kept);
    QVERIFY(kept < band.size());
  }

  void comparisonPensDifferFromEachOtherAndFromTheRoles() {
    for (std::size_t i = 0; i < kComparisonStyles; ++i) {
      const QPen pen = comparisonPen(i);
      QCOMPARE(pen.style(), Qt::CustomDashLine);
      for (std::size_t j = i + 1; j < kComparisonStyles; ++j) {
        QVERIFY(pen.color() != comparisonPen(j).color());
        QVERIFY(pen.dashPattern() != comparisonPen(j).dashPattern());
      }
      QVERIFY(pen.color() != roleColor(SeriesRole::Model));
    }
  }
};

int main(int argc, char** argv) {
  QApplication app(argc, argv);
  ChartOverlayTest test;
  return QTest::qExec(&test, argc, argv);
}

#include "chart_overlay_test.moc"
