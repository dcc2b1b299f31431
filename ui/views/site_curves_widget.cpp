#include "ui/views/site_curves_widget.h"

#include <QPainter>
#include <algorithm>
#include <cmath>

#include "render/charts/site_curves_plot.h"

namespace calivera::ui {

SiteCurvesWidget::SiteCurvesWidget(QWidget* parent) : QWidget(parent) {
  setObjectName(QStringLiteral("siteCurvesPlot"));
  setAccessibleName(tr("Calibration by site"));
  setSizePolicy(QSizePolicy::Expanding, QSizePolicy::Expanding);
  setMinimumSize(320, 200);
}

void SiteCurvesWidget::setPlot(SiteCurvesPlot plot) {
  plot_ = std::move(plot);
  highlight_.reset();
  updateGeometry();
  update();
}

void SiteCurvesWidget::highlightSite(std::optional<std::size_t> siteIndex) {
  highlight_.reset();
  for (std::size_t i = 0; siteIndex && i < plot_.curves.size(); ++i) {
    if (plot_.curves[i].siteIndex == *siteIndex) highlight_ = i;
  }
  update();
}

double SiteCurvesWidget::unitFor(const QSize& size) const {
  // As large as print and a little more on screen, but never taller than the widget.
  // The plot's height depends on its width in points, which depends on the unit: a few rounds
  // settle it.
  const double preferred = 1.25 * logicalDpiY() / 72.0;
  double unit = preferred;
  for (int round = 0; round < 4; ++round) {
    const double needed = charts::siteCurvesPlotHeightPoints(plot_, size.width() / unit);
    unit = std::clamp(size.height() / std::max(1.0, needed), 0.5, preferred);
  }
  return unit;
}

QSize SiteCurvesWidget::sizeHint() const {
  const double unit = 1.25 * logicalDpiY() / 72.0;
  return {640, static_cast<int>(
                   std::ceil(charts::siteCurvesPlotHeightPoints(plot_, 640 / unit) * unit))};
}

void SiteCurvesWidget::paintEvent(QPaintEvent*) {
  QPainter painter(this);
  painter.fillRect(rect(), palette().base());
  const QSize inner = rect().adjusted(8, 4, -8, -4).size();
  const double unit = unitFor(inner);
  charts::paintSiteCurvesPlot(painter, QRectF(8, 4, inner.width(), inner.height()), plot_, unit,
                              highlight_);
}

}  // namespace calivera::ui
