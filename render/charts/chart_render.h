#pragma once
// Rendering a chart outside a view: into any QPainter rect (the PDF report, SVG, PNG). The chart
// must not be shown in a QChartView at the same time (render the view's own chart with
// exportViewChart* instead, which grabs what the user sees).

#include <QImage>
#include <QRectF>
#include <QString>
#include <QStringList>

class QChart;
class QPainter;

namespace calivera::charts {

// Lays the chart out at target.size() (in the painter's logical units) and paints it there.
// Works for a chart that is in no scene (the usual report case) or already in one.
void renderChart(QChart& chart, QPainter& painter, const QRectF& target);

// File exports of the chart at the given size in pixels, its legend in a column on the right
// (legend_painter.h: line styles and whole labels), with `footer` lines (the caution, the
// inputs' fingerprints, the date) word-wrapped in a band below it, so a chart copied into another
// document keeps what it shows and what it is not; return an empty string on success, otherwise
// the reason. PNG is rendered at twice the pixel density for sharp lines.
// The PNG export's image (also what Copy chart puts on the clipboard).
QImage chartImage(QChart& chart, QSize size, const QStringList& footer = {});
QString exportChartPng(QChart& chart, const QString& path, QSize size,
                       const QStringList& footer = {});
QString exportChartSvg(QChart& chart, const QString& path, QSize size, const QString& title,
                       const QStringList& footer = {});

}  // namespace calivera::charts
