#include "render/charts/forest_plot.h"

#include <QFont>
#include <QFontMetricsF>
#include <QPainter>
#include <QPainterPath>
#include <QPen>
#include <algorithm>
#include <cmath>

#include "core/present/number_text.h"
#include "render/charts/chart_style.h"

namespace calivera::charts {
namespace {

using namespace palette;

constexpr double kTitlePoints = 16.0;
constexpr double kRowPoints = 13.0;
constexpr double kAxisPoints = 22.0;
constexpr double kNotePoints = 10.0;

double toAxis(PoolingScale scale, double natural) {
  switch (scale) {
    case PoolingScale::Logit:
      return std::log(natural / (1.0 - natural));
    case PoolingScale::Log:
      return std::log(natural);
    case PoolingScale::Identity:
      return natural;
  }
  return natural;
}

// About five round values between lo and hi (natural units).
std::vector<double> niceTicks(double lo, double hi) {
  const double span = hi - lo;
  if (!(span > 0.0)) return {lo};
  const double raw = span / 5.0;
  const double magnitude = std::pow(10.0, std::floor(std::log10(raw)));
  double step = magnitude;
  for (const double m : {1.0, 2.0, 2.5, 5.0, 10.0}) {
    step = m * magnitude;
    if (span / step <= 6.0) break;
  }
  std::vector<double> ticks;
  for (double t = std::ceil(lo / step) * step; t <= hi + step * 1e-9; t += step) {
    ticks.push_back(std::abs(t) < step * 1e-9 ? 0.0 : t);
  }
  return ticks;
}

// The fewest decimals that write every tick exactly (a step of 0.25 needs two).
int decimalsFor(const std::vector<double>& ticks) {
  if (ticks.size() < 2) return 2;
  const double step = ticks[1] - ticks[0];
  for (int d = 0; d < 4; ++d) {
    const double scaled = step * std::pow(10.0, d);
    if (std::abs(scaled - std::round(scaled)) < 1e-6 * scaled) return d;
  }
  return 4;
}

}  // namespace

double forestPlotHeightPoints(const ForestPlot& plot) {
  const std::size_t rows = plot.sites.size() + (plot.pooled ? 1 : 0) +
                           (plot.predictionInterval ? 1 : 0) + 1;  // + the column header
  const std::size_t notes = 1 + plot.leftOut.size();
  return kTitlePoints + kRowPoints * static_cast<double>(rows) + kAxisPoints +
         kNotePoints * static_cast<double>(notes) + 4.0;
}

void paintForestPlot(QPainter& painter, const QRectF& target, const ForestPlot& plot, double unit) {
  const auto pt = [unit](double points) { return points * unit; };
  painter.save();
  painter.setRenderHint(QPainter::Antialiasing);
  const QFont title = painterFont(8.5, unit, true);
  const QFont text = painterFont(7.0, unit);
  const QFont small = painterFont(6.5, unit);
  const double labelWidth = target.width() * 0.26;
  const double valueWidth = target.width() * 0.26;
  const QRectF plotArea(target.left() + labelWidth + pt(6), target.top(),
                        target.width() - labelWidth - valueWidth - pt(12), target.height());

  // Axis range over everything drawn, on the axis scale, padded.
  std::vector<double> values;
  for (const ForestRow& r : plot.sites) values.insert(values.end(), {r.ci.lo, r.ci.hi});
  if (plot.pooled) values.insert(values.end(), {plot.pooled->ci.lo, plot.pooled->ci.hi});
  if (plot.predictionInterval) {
    values.insert(values.end(), {plot.predictionInterval->lo, plot.predictionInterval->hi});
  }
  if (plot.ideal) values.push_back(*plot.ideal);
  double lo = 0.0, hi = 1.0;
  bool any = false;
  for (const double v : values) {
    const double a = toAxis(plot.scale, v);
    if (!std::isfinite(a)) continue;
    lo = any ? std::min(lo, a) : a;
    hi = any ? std::max(hi, a) : a;
    any = true;
  }
  if (!(hi > lo)) {
    lo -= 0.5;
    hi += 0.5;
  }
  const double pad = 0.06 * (hi - lo);
  lo -= pad;
  hi += pad;
  const auto x = [&](double natural) {
    const double a = std::clamp(toAxis(plot.scale, natural), lo, hi);
    return plotArea.left() + (a - lo) / (hi - lo) * plotArea.width();
  };

  double y = paintPlotTitle(painter, title, target, pt(kTitlePoints), plot.title);
  painter.setFont(small);
  painter.setPen(kGrey);
  painter.drawText(QRectF(target.left(), y, labelWidth, pt(kRowPoints)),
                   Qt::AlignLeft | Qt::AlignVCenter, QStringLiteral("Site"));
  painter.drawText(QRectF(target.right() - valueWidth, y, valueWidth, pt(kRowPoints)),
                   Qt::AlignRight | Qt::AlignVCenter, QStringLiteral("Estimate (95% CI)"));
  y += pt(kRowPoints);
  const double rowsTop = y;

  const auto label = [&](const std::string& name, const std::string& value, double rowY,
                         bool bold) {
    QFont font = text;
    font.setBold(bold);
    painter.setFont(font);
    painter.setPen(kBlack);
    const QFontMetricsF metrics(font);
    painter.drawText(QRectF(target.left(), rowY, labelWidth, pt(kRowPoints)),
                     Qt::AlignLeft | Qt::AlignVCenter,
                     metrics.elidedText(QString::fromStdString(name), Qt::ElideRight, labelWidth));
    painter.drawText(QRectF(target.right() - valueWidth, rowY, valueWidth, pt(kRowPoints)),
                     Qt::AlignRight | Qt::AlignVCenter, QString::fromStdString(value));
  };
  const QColor siteColor = kBlue;
  for (const ForestRow& r : plot.sites) {
    const double mid = y + pt(kRowPoints) / 2.0;
    painter.setPen(QPen(kBlack, pt(0.8)));
    painter.drawLine(QPointF(x(r.ci.lo), mid), QPointF(x(r.ci.hi), mid));
    const double side = pt(2.5 + 7.0 * std::sqrt(std::clamp(r.weight, 0.0, 1.0)));
    painter.setPen(Qt::NoPen);
    painter.setBrush(siteColor);
    painter.drawRect(QRectF(x(r.estimate) - side / 2.0, mid - side / 2.0, side, side));
    label(r.label, r.valueText, y, false);
    y += pt(kRowPoints);
  }
  if (plot.pooled) {
    const ForestRow& p = *plot.pooled;
    const double mid = y + pt(kRowPoints) / 2.0;
    QPainterPath diamond;
    diamond.moveTo(x(p.ci.lo), mid);
    diamond.lineTo(x(p.estimate), mid - pt(4.5));
    diamond.lineTo(x(p.ci.hi), mid);
    diamond.lineTo(x(p.estimate), mid + pt(4.5));
    diamond.closeSubpath();
    painter.setPen(QPen(kBlack, pt(0.6)));
    painter.setBrush(kVermillion);
    painter.drawPath(diamond);
    label(p.label, p.valueText, y, true);
    y += pt(kRowPoints);
  }
  if (plot.predictionInterval) {
    const Interval& pi = *plot.predictionInterval;
    const double mid = y + pt(kRowPoints) / 2.0;
    QPen dashed(kVermillion, pt(1.2));
    dashed.setStyle(Qt::DashLine);
    dashed.setCapStyle(Qt::FlatCap);
    painter.setPen(dashed);
    painter.drawLine(QPointF(x(pi.lo), mid), QPointF(x(pi.hi), mid));
    painter.setPen(QPen(kVermillion, pt(1.0)));
    for (const double end : {pi.lo, pi.hi}) {
      painter.drawLine(QPointF(x(end), mid - pt(3)), QPointF(x(end), mid + pt(3)));
    }
    label("Prediction interval", formatRange(pi.lo, pi.hi, 3), y, false);
    y += pt(kRowPoints);
  }
  const double rowsBottom = y;
  if (plot.ideal) {
    QPen dotted(kGrey, pt(0.7));
    dotted.setStyle(Qt::DotLine);
    painter.setPen(dotted);
    painter.drawLine(QPointF(x(*plot.ideal), rowsTop), QPointF(x(*plot.ideal), rowsBottom));
  }
  // Axis with ticks in natural units.
  painter.setPen(QPen(kBlack, pt(0.6)));
  painter.drawLine(QPointF(plotArea.left(), rowsBottom + pt(2)),
                   QPointF(plotArea.right(), rowsBottom + pt(2)));
  const double naturalLo = toNaturalScale(plot.scale, lo);
  const double naturalHi = toNaturalScale(plot.scale, hi);
  const std::vector<double> ticks = niceTicks(naturalLo, naturalHi);
  const int decimals = decimalsFor(ticks);
  painter.setFont(small);
  for (const double t : ticks) {
    const double tx = x(t);
    painter.setPen(QPen(kBlack, pt(0.6)));
    painter.drawLine(QPointF(tx, rowsBottom + pt(2)), QPointF(tx, rowsBottom + pt(5)));
    painter.drawText(QRectF(tx - pt(20), rowsBottom + pt(5), pt(40), pt(9)), Qt::AlignCenter,
                     QString::fromStdString(formatNumber(t, decimals)));
  }
  y = rowsBottom + pt(kAxisPoints);
  painter.setFont(small);
  painter.setPen(kGrey);
  painter.drawText(QRectF(target.left(), y, target.width(), pt(kNotePoints)),
                   Qt::AlignLeft | Qt::AlignVCenter, QString::fromStdString(plot.note));
  y += pt(kNotePoints);
  paintLeftOutLines(painter, plot.leftOut, target.left(), y, target.width(), pt(kNotePoints));
  painter.restore();
}

}  // namespace calivera::charts
