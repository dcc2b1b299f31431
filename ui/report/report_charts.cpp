#include "ui/report/report_charts.h"

#include <QBuffer>
#include <QFont>
#include <QPainter>
#include <QSvgGenerator>
#include <QSvgRenderer>
#include <QtCharts/QAbstractAxis>
#include <QtCharts/QLegend>
#include <memory>

#include "ui/charts/charts.h"
#include "ui/charts/overlay_series.h"

namespace calivera::ui::report {
namespace {

const QSizeF kChartSize(kReportChartWidth, kReportChartHeight);

// Print sizes: the screen fonts of the chart style are a little large for a half-page chart.
void fitForPrint(QChart& chart) {
  QFont title = chart.titleFont();
  title.setPointSizeF(9);
  chart.setTitleFont(title);
  QFont legend = chart.legend()->font();
  legend.setPointSizeF(7);
  chart.legend()->setFont(legend);
  // A legend beside the plot gives each label a full line (a bottom legend truncates them) and
  // leaves a near-square plot on the wide print rectangle.
  chart.legend()->setAlignment(Qt::AlignRight);
  for (QAbstractAxis* axis : chart.axes()) {
    QFont labels = axis->labelsFont();
    labels.setPointSizeF(7);
    axis->setLabelsFont(labels);
    QFont axisTitle = axis->titleFont();
    axisTitle.setPointSizeF(7.5);
    axis->setTitleFont(axisTitle);
  }
}

QByteArray record(QChart& chart) {
  fitForPrint(chart);
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
    charts::renderChart(chart, painter, QRectF(QPointF(0, 0), kChartSize));
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

}  // namespace calivera::ui::report
