#pragma once
// Chart legends drawn by us instead of by Qt Charts, whose legend puts every entry on one row
// (or one column) and elides the labels that do not fit. Each entry shows the series' own line
// (colour and dash pattern), area fill or point shape, so no series is told apart by colour
// alone, and its whole label: on screen the entries wrap onto further rows (legend_strip.h), in
// print they stack in a column beside the plot with long labels wrapped onto further lines.
// Entries come from the chart's legend markers in series order, without the helper series
// hidden by hideFromLegend.

#include <QBrush>
#include <QFont>
#include <QPen>
#include <QRectF>
#include <QString>
#include <vector>

class QChart;
class QPainter;

namespace calivera::charts {

struct LegendEntry {
  enum class Sample { Line, Area, Point };
  QString label;
  Sample sample = Sample::Line;
  QPen pen;
  QBrush brush;
  int pointShape = 0;  // QScatterSeries::MarkerShape for Sample::Point
};

std::vector<LegendEntry> legendEntries(const QChart& chart);

// Rows: entries left to right, wrapping at `width`.
int legendRowCount(const std::vector<LegendEntry>& entries, const QFont& font, double width);
double legendRowsHeight(const std::vector<LegendEntry>& entries, const QFont& font, double width);
void paintLegendRows(QPainter& painter, const std::vector<LegendEntry>& entries, const QRectF& area,
                     const QFont& font);

// Column: one entry under the other, each label word-wrapped to the column, centred vertically.
void paintLegendColumn(QPainter& painter, const std::vector<LegendEntry>& entries,
                       const QRectF& area, const QFont& font);

}  // namespace calivera::charts
