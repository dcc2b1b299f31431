#pragma once
// What the uncertainty layer adds to the charts: shaded bootstrap bands (percentile 95%,
// core/uncertainty/validation_bootstrap.h) and the curves of further models overlaid on the
// main model's chart. Overlays follow the palette rule of chart_style.h: each has its own colour
// of the Okabe & Ito palette AND its own dash pattern AND a legend label, so they are told apart
// without colour.

#include <QColor>
#include <QPen>
#include <QString>
#include <cstddef>
#include <vector>

#include "core/uncertainty/validation_bootstrap.h"

class QAbstractSeries;
class QAreaSeries;
class QChart;

namespace calivera::charts {

// Pen of the k-th overlaid model (0-based); the cycle repeats after kComparisonStyles. The dash
// patterns differ from every SeriesRole's line style.
inline constexpr std::size_t kComparisonStyles = 5;
QPen comparisonPen(std::size_t index);

// A shaded band: upper line at ci.hi, lower line at ci.lo, one point per BandPoint whose interval
// is finite (a grid point no replicate covered is left out), in the given order, values as given.
QAreaSeries* makeBandArea(const std::vector<BandPoint>& band, const QString& name,
                          const QColor& color);

// A plotted window, for output that does not clip series to the plot (QSvgGenerator, hence the
// PDF report): clampedBand() keeps a band inside it. On screen the view clips by itself.
struct PlotWindow {
  double xMax = 1.0;
  double yMin = 0.0, yMax = 1.0;
};
// The band with its bounds clamped to [yMin, yMax] and points beyond xMax left out.
std::vector<BandPoint> clampedBand(const std::vector<BandPoint>& band, const PlotWindow& window);

// Adds `series` to the chart on the axes `reference` is attached to.
void addOnAxesOf(QChart* chart, QAbstractSeries* series, QAbstractSeries* reference);

// The band point whose x is nearest to `x`, if within `tolerance`; null otherwise.
const BandPoint* nearestBandPoint(const std::vector<BandPoint>& band, double x, double tolerance);

}  // namespace calivera::charts
