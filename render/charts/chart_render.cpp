#include "render/charts/chart_render.h"

#include <QGraphicsLayout>
#include <QGraphicsScene>
#include <QImage>
#include <QPainter>
#include <QSaveFile>
#include <QSvgGenerator>
#include <QtCharts/QChart>
#include <memory>

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

QString exportChartPng(QChart& chart, const QString& path, QSize size) {
  constexpr int kScale = 2;
  QImage image(size * kScale, QImage::Format_ARGB32_Premultiplied);
  image.setDevicePixelRatio(kScale);
  image.fill(Qt::white);
  {
    QPainter painter(&image);
    painter.setRenderHint(QPainter::Antialiasing);
    renderChart(chart, painter, QRectF(QPointF(0, 0), QSizeF(size)));
  }
  QSaveFile file(path);
  if (!file.open(QIODevice::WriteOnly)) return file.errorString();
  if (!image.save(&file, "PNG")) return QStringLiteral("PNG encoding failed");
  if (!file.commit()) return file.errorString();
  return {};
}

QString exportChartSvg(QChart& chart, const QString& path, QSize size, const QString& title) {
  QSaveFile file(path);
  if (!file.open(QIODevice::WriteOnly)) return file.errorString();
  QSvgGenerator generator;
  generator.setOutputDevice(&file);
  generator.setSize(size);
  generator.setViewBox(QRect(QPoint(0, 0), size));
  generator.setTitle(title);
  generator.setDescription(QStringLiteral("Calivera chart"));
  {
    QPainter painter(&generator);
    renderChart(chart, painter, QRectF(QPointF(0, 0), QSizeF(size)));
  }
  if (!file.commit()) return file.errorString();
  return {};
}

}  // namespace calivera::charts
