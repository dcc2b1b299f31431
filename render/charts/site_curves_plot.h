#pragma once
// Every site's calibration curve on one set of axes (core/report/site_curves.h), painted with
// QPainter so the PDF report and the workstation draw the same picture: a square plot of observed
// against predicted risk with the diagonal of perfect calibration, one line per site, and a
// legend naming each site beside the plot (below it when there are many sites). Each site has its
// own colour of the Okabe & Ito palette AND its own dash pattern (sitePen), so no two of the
// first 32 sites look alike without colour. A highlighted site is drawn thick in its own pen and
// the others thin and grey, so one site can be read against the rest.

#include <QPen>
#include <QRectF>
#include <cstddef>
#include <optional>

#include "core/report/site_curves.h"

class QPainter;

namespace calivera::charts {

// The pen of the k-th site (0-based): eight colours, then the next dash pattern.
QPen sitePen(std::size_t index, double unit);

// The height in points the plot needs at `widthPoints`.
double siteCurvesPlotHeightPoints(const SiteCurvesPlot& plot, double widthPoints);

// Paints into `target` (device units); `unit` is device units per point. `highlight` is an index
// into plot.curves.
void paintSiteCurvesPlot(QPainter& painter, const QRectF& target, const SiteCurvesPlot& plot,
                         double unit, std::optional<std::size_t> highlight = std::nullopt);

}  // namespace calivera::charts
