#pragma once
// One forest plot (render/charts/forest_plot.h) as a widget: the same drawing as the PDF report,
// at the screen's resolution, as tall as the plot needs.

#include <QWidget>

#include "core/report/site_forest.h"

namespace calivera::ui {

class ForestWidget : public QWidget {
  Q_OBJECT

 public:
  explicit ForestWidget(ForestPlot plot, QWidget* parent = nullptr);
  const ForestPlot& plot() const { return plot_; }
  QSize sizeHint() const override;

 protected:
  void paintEvent(QPaintEvent* event) override;

 private:
  double unit() const;  // pixels per point
  ForestPlot plot_;
};

}  // namespace calivera::ui
