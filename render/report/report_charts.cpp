#include "render/report/report_charts.h"

#include <QBuffer>
#include <QFont>
#include <QPainter>
#include <QSvgGenerator>
#include <QSvgRenderer>
#include <QtCharts/QAbstractAxis>
#include <QtCharts/QLegend>
#include <QtCharts/QLineSeries>
#include <QtCharts/QScatterSeries>
#include <algorithm>
#include <memory>

#include "render/charts/charts.h"
#include "render/charts/legend_painter.h"
#include "render/charts/overlay_series.h"

namespace calivera::report {
namespace {

const QSizeF kChartSize(kReportChartWidth, kReportChartHeight);

// The legend column beside the plot, in points: the labels wrap within it (legend_painter.h).
constexpr double kLegendWidth = 135.0;

// Print sizes: the screen fonts of the chart style are a little large for a half-page chart.
void fitForPrint(QChart& chart) {
  QFont title = chart.titleFont();
  title.setPointSizeF(9);
  chart.setTitleFont(title);
  chart.legend()->setVisible(false);  // drawn beside the chart by paintLegendColumn
  for (QAbstractAxis* axis : chart.axes()) {
    QFont labels = axis->labelsFont();
    labels.setPointSizeF(7);
    axis->setLabelsFont(labels);
    QFont axisTitle = axis->titleFont();
    axisTitle.setPointSizeF(7.5);
    axis->setTitleFont(axisTitle);
  }
  // Screen pens are cosmetic (a width in device pixels), which a 1200 dpi PDF prints as
  // hairlines with invisible dash patterns; in print they become widths in points.
  for (QAbstractSeries* series : chart.series()) {
    auto* line = qobject_cast<QLineSeries*>(series);
    if (line == nullptr || qobject_cast<QScatterSeries*>(series) != nullptr) continue;
    QPen pen = line->pen();
    if (!pen.isCosmetic()) continue;
    pen.setCosmetic(false);
    pen.setWidthF(std::max(0.6, 0.55 * pen.widthF()));
    line->setPen(pen);
  }
}

QByteArray record(QChart& chart) {
  fitForPrint(chart);
  const std::vector<charts::LegendEntry> legend = charts::legendEntries(chart);
  QByteArray svg;
  QBuffer buffer(&svg);
  buffer.open(QIODevice::WriteOnly);
  QSvgGenerator generator;
  generator.setOutputDevice(&buffer);
  generator.setResolution(72);  // one SVG unit per point
  generator.setSize(kChartSize.toSize());
  generator.setViewBox(QRectF(QPointF(0, 0), kChartSize));
  {
    QPainter painter(&generator);
    const double plotWidth = kChartSize.width() - kLegendWidth;
    charts::renderChart(chart, painter, QRectF(0, 0, plotWidth, kChartSize.height()));
    QFont font = chart.titleFont();
    font.setBold(false);
    font.setPointSizeF(7);
    painter.setRenderHint(QPainter::Antialiasing);
    charts::paintLegendColumn(
        painter, legend, QRectF(plotWidth, 20, kLegendWidth - 8, kChartSize.height() - 40), font);
  }
  return svg;
}

ThresholdSnapshot markerSnapshot(const AuditDocument& doc) {
  const ValidationResult& r = doc.chartData;
  if (doc.markedThreshold) {
    const ThresholdRow& row = *doc.markedThreshold;
    return snapshotFromCounts(row.threshold, ConfusionCounts{row.tp, row.fp, row.tn, row.fn});
  }
  // Every tabulated row is hidden: mark threshold 0 (everyone flagged), which reveals nothing.
  return snapshotFromCounts(0.0,
                            ConfusionCounts{r.cohort.events, r.cohort.n - r.cohort.events, 0, 0});
}

}  // namespace

RecordedCharts recordReportCharts(const AuditDocument& doc) {
  const ValidationResult& r = doc.chartData;
  const ThresholdSnapshot snapshot = markerSnapshot(doc);
  RecordedCharts recorded;
  recorded.size = kChartSize;
  {
    charts::RocChart chart(r.discrimination);
    for (const auto& overlay : doc.comparisons) {
      chart.addComparison(QString::fromStdString(overlay.name), overlay.chartData.discrimination);
    }
    chart.setThreshold(snapshot);
    recorded.drawings[ChartKind::Roc] = record(chart);
  }
  {
    charts::CalibrationChart chart(r.calibration, r.distribution);
    // SVG output does not clip series to the plot: the report's bands are clamped to it.
    const double top = chart.axisMax();
    if (!doc.calibrationBand.empty()) {
      chart.setCurveBand(charts::clampedBand(doc.calibrationBand, {top, 0.0, top}));
    }
    for (const auto& overlay : doc.comparisons) {
      chart.addComparison(QString::fromStdString(overlay.name), overlay.chartData.calibration);
    }
    chart.setThreshold(snapshot);
    recorded.drawings[ChartKind::Calibration] = record(chart);
  }
  {
    charts::DecisionCurveChart chart(r.decisionCurve, r.cohort);
    if (doc.reasonableThresholds) {
      chart.setReasonableRange(doc.reasonableThresholds->lo, doc.reasonableThresholds->hi);
    } else {
      chart.clearReasonableRange();
    }
    if (!doc.netBenefitBand.empty()) {
      chart.setNetBenefitBand(doc.netBenefitBand);  // sets the axis range, then clamped into it
      chart.setNetBenefitBand(
          charts::clampedBand(doc.netBenefitBand, {1.0, chart.yMin(), chart.yMax()}));
    }
    for (const auto& overlay : doc.comparisons) {
      chart.addComparison(QString::fromStdString(overlay.name), overlay.chartData.decisionCurve);
    }
    chart.setThreshold(snapshot);
    recorded.drawings[ChartKind::DecisionCurve] = record(chart);
  }
  {
    charts::DistributionChart chart(r.distribution);
    chart.setThreshold(snapshot);
    recorded.drawings[ChartKind::RiskDistribution] = record(chart);
  }
  return recorded;
}

ChartPainter replayCharts(RecordedCharts charts) {
  return [charts = std::move(charts)](QPainter& painter, const QRectF& target, ChartKind kind) {
    const auto found = charts.drawings.find(kind);
    if (found == charts.drawings.end()) return;
    const double scale =
        std::min(target.width() / charts.size.width(), target.height() / charts.size.height());
    const QSizeF drawn = charts.size * scale;
    const QRectF bounds(target.left() + (target.width() - drawn.width()) / 2,
                        target.top() + (target.height() - drawn.height()) / 2, drawn.width(),
                        drawn.height());
    QSvgRenderer renderer(found->second);
    renderer.render(&painter, bounds);
  };
}

}  // namespace calivera::report
