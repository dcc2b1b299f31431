#pragma once
// A forest plot of one measure pooled across sites (core/report/site_forest.h), painted with
// QPainter so the PDF report and the workstation draw the same picture. Layout, left to right:
// the site's name, the plot (a square per site, its area proportional to the site's random-effects
// weight, on its 95% CI line; the pooled estimate as a diamond spanning its 95% CI; the
// prediction interval for a new site as a dashed bar on its own row ("Prediction interval"); a dotted line at the ideal
// value), and the estimate with its interval as text. The axis is spaced on the pooling scale
// (logit for the c-statistic, log for O/E) and labelled in natural units.

#include <QRectF>

#include "core/report/site_forest.h"

class QPainter;

namespace calivera::charts {

// The height in points a plot needs (independent of its width).
double forestPlotHeightPoints(const ForestPlot& plot);

// Paints into `target` (device units); `unit` is device units per point.
void paintForestPlot(QPainter& painter, const QRectF& target, const ForestPlot& plot, double unit);

}  // namespace calivera::charts
