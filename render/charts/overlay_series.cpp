#include "render/charts/overlay_series.h"

#include <QtCharts/QAreaSeries>
#include <QtCharts/QChart>
#include <QtCharts/QLineSeries>
#include <algorithm>
#include <array>
#include <cmath>

#include "render/charts/chart_style.h"

namespace calivera::charts {

QPen comparisonPen(std::size_t index) {
  struct Style {
    QColor color;
    QList<qreal> dashes;  // in pen widths
  };
  // Blue is the main model's colour; these are the remaining palette colours, each with a dash
  // pattern no SeriesRole uses (roles use solid, DashLine, DotLine and DashDotLine).
  static const std::array<Style, kComparisonStyles> styles = {{
      {palette::kOrange, {6, 2, 1, 2}},
      {palette::kBluishGreen, {9, 3}},
      {palette::kVermillion, {1, 2, 1, 2, 6, 2}},
      {palette::kSkyBlue, {3, 2}},
      {palette::kReddishPurple, {10, 2, 2, 2, 2, 2}},
  }};
  const Style& style = styles[index % styles.size()];
  QPen pen(style.color);
  pen.setCosmetic(true);
  pen.setWidthF(2.2);
  pen.setDashPattern(style.dashes);
  return pen;
}

QAreaSeries* makeBandArea(const std::vector<BandPoint>& band, const QString& name,
                          const QColor& color) {
  auto* upper = new QLineSeries;
  auto* lower = new QLineSeries;
  QList<QPointF> top, bottom;
  for (const BandPoint& p : band) {
    if (!std::isfinite(p.ci.lo) || !std::isfinite(p.ci.hi)) continue;
    top.append(QPointF(p.x, p.ci.hi));
    bottom.append(QPointF(p.x, p.ci.lo));
  }
  upper->replace(top);
  lower->replace(bottom);
  auto* area = new QAreaSeries(upper, lower);
  upper->setParent(area);  // the area does not own its boundary lines
  lower->setParent(area);
  area->setName(name);
  QColor fill = color;
  fill.setAlpha(55);
  area->setColor(fill);
  QPen border(color);
  border.setCosmetic(true);
  border.setWidthF(0.6);
  area->setPen(border);
  return area;
}

std::vector<BandPoint> clampedBand(const std::vector<BandPoint>& band, const PlotWindow& window) {
  std::vector<BandPoint> out;
  for (BandPoint p : band) {
    if (p.x > window.xMax) continue;
    p.ci.lo = std::clamp(p.ci.lo, window.yMin, window.yMax);  // NaN stays NaN
    p.ci.hi = std::clamp(p.ci.hi, window.yMin, window.yMax);
    out.push_back(p);
  }
  return out;
}

void addOnAxesOf(QChart* chart, QAbstractSeries* series, QAbstractSeries* reference) {
  chart->addSeries(series);
  for (QAbstractAxis* axis : reference->attachedAxes()) series->attachAxis(axis);
}

const BandPoint* nearestBandPoint(const std::vector<BandPoint>& band, double x, double tolerance) {
  const BandPoint* best = nullptr;
  double bestDistance = tolerance;
  for (const BandPoint& p : band) {
    const double d = std::abs(p.x - x);
    if (d <= bestDistance && std::isfinite(p.ci.lo) && std::isfinite(p.ci.hi)) {
      bestDistance = d;
      best = &p;
    }
  }
  return best;
}

}  // namespace calivera::charts
