#include "render/charts/legend_painter.h"

#include <QFontMetricsF>
#include <QPainter>
#include <QPainterPath>
#include <QtCharts/QAreaSeries>
#include <QtCharts/QChart>
#include <QtCharts/QLegend>
#include <QtCharts/QLegendMarker>
#include <QtCharts/QLineSeries>
#include <QtCharts/QScatterSeries>
#include <algorithm>

#include "render/charts/chart_style.h"

namespace calivera::charts {
namespace {

// In units of the font's height, so the screen and print legends keep their proportions.
constexpr double kSampleWidth = 2.2;
constexpr double kGap = 0.4;      // between sample and label
constexpr double kSpacing = 1.1;  // between entries on a row
constexpr double kRowGap = 0.15;

double entryWidth(const LegendEntry& e, const QFontMetricsF& fm) {
  return fm.height() * (kSampleWidth + kGap) + fm.horizontalAdvance(e.label);
}

void drawSample(QPainter& painter, const LegendEntry& e, const QRectF& box) {
  painter.save();
  const QPointF c = box.center();
  switch (e.sample) {
    case LegendEntry::Sample::Line: {
      QPen pen = e.pen;
      pen.setWidthF(std::max(1.5, pen.widthF()));
      painter.setPen(pen);
      painter.drawLine(QPointF(box.left(), c.y()), QPointF(box.right(), c.y()));
      break;
    }
    case LegendEntry::Sample::Area:
      painter.setPen(e.pen.style() == Qt::NoPen ? QPen(e.brush.color().darker(130)) : e.pen);
      painter.setBrush(e.brush);
      painter.drawRect(box.adjusted(1, 1, -1, -1));
      break;
    case LegendEntry::Sample::Point: {
      painter.setPen(e.pen);
      painter.setBrush(e.brush);
      const double r = box.height() * 0.4;
      const QRectF dot(c.x() - r, c.y() - r, 2 * r, 2 * r);
      switch (static_cast<QScatterSeries::MarkerShape>(e.pointShape)) {
        case QScatterSeries::MarkerShapeRectangle:
          painter.drawRect(dot);
          break;
        case QScatterSeries::MarkerShapeTriangle: {
          QPainterPath path;
          path.moveTo(c.x(), c.y() - r);
          path.lineTo(c.x() + r, c.y() + r);
          path.lineTo(c.x() - r, c.y() + r);
          path.closeSubpath();
          painter.drawPath(path);
          break;
        }
        case QScatterSeries::MarkerShapeRotatedRectangle: {  // a diamond (calibration groups)
          QPainterPath path;
          path.moveTo(c.x(), c.y() - r);
          path.lineTo(c.x() + r, c.y());
          path.lineTo(c.x(), c.y() + r);
          path.lineTo(c.x() - r, c.y());
          path.closeSubpath();
          painter.drawPath(path);
          break;
        }
        default:
          painter.drawEllipse(dot);
      }
      break;
    }
  }
  painter.restore();
}

}  // namespace

std::vector<LegendEntry> legendEntries(const QChart& chart) {
  std::vector<LegendEntry> entries;
  for (QLegendMarker* marker : chart.legend()->markers()) {
    QAbstractSeries* series = marker->series();
    if (series == nullptr || marker->label().isEmpty() || isHiddenFromLegend(series)) continue;
    LegendEntry e;
    e.label = marker->label();
    if (auto* area = qobject_cast<QAreaSeries*>(series)) {
      e.sample = LegendEntry::Sample::Area;
      e.pen = area->pen();
      e.brush = area->brush();
    } else if (auto* scatter = qobject_cast<QScatterSeries*>(series)) {
      e.sample = LegendEntry::Sample::Point;
      e.pen = scatter->pen();
      e.brush = scatter->brush();
      e.pointShape = static_cast<int>(scatter->markerShape());
    } else if (auto* line = qobject_cast<QLineSeries*>(series)) {
      e.pen = line->pen();
    } else {
      e.pen = marker->pen();
      e.brush = marker->brush();
    }
    entries.push_back(std::move(e));
  }
  return entries;
}

int legendRowCount(const std::vector<LegendEntry>& entries, const QFont& font, double width) {
  if (entries.empty()) return 0;
  const QFontMetricsF fm(font);
  int rows = 1;
  double x = 0;
  for (const LegendEntry& e : entries) {
    const double w = entryWidth(e, fm);
    if (x > 0 && x + w > width) {
      ++rows;
      x = 0;
    }
    x += w + kSpacing * fm.height();
  }
  return rows;
}

double legendRowsHeight(const std::vector<LegendEntry>& entries, const QFont& font, double width) {
  const int rows = legendRowCount(entries, font, width);
  const double h = QFontMetricsF(font).height();
  return rows == 0 ? 0.0 : rows * h + (rows - 1) * kRowGap * h;
}

void paintLegendRows(QPainter& painter, const std::vector<LegendEntry>& entries, const QRectF& area,
                     const QFont& font) {
  painter.setFont(font);
  const QFontMetricsF fm(font);
  const double h = fm.height();
  double x = 0, y = area.top();
  for (const LegendEntry& e : entries) {
    const double w = entryWidth(e, fm);
    if (x > 0 && x + w > area.width()) {
      x = 0;
      y += h * (1 + kRowGap);
    }
    drawSample(painter, e, QRectF(area.left() + x, y + 0.15 * h, kSampleWidth * h, 0.7 * h));
    painter.setPen(Qt::black);
    painter.drawText(QPointF(area.left() + x + (kSampleWidth + kGap) * h, y + fm.ascent()),
                     e.label);
    x += w + kSpacing * h;
  }
}

void paintLegendColumn(QPainter& painter, const std::vector<LegendEntry>& entries,
                       const QRectF& area, const QFont& font) {
  painter.setFont(font);
  const QFontMetricsF fm(font);
  const double h = fm.height();
  const double textLeft = (kSampleWidth + kGap) * h;
  const double textWidth = std::max(h, area.width() - textLeft);
  std::vector<QRectF> boxes;
  double total = 0;
  for (const LegendEntry& e : entries) {
    const QRectF box = fm.boundingRect(QRectF(0, 0, textWidth, 1e6), Qt::TextWordWrap, e.label);
    boxes.push_back(box);
    total += box.height() + 0.5 * h;
  }
  double y = area.top() + std::max(0.0, (area.height() - total) / 2);
  for (std::size_t i = 0; i < entries.size(); ++i) {
    drawSample(painter, entries[i], QRectF(area.left(), y + 0.15 * h, kSampleWidth * h, 0.7 * h));
    painter.setPen(Qt::black);
    painter.drawText(QRectF(area.left() + textLeft, y, textWidth, boxes[i].height()),
                     Qt::TextWordWrap, entries[i].label);
    y += boxes[i].height() + 0.5 * h;
  }
}

}  // namespace calivera::charts
