#include "ui/views/forest_widget.h"

#include <QPainter>
#include <cmath>

#include "render/charts/forest_plot.h"

namespace calivera::ui {

ForestWidget::ForestWidget(ForestPlot plot, QWidget* parent)
    : QWidget(parent), plot_(std::move(plot)) {
  setObjectName(QStringLiteral("forestPlot"));
  setAccessibleName(QString::fromStdString("Forest plot: " + plot_.title));
  setSizePolicy(QSizePolicy::Expanding, QSizePolicy::Fixed);
  setMinimumHeight(sizeHint().height());
  setMinimumWidth(360);
}

double ForestWidget::unit() const {
  // Slightly larger than print so the 7-point labels read comfortably on screen.
  return 1.25 * logicalDpiY() / 72.0;
}

QSize ForestWidget::sizeHint() const {
  // Narrower than two columns of the smallest screen, so a pair never needs a horizontal scroll.
  return {480, static_cast<int>(std::ceil(charts::forestPlotHeightPoints(plot_) * unit()))};
}

void ForestWidget::paintEvent(QPaintEvent*) {
  QPainter painter(this);
  painter.fillRect(rect(), palette().base());
  charts::paintForestPlot(painter, QRectF(rect()).adjusted(8, 0, -8, 0), plot_, unit());
}

}  // namespace calivera::ui
