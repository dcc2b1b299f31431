#include "ui/views/legend_strip.h"

#include <QPainter>
#include <QPainterPath>
#include <QtCharts/QAreaSeries>
#include <QtCharts/QChart>
#include <QtCharts/QLegend>
#include <QtCharts/QLegendMarker>
#include <QtCharts/QLineSeries>
#include <QtCharts/QScatterSeries>

#include "ui/charts/chart_style.h"

namespace calivera::ui {
namespace {

constexpr int kSampleWidth = 26;
constexpr int kGap = 5;       // between sample and label
constexpr int kSpacing = 14;  // between entries
constexpr int kMargin = 4;

}  // namespace

LegendStrip::LegendStrip(QWidget* parent) : QWidget(parent) {
  setObjectName(QStringLiteral("legendStrip"));
  QFont f = font();
  f.setPointSizeF(8.5);
  setFont(f);
  setSizePolicy(QSizePolicy::Preferred, QSizePolicy::Fixed);
}

void LegendStrip::setChart(const QChart* chart) {
  entries_.clear();
  if (chart != nullptr) {
    for (QLegendMarker* marker : chart->legend()->markers()) {
      QAbstractSeries* series = marker->series();
      if (series == nullptr || marker->label().isEmpty() || charts::isHiddenFromLegend(series)) {
        continue;
      }
      Entry e;
      e.label = marker->label();
      if (auto* area = qobject_cast<QAreaSeries*>(series)) {
        e.sample = Sample::Area;
        e.pen = area->pen();
        e.brush = area->brush();
      } else if (auto* scatter = qobject_cast<QScatterSeries*>(series)) {
        e.sample = Sample::Point;
        e.pen = scatter->pen();
        e.brush = scatter->brush();
        e.pointShape = static_cast<int>(scatter->markerShape());
      } else if (auto* line = qobject_cast<QLineSeries*>(series)) {
        e.pen = line->pen();
      } else {
        e.pen = marker->pen();
        e.brush = marker->brush();
      }
      entries_.push_back(std::move(e));
    }
  }
  updateGeometry();
  update();
}

QStringList LegendStrip::labels() const {
  QStringList out;
  for (const Entry& e : entries_) out << e.label;
  return out;
}

int LegendStrip::entryWidth(const Entry& e) const {
  return kSampleWidth + kGap + fontMetrics().horizontalAdvance(e.label);
}

int LegendStrip::rowsForWidth(int width) const {
  if (entries_.empty()) return 0;
  const int usable = std::max(1, width - 2 * kMargin);
  int rows = 1, x = 0;
  for (const Entry& e : entries_) {
    const int w = entryWidth(e);
    if (x > 0 && x + w > usable) {
      ++rows;
      x = 0;
    }
    x += w + kSpacing;
  }
  return rows;
}

int LegendStrip::heightForWidth(int width) const {
  const int rows = rowsForWidth(width);
  return rows == 0 ? 0 : rows * fontMetrics().height() + (rows - 1) * 2 + 2 * kMargin;
}

QSize LegendStrip::sizeHint() const {
  return {320, heightForWidth(width() > 0 ? width() : 320)};
}

void LegendStrip::drawSample(QPainter& painter, const Entry& e, const QRectF& box) const {
  const QPointF c = box.center();
  switch (e.sample) {
    case Sample::Line: {
      QPen pen = e.pen;
      pen.setWidthF(std::max(1.5, pen.widthF()));
      painter.setPen(pen);
      painter.drawLine(QPointF(box.left(), c.y()), QPointF(box.right(), c.y()));
      break;
    }
    case Sample::Area: {
      painter.setPen(e.pen.style() == Qt::NoPen ? QPen(e.brush.color().darker(130)) : e.pen);
      painter.setBrush(e.brush);
      painter.drawRect(box.adjusted(2, 2, -2, -2));
      break;
    }
    case Sample::Point: {
      painter.setPen(e.pen);
      painter.setBrush(e.brush);
      const double r = std::min(box.height(), 9.0) / 2.0;
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
        default:
          painter.drawEllipse(dot);
      }
      break;
    }
  }
}

void LegendStrip::paintEvent(QPaintEvent*) {
  QPainter painter(this);
  painter.setRenderHint(QPainter::Antialiasing);
  painter.fillRect(rect(), Qt::white);
  const QFontMetrics fm = fontMetrics();
  const int usable = width() - 2 * kMargin;
  const int line = fm.height() + 2;
  int x = 0, y = kMargin;
  for (const Entry& e : entries_) {
    const int w = entryWidth(e);
    if (x > 0 && x + w > usable) {
      x = 0;
      y += line;
    }
    const QRectF sample(kMargin + x, y + 1, kSampleWidth, fm.height() - 2);
    painter.save();
    drawSample(painter, e, sample);
    painter.restore();
    painter.setPen(palette().color(QPalette::WindowText));
    painter.drawText(QPointF(kMargin + x + kSampleWidth + kGap, y + fm.ascent()), e.label);
    x += w + kSpacing;
  }
}

}  // namespace calivera::ui
