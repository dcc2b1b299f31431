#include "render/charts/chart_render.h"

#include <QFontMetrics>
#include <QGraphicsLayout>
#include <QGraphicsScene>
#include <QImage>
#include <QPainter>
#include <QPen>
#include <QSaveFile>
#include <QSvgGenerator>
#include <QtCharts/QChart>
#include <QtCharts/QLegend>
#include <algorithm>
#include <memory>

#include "render/charts/legend_painter.h"

namespace calivera::charts {

void renderChart(QChart& chart, QPainter& painter, const QRectF& target) {
  QGraphicsScene* scene = chart.scene();
  std::unique_ptr<QGraphicsScene> ownScene;
  const QSizeF previousSize = chart.size();
  const QPointF previousPos = chart.pos();
  if (scene == nullptr) {
    ownScene = std::make_unique<QGraphicsScene>();
    scene = ownScene.get();
    scene->addItem(&chart);
  }
  chart.setPos(0, 0);
  chart.resize(target.size());
  // Layout of axes and legend happens on the layout request; force it before painting.
  chart.layout()->activate();
  scene->setSceneRect(QRectF(QPointF(0, 0), target.size()));
  scene->render(&painter, target, QRectF(QPointF(0, 0), target.size()));
  if (ownScene) {
    scene->removeItem(&chart);
  } else {
    chart.setPos(previousPos);
    chart.resize(previousSize);
  }
}

namespace {

constexpr int kFooterMargin = 8;

QFont footerFont() {
  QFont font;
  font.setPointSizeF(7.5);
  return font;
}

// The footer's text, one paragraph per line given.
QString footerText(const QStringList& footer) {
  return footer.join(QChar('\n'));
}

// Height of the footer band for a chart `width` wide (0 without footer lines).
int footerHeight(const QStringList& footer, int width) {
  if (footer.isEmpty()) return 0;
  const QFontMetrics metrics(footerFont());
  const QRect box = metrics.boundingRect(QRect(0, 0, width - 2 * kFooterMargin, 10000),
                                         Qt::TextWordWrap, footerText(footer));
  return box.height() + 2 * kFooterMargin;
}

// The exported chart: the plot on the left, our legend column (legend_painter.h: each entry's
// own line style, fill or marker, and its whole label, wrapped) on the right, as in the report.
void paintChartWithLegend(QChart& chart, QPainter& painter, QSize size) {
  const std::vector<LegendEntry> legend = legendEntries(chart);
  const bool wasVisible = chart.legend()->isVisible();
  chart.legend()->setVisible(false);
  const double legendWidth = legend.empty() ? 0.0 : std::min(260.0, size.width() * 0.3);
  const double plotWidth = size.width() - legendWidth;
  renderChart(chart, painter, QRectF(0, 0, plotWidth, size.height()));
  chart.legend()->setVisible(wasVisible);
  if (legend.empty()) return;
  QFont font = chart.titleFont();
  font.setBold(false);
  font.setPointSizeF(9);
  painter.setRenderHint(QPainter::Antialiasing);
  paintLegendColumn(painter, legend, QRectF(plotWidth, 20, legendWidth - 10, size.height() - 40),
                    font);
}

void paintFooter(QPainter& painter, const QStringList& footer, QSize chartSize, int height) {
  if (footer.isEmpty()) return;
  painter.setPen(QPen(QColor(170, 170, 170), 0));
  painter.drawLine(kFooterMargin, chartSize.height(), chartSize.width() - kFooterMargin,
                   chartSize.height());
  painter.setPen(QColor(70, 70, 70));
  painter.setFont(footerFont());
  painter.drawText(QRect(kFooterMargin, chartSize.height() + kFooterMargin,
                         chartSize.width() - 2 * kFooterMargin, height - 2 * kFooterMargin),
                   Qt::TextWordWrap, footerText(footer));
}

}  // namespace

QImage chartImage(QChart& chart, QSize size, const QStringList& footer) {
  constexpr int kScale = 2;
  const int band = footerHeight(footer, size.width());
  QImage image(QSize(size.width(), size.height() + band) * kScale,
               QImage::Format_ARGB32_Premultiplied);
  image.setDevicePixelRatio(kScale);
  image.fill(Qt::white);
  {
    QPainter painter(&image);
    painter.setRenderHint(QPainter::Antialiasing);
    paintChartWithLegend(chart, painter, size);
    paintFooter(painter, footer, size, band);
  }
  return image;
}

QString exportChartPng(QChart& chart, const QString& path, QSize size, const QStringList& footer) {
  const QImage image = chartImage(chart, size, footer);
  QSaveFile file(path);
  if (!file.open(QIODevice::WriteOnly)) return file.errorString();
  if (!image.save(&file, "PNG")) return QStringLiteral("PNG encoding failed");
  if (!file.commit()) return file.errorString();
  return {};
}

QString exportChartSvg(QChart& chart, const QString& path, QSize size, const QString& title,
                       const QStringList& footer) {
  QSaveFile file(path);
  if (!file.open(QIODevice::WriteOnly)) return file.errorString();
  const int band = footerHeight(footer, size.width());
  const QSize whole(size.width(), size.height() + band);
  QSvgGenerator generator;
  generator.setOutputDevice(&file);
  generator.setSize(whole);
  generator.setViewBox(QRect(QPoint(0, 0), whole));
  generator.setTitle(title);
  generator.setDescription(footer.isEmpty() ? QStringLiteral("Calivera chart")
                                            : footerText(footer));
  {
    QPainter painter(&generator);
    paintChartWithLegend(chart, painter, size);
    paintFooter(painter, footer, size, band);
  }
  if (!file.commit()) return file.errorString();
  return {};
}

}  // namespace calivera::charts
