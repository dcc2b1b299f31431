#include "ui/views/chart_panel.h"

#include <QApplication>
#include <QClipboard>
#include <QContextMenuEvent>
#include <QKeyEvent>
#include <QMenu>
#include <QMouseEvent>
#include <QToolTip>
#include <QtCharts/QLegend>

#include "render/charts/chart_render.h"
#include "render/charts/chart_style.h"
#include "ui/views/legend_strip.h"

namespace calivera::ui {

ChartPanel::ChartPanel(const QString& objectName, QWidget* parent) : QChartView(parent) {
  setObjectName(objectName);
  setRenderHint(QPainter::Antialiasing);
  setMouseTracking(true);
  setMinimumSize(320, 240);
  setFocusPolicy(Qt::StrongFocus);
  legend_ = new LegendStrip(this);
  legend_->setObjectName(objectName + QStringLiteral("Legend"));
  auto* placeholder = new QChart;
  charts::applyChartStyle(placeholder, tr("Run the validation to see this view"));
  // QChartView makes a default chart, and setChart does not delete the chart it replaces.
  QChart* initial = chart();
  setChart(placeholder);
  delete initial;
}

void ChartPanel::setLinkedChart(charts::LinkedChart* chart) {
  QChart* previous = this->chart();
  if (chart == nullptr) {
    auto* placeholder = new QChart;
    charts::applyChartStyle(placeholder, tr("Run the validation to see this view"));
    setChart(placeholder);
  } else {
    setChart(chart);
  }
  linked_ = chart;
  delete previous;  // setChart does not delete the chart it replaces
  this->chart()->legend()->setVisible(false);
  legend_->setChart(chart);
  placeLegend();
}

void ChartPanel::resizeEvent(QResizeEvent* event) {
  QChartView::resizeEvent(event);
  placeLegend();
}

void ChartPanel::placeLegend() {
  const QRect inside = contentsRect();
  const int h = legend_->heightForWidth(inside.width());
  // The strip sits in a bottom margin of the view, so the plot never runs under it.
  setViewportMargins(0, 0, 0, h);
  legend_->setGeometry(inside.left(), inside.bottom() + 1 - h, inside.width(), h);
  legend_->setVisible(h > 0);
  // QChartView sizes its chart to the whole view, margins included; the chart must fit the
  // viewport above the strip, or its x axis (numbers and title) is drawn under the strip.
  if (QChart* c = chart()) {
    const QSize free = viewport()->size();
    c->resize(free);
    setSceneRect(QRectF(QPointF(0, 0), QSizeF(free)));
  }
}

QPointF ChartPanel::valueAt(QPoint widgetPos) const {
  if (linked_ == nullptr || linked_->series().isEmpty()) return {};
  return linked_->mapToValue(mapToScene(widgetPos), linked_->series().last());
}

void ChartPanel::mouseMoveEvent(QMouseEvent* event) {
  QChartView::mouseMoveEvent(event);
  if (linked_ == nullptr) return;
  const QString text = linked_->plotArea().contains(mapToScene(event->pos()))
                           ? linked_->describeAt(valueAt(event->pos()))
                           : QString();
  if (text.isEmpty()) {
    QToolTip::hideText();
  } else {
    QToolTip::showText(event->globalPosition().toPoint(), text, this);
  }
}

void ChartPanel::mousePressEvent(QMouseEvent* event) {
  QChartView::mousePressEvent(event);
  if (linked_ == nullptr || event->button() != Qt::LeftButton) return;
  if (!linked_->plotArea().contains(mapToScene(event->pos()))) return;
  if (const auto t = linked_->thresholdAt(valueAt(event->pos()))) emit thresholdPicked(*t);
}

void ChartPanel::contextMenuEvent(QContextMenuEvent* event) {
  if (linked_ == nullptr) return;
  QMenu menu(this);
  menu.setObjectName(objectName() + QStringLiteral("Menu"));
  QAction* copyAction = menu.addAction(tr("Copy chart as image"));
  copyAction->setObjectName(QStringLiteral("chartMenuCopy"));
  QAction* exportAction = menu.addAction(tr("Export this chart as PNG and SVG…"));
  exportAction->setObjectName(QStringLiteral("chartMenuExport"));
  QAction* chosen = menu.exec(event->globalPos());
  if (chosen == exportAction) emit exportRequested(this);
  if (chosen == copyAction) emit copyRequested(this);
}

void ChartPanel::keyPressEvent(QKeyEvent* event) {
  switch (event->key()) {
    case Qt::Key_Right:
    case Qt::Key_Up:
      emit nudgeRequested(1);
      break;
    case Qt::Key_Left:
    case Qt::Key_Down:
      emit nudgeRequested(-1);
      break;
    case Qt::Key_PageUp:
      emit nudgeRequested(10);
      break;
    case Qt::Key_PageDown:
      emit nudgeRequested(-10);
      break;
    default:
      QChartView::keyPressEvent(event);
      return;
  }
  event->accept();
}

QSize ChartPanel::exportSize() const {
  return size().expandedTo(QSize(900, 600));
}

QString ChartPanel::exportPng(const QString& path, const QStringList& footer) {
  if (linked_ == nullptr) return tr("there is no chart to export yet");
  return charts::exportChartPng(*linked_, path, exportSize(), footer);
}

bool ChartPanel::copyImage(const QStringList& footer) {
  if (linked_ == nullptr) return false;
  QApplication::clipboard()->setImage(charts::chartImage(*linked_, exportSize(), footer));
  return true;
}

QString ChartPanel::exportSvg(const QString& path, const QStringList& footer) {
  if (linked_ == nullptr) return tr("there is no chart to export yet");
  return charts::exportChartSvg(*linked_, path, exportSize(), linked_->title(), footer);
}

}  // namespace calivera::ui
