#pragma once
// Shows one LinkedChart: tooltips with exact values under the mouse, a click sets the threshold
// (where the chart supports it), arrow keys nudge it, and a context menu copies the chart as an
// image or exports it as PNG and SVG (both with the window's footer: caution, fingerprints, date).
// The legend is a wrapping strip under the plot (legend_strip.h); exported files carry the chart's
// own legend beside the plot instead, where a wide export has room for it.

#include <QtCharts/QChartView>

#include "render/charts/linked_chart.h"

namespace calivera::ui {

class LegendStrip;

class ChartPanel : public QChartView {
  Q_OBJECT

 public:
  explicit ChartPanel(const QString& objectName, QWidget* parent = nullptr);

  // Takes ownership; the previous chart is deleted. nullptr shows an empty placeholder.
  void setLinkedChart(charts::LinkedChart* chart);
  charts::LinkedChart* linkedChart() const { return linked_; }

  // Exports at the view's current size (at least 900 x 600); empty string on success.
  // `footer`: lines printed below the chart (the caution, fingerprints, date).
  QString exportPng(const QString& path, const QStringList& footer = {});
  QString exportSvg(const QString& path, const QStringList& footer = {});
  // The exported image with `footer` on the clipboard; false when there is no chart.
  bool copyImage(const QStringList& footer = {});

  // Chart coordinates of a widget position (for tests and the click handler).
  QPointF valueAt(QPoint widgetPos) const;
  const LegendStrip* legendStrip() const { return legend_; }

 signals:
  void thresholdPicked(double threshold);
  void exportRequested(ChartPanel* panel);
  void copyRequested(ChartPanel* panel);  // the context menu's Copy chart
  void nudgeRequested(int steps);         // arrow keys: +1 / -1 (Page Up/Down: +-10)

 protected:
  void mouseMoveEvent(QMouseEvent* event) override;
  void mousePressEvent(QMouseEvent* event) override;
  void contextMenuEvent(QContextMenuEvent* event) override;
  void keyPressEvent(QKeyEvent* event) override;
  void resizeEvent(QResizeEvent* event) override;

 private:
  QSize exportSize() const;
  void placeLegend();
  charts::LinkedChart* linked_ = nullptr;
  LegendStrip* legend_ = nullptr;
};

}  // namespace calivera::ui
