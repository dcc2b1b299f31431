#include "render/charts/chart_style.h"

#include <QFontMetricsF>
#include <QPainter>
#include <QtCharts/QAbstractSeries>
#include <QtCharts/QChart>
#include <QtCharts/QLegend>
#include <QtCharts/QLegendMarker>
#include <QtCharts/QValueAxis>
#include <algorithm>
#include <cmath>
#include <memory>

namespace calivera::charts {

QFont painterFont(double points, double unit, bool bold) {
  QFont font(QStringLiteral("Sans Serif"));
  font.setPixelSize(std::max(1, static_cast<int>(std::lround(points * unit))));
  font.setBold(bold);
  return font;
}

double paintPlotTitle(QPainter& painter, const QFont& font, const QRectF& target, double height,
                      const std::string& title) {
  painter.setFont(font);
  painter.setPen(palette::kBlack);
  painter.drawText(QRectF(target.left(), target.top(), target.width(), height),
                   Qt::AlignLeft | Qt::AlignVCenter, QString::fromStdString(title));
  return target.top() + height;
}

double paintLeftOutLines(QPainter& painter, const std::vector<std::string>& leftOut, double left,
                         double top, double width, double lineHeight) {
  const QFontMetricsF metrics(painter.font());
  for (const std::string& entry : leftOut) {
    painter.drawText(
        QRectF(left, top, width, lineHeight), Qt::AlignLeft | Qt::AlignVCenter,
        metrics.elidedText(QString::fromStdString("Left out: " + entry), Qt::ElideRight, width));
    top += lineHeight;
  }
  return top;
}

QColor roleColor(SeriesRole role) {
  switch (role) {
    case SeriesRole::Model:
      return palette::kBlue;
    case SeriesRole::Reference:
      return palette::kGrey;
    case SeriesRole::TreatAll:
      return palette::kVermillion;
    case SeriesRole::TreatNone:
      return palette::kBlack;
    case SeriesRole::Threshold:
      return palette::kReddishPurple;
    case SeriesRole::Events:
      return palette::kOrange;
    case SeriesRole::NonEvents:
      return palette::kSkyBlue;
    case SeriesRole::Groups:
      return palette::kBlack;
    case SeriesRole::Range:
      return palette::kBluishGreen;
  }
  return palette::kBlack;
}

QPen rolePen(SeriesRole role) {
  QPen pen(roleColor(role));
  pen.setCosmetic(true);
  switch (role) {
    case SeriesRole::Model:
      pen.setWidthF(2.5);
      break;
    case SeriesRole::Reference:
      pen.setWidthF(1.5);
      pen.setStyle(Qt::DashDotLine);
      break;
    case SeriesRole::TreatAll:
      pen.setWidthF(2.0);
      pen.setStyle(Qt::DashLine);
      break;
    case SeriesRole::TreatNone:
      pen.setWidthF(2.0);
      pen.setStyle(Qt::DotLine);
      break;
    case SeriesRole::Threshold:
      pen.setWidthF(2.0);
      break;
    case SeriesRole::Events:
      pen.setWidthF(1.8);
      break;
    case SeriesRole::NonEvents:
      pen.setWidthF(1.8);
      pen.setStyle(Qt::DashLine);
      break;
    case SeriesRole::Groups:
      pen.setWidthF(1.5);
      break;
    case SeriesRole::Range:
      pen.setWidthF(0.0);
      pen.setStyle(Qt::NoPen);
      break;
  }
  return pen;
}

QValueAxis* makeAxis(const QString& title, double min, double max, const QString& format,
                     int tickCount) {
  auto* axis = new QValueAxis;
  axis->setTitleText(title);
  axis->setRange(min, max);
  axis->setLabelFormat(format);
  axis->setTickCount(tickCount);
  QFont font = axis->titleFont();
  font.setPointSizeF(9.5);
  font.setBold(false);
  axis->setTitleFont(font);
  QFont labels = axis->labelsFont();
  labels.setPointSizeF(8.5);
  axis->setLabelsFont(labels);
  axis->setGridLineColor(QColor(225, 225, 225));
  return axis;
}

void applyChartStyle(QChart* chart, const QString& title) {
  chart->setTitle(title);
  QFont font = chart->titleFont();
  font.setPointSizeF(11.0);
  font.setBold(true);
  chart->setTitleFont(font);
  chart->setBackgroundBrush(Qt::white);
  chart->setBackgroundRoundness(0);
  chart->setMargins(QMargins(6, 6, 6, 6));
  chart->setAnimationOptions(QChart::NoAnimation);
  chart->legend()->setAlignment(Qt::AlignBottom);
  QFont legendFont = chart->legend()->font();
  legendFont.setPointSizeF(8.5);
  chart->legend()->setFont(legendFont);
}

void addOnAxes(QChart* chart, QAbstractSeries* series, QAbstractAxis* x, QAbstractAxis* y) {
  chart->addSeries(series);
  series->attachAxis(x);
  series->attachAxis(y);
}

namespace {
// Marker visibility cannot tell a hidden entry from a legend that is itself hidden (the
// workstation draws its own legend strip), so the series carries the choice.
constexpr char kHiddenFromLegend[] = "caliveraHiddenFromLegend";
}  // namespace

void hideFromLegend(QChart* chart, QAbstractSeries* series) {
  for (QLegendMarker* marker : chart->legend()->markers(series)) marker->setVisible(false);
  series->setProperty(kHiddenFromLegend, true);
}

void discardSeries(QChart* chart, QAbstractSeries* series) {
  if (series == nullptr) return;
  chart->removeSeries(series);  // hands ownership back to the caller
  const std::unique_ptr<QAbstractSeries> removed(series);
}

bool isHiddenFromLegend(const QAbstractSeries* series) {
  return series->property(kHiddenFromLegend).toBool();
}

}  // namespace calivera::charts
