#include "render/charts/site_curves_plot.h"

#include <QFontMetricsF>
#include <QPainter>
#include <QPainterPath>
#include <algorithm>
#include <array>
#include <cmath>

#include "core/present/number_text.h"
#include "render/charts/chart_style.h"

namespace calivera::charts {
namespace {

using namespace palette;

constexpr double kTitlePoints = 16.0;
constexpr double kLeftAxisPoints = 34.0;    // tick labels and the rotated axis title
constexpr double kBottomAxisPoints = 26.0;  // tick labels and the axis title
constexpr double kLargestSide = 240.0;
constexpr double kLegendRowPoints = 11.0;
constexpr double kLegendColumnPoints = 130.0;
constexpr double kNoteLines = 2.0;
constexpr double kNoteLinePoints = 10.0;
// Up to this many sites the legend stands beside the plot (a column as tall as the plot).
constexpr std::size_t kLegendBesideRows = 20;

struct Layout {
  double side = kLargestSide;
  bool legendBeside = true;
  std::size_t legendColumns = 1, legendRows = 0;
};

Layout layoutFor(const SiteCurvesPlot& plot, double widthPoints) {
  Layout l;
  const std::size_t n = plot.curves.size();
  l.legendBeside =
      n <= kLegendBesideRows && widthPoints - kLeftAxisPoints - kLegendColumnPoints >= 120.0;
  double room = widthPoints - kLeftAxisPoints - (l.legendBeside ? kLegendColumnPoints : 0.0);
  l.side = std::clamp(room, 80.0, kLargestSide);
  if (l.legendBeside && kLegendRowPoints * static_cast<double>(n) > l.side) {
    l.legendBeside = false;
    room = widthPoints - kLeftAxisPoints;
    l.side = std::clamp(room, 80.0, kLargestSide);
  }
  if (l.legendBeside) {
    l.legendRows = n;
  } else {
    l.legendColumns = std::max<std::size_t>(
        1, static_cast<std::size_t>(std::floor(widthPoints / kLegendColumnPoints)));
    l.legendRows = (n + l.legendColumns - 1) / l.legendColumns;
  }
  return l;
}

double tickStep(double axisMax) {
  if (axisMax <= 0.3 + 1e-9) return 0.05;
  if (axisMax <= 0.6 + 1e-9) return 0.1;
  return 0.2;
}

}  // namespace

QPen sitePen(std::size_t index, double unit) {
  static const std::array<QColor, 8> colours = {kBlue,   kVermillion, kBluishGreen, kReddishPurple,
                                                kOrange, kSkyBlue,    kBlack,       kGrey};
  static constexpr std::array<Qt::PenStyle, 4> dashes = {Qt::SolidLine, Qt::DashLine, Qt::DotLine,
                                                         Qt::DashDotLine};
  QPen pen(colours[index % colours.size()], 1.3 * unit);
  pen.setStyle(dashes[(index / colours.size()) % dashes.size()]);
  pen.setCapStyle(Qt::FlatCap);
  pen.setJoinStyle(Qt::RoundJoin);
  return pen;
}

double siteCurvesPlotHeightPoints(const SiteCurvesPlot& plot, double widthPoints) {
  const Layout l = layoutFor(plot, widthPoints);
  const double legendBelow =
      l.legendBeside ? 0.0 : 6.0 + kLegendRowPoints * static_cast<double>(l.legendRows);
  return kTitlePoints + l.side + kBottomAxisPoints + legendBelow +
         kNoteLinePoints * (kNoteLines + static_cast<double>(plot.leftOut.size())) + 4.0;
}

void paintSiteCurvesPlot(QPainter& painter, const QRectF& target, const SiteCurvesPlot& plot,
                         double unit, std::optional<std::size_t> highlight) {
  const auto pt = [unit](double points) { return points * unit; };
  const Layout l = layoutFor(plot, target.width() / unit);
  painter.save();
  painter.setRenderHint(QPainter::Antialiasing);
  const QFont title = painterFont(8.5, unit, true);
  const QFont text = painterFont(7.0, unit);
  const QFont small = painterFont(6.5, unit);

  double y = paintPlotTitle(painter, title, target, pt(kTitlePoints), plot.title);

  const QRectF square(target.left() + pt(kLeftAxisPoints), y, pt(l.side), pt(l.side));
  const double axisMax = plot.axisMax > 0.0 ? plot.axisMax : 1.0;
  const auto at = [&](double risk, double observed) {
    return QPointF(square.left() + std::clamp(risk / axisMax, 0.0, 1.0) * square.width(),
                   square.bottom() - std::clamp(observed / axisMax, 0.0, 1.0) * square.height());
  };

  // Grid, ticks and axis titles.
  const double step = tickStep(axisMax);
  const int decimals = step < 0.1 ? 2 : 1;
  painter.setFont(small);
  for (double t = 0.0; t <= axisMax + 1e-9; t += step) {
    painter.setPen(QPen(QColor(225, 225, 225), pt(0.5)));
    painter.drawLine(at(t, 0.0), at(t, axisMax));
    painter.drawLine(at(0.0, t), at(axisMax, t));
    painter.setPen(kBlack);
    const QString label = QString::fromStdString(formatNumber(t, decimals));
    const QPointF bx = at(t, 0.0);
    painter.drawText(QRectF(bx.x() - pt(15), bx.y() + pt(2), pt(30), pt(9)), Qt::AlignCenter,
                     label);
    const QPointF ly = at(0.0, t);
    painter.drawText(QRectF(ly.x() - pt(24), ly.y() - pt(4.5), pt(21), pt(9)),
                     Qt::AlignRight | Qt::AlignVCenter, label);
  }
  painter.setPen(QPen(kBlack, pt(0.6)));
  painter.setBrush(Qt::NoBrush);
  painter.drawRect(square);
  painter.setFont(text);
  painter.drawText(QRectF(square.left(), square.bottom() + pt(11), square.width(), pt(12)),
                   Qt::AlignCenter, QStringLiteral("Predicted risk"));
  painter.save();
  painter.translate(target.left() + pt(2), square.center().y());
  painter.rotate(-90.0);
  painter.drawText(QRectF(-square.height() / 2.0, 0.0, square.height(), pt(10)), Qt::AlignCenter,
                   QStringLiteral("Observed proportion"));
  painter.restore();

  // The diagonal, then the curves: the highlighted one last, on top.
  QPen diagonal(kGrey, pt(0.8));
  diagonal.setStyle(Qt::DashDotLine);
  painter.setPen(diagonal);
  painter.drawLine(at(0.0, 0.0), at(axisMax, axisMax));
  const auto pathOf = [&](const SiteCurve& curve) {
    QPainterPath path;
    for (std::size_t i = 0; i < curve.points.size(); ++i) {
      const QPointF p = at(curve.points[i].risk, curve.points[i].observed);
      if (i == 0) {
        path.moveTo(p);
      } else {
        path.lineTo(p);
      }
    }
    return path;
  };
  const bool highlighted = highlight && *highlight < plot.curves.size();
  painter.save();
  painter.setClipRect(square);
  for (std::size_t i = 0; i < plot.curves.size(); ++i) {
    if (highlighted && i == *highlight) continue;
    QPen pen = sitePen(i, unit);
    if (highlighted) {
      pen.setColor(QColor(150, 150, 150));
      pen.setWidthF(pt(0.8));
    }
    painter.setPen(pen);
    painter.drawPath(pathOf(plot.curves[i]));
  }
  if (highlighted) {
    QPen pen = sitePen(*highlight, unit);
    pen.setWidthF(pt(2.4));
    painter.setPen(pen);
    painter.drawPath(pathOf(plot.curves[*highlight]));
  }
  painter.restore();

  // Legend: a line sample and the site's name.
  const double columnWidth = pt(kLegendColumnPoints);
  const QPointF legendOrigin =
      l.legendBeside ? QPointF(square.right() + pt(12), square.top())
                     : QPointF(target.left(), square.bottom() + pt(kBottomAxisPoints) + pt(6));
  painter.setFont(small);
  const QFontMetricsF metrics(small);
  for (std::size_t i = 0; i < plot.curves.size(); ++i) {
    const std::size_t column = l.legendBeside ? 0 : i / std::max<std::size_t>(1, l.legendRows);
    const std::size_t row = l.legendBeside ? i : i % std::max<std::size_t>(1, l.legendRows);
    const double lx = legendOrigin.x() + columnWidth * static_cast<double>(column);
    const double ly = legendOrigin.y() + pt(kLegendRowPoints) * static_cast<double>(row);
    QPen pen = sitePen(i, unit);
    if (highlighted && i == *highlight) pen.setWidthF(pt(2.4));
    painter.setPen(pen);
    painter.drawLine(QPointF(lx, ly + pt(5.5)), QPointF(lx + pt(18), ly + pt(5.5)));
    QFont font = small;
    font.setBold(highlighted && i == *highlight);
    painter.setFont(font);
    painter.setPen(kBlack);
    const double textWidth = columnWidth - pt(24);
    painter.drawText(QRectF(lx + pt(22), ly, textWidth, pt(kLegendRowPoints)),
                     Qt::AlignLeft | Qt::AlignVCenter,
                     metrics.elidedText(QString::fromStdString(plot.curves[i].label),
                                        Qt::ElideRight, textWidth));
  }

  // Notes under everything.
  y = square.bottom() + pt(kBottomAxisPoints);
  if (!l.legendBeside) y += pt(6) + pt(kLegendRowPoints) * static_cast<double>(l.legendRows);
  painter.setFont(small);
  painter.setPen(kGrey);
  painter.drawText(QRectF(target.left(), y, target.width(), pt(kNoteLinePoints * kNoteLines)),
                   Qt::AlignLeft | Qt::AlignTop | Qt::TextWordWrap,
                   QString::fromStdString(plot.note));
  y += pt(kNoteLinePoints * kNoteLines);
  paintLeftOutLines(painter, plot.leftOut, target.left(), y, target.width(), pt(kNoteLinePoints));
  painter.restore();
}

}  // namespace calivera::charts
