#include "render/charts/distribution_chart.h"

#include <QtCharts/QAreaSeries>
#include <QtCharts/QLineSeries>
#include <QtCharts/QValueAxis>
#include <algorithm>
#include <cmath>
#include <numeric>

#include "render/charts/chart_style.h"
#include "render/charts/chart_text.h"
#include "render/charts/histogram_series.h"

namespace calivera::charts {

namespace {

std::vector<double> percentages(const std::vector<std::size_t>& counts, std::size_t total) {
  std::vector<double> out(counts.size());
  for (std::size_t i = 0; i < counts.size(); ++i) {
    out[i] = total == 0 ? 0.0 : 100.0 * static_cast<double>(counts[i]) / static_cast<double>(total);
  }
  return out;
}

}  // namespace

DistributionChart::DistributionChart(const RiskHistogram& distribution) : histogram_(distribution) {
  events_ =
      std::accumulate(histogram_.eventCounts.begin(), histogram_.eventCounts.end(), std::size_t{0});
  nonEvents_ = std::accumulate(histogram_.nonEventCounts.begin(), histogram_.nonEventCounts.end(),
                               std::size_t{0});
  // The group sizes are in the confusion panel beside the chart and in its tooltips: in the title
  // or the legend they made the text too long for a quarter-window chart and Qt Charts elided it.
  applyChartStyle(this, QStringLiteral("Predicted risk by outcome"));
  const auto eventPct = percentages(histogram_.eventCounts, events_);
  const auto nonEventPct = percentages(histogram_.nonEventCounts, nonEvents_);
  double top = 1.0;
  for (double v : eventPct) top = std::max(top, v);
  for (double v : nonEventPct) top = std::max(top, v);
  yMax_ = std::ceil(top * 1.1);

  auto* x = makeAxis(QStringLiteral("Predicted risk (0–1)"), 0, 1, "%.1f", 6);
  auto* y = makeAxis(QStringLiteral("% of outcome group"), 0, yMax_, "%.0f", 6);
  y->applyNiceNumbers();
  yMax_ = y->max();
  addAxis(x, Qt::AlignBottom);
  addAxis(y, Qt::AlignLeft);
  auto attach = [&](QAbstractSeries* s) { addOnAxes(this, s, x, y); };

  auto addGroup = [&](const std::vector<double>& pct, const QString& name, SeriesRole role,
                      int alpha) {
    auto* area = makeHistogramArea(histogram_.binEdges, pct);
    area->setName(name);
    QColor fill = roleColor(role);
    fill.setAlpha(alpha);
    area->setColor(fill);
    area->setPen(rolePen(role));
    attach(area);
  };
  addGroup(nonEventPct, QStringLiteral("No event (dashed)"), SeriesRole::NonEvents, 70);
  addGroup(eventPct, QStringLiteral("Event (solid)"), SeriesRole::Events, 90);

  marker_ = new QLineSeries;
  marker_->setName(QStringLiteral("Threshold"));
  marker_->setPen(rolePen(SeriesRole::Threshold));
  marker_->append(0, 0);
  marker_->append(0, yMax_);
  attach(marker_);
}

void DistributionChart::setThreshold(const ThresholdSnapshot& snapshot) {
  marker_->replace({QPointF(snapshot.threshold, 0), QPointF(snapshot.threshold, yMax_)});
}

double DistributionChart::markedThreshold() const {
  return marker_->at(0).x();
}

std::optional<double> DistributionChart::thresholdAt(QPointF value) const {
  if (value.x() < 0 || value.x() > 1) return std::nullopt;
  return value.x();
}

QString DistributionChart::describeAt(QPointF value) const {
  const auto& edges = histogram_.binEdges;
  if (edges.size() < 2) return {};
  const auto it = std::upper_bound(edges.begin(), edges.end(), value.x());
  if (it == edges.begin() || it == edges.end()) return {};
  const auto bin = static_cast<std::size_t>(it - edges.begin() - 1);
  return QStringLiteral(
             "Risks %1 to %2\nWith the event: %3 of %4 patients\nWithout the event: %5 of %6 "
             "patients")
      .arg(fixed(edges[bin], 3), fixed(edges[bin + 1], 3))
      .arg(histogram_.eventCounts[bin])
      .arg(events_)
      .arg(histogram_.nonEventCounts[bin])
      .arg(nonEvents_);
}

}  // namespace calivera::charts
