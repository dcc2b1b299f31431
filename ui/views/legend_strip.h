#pragma once
// The legend of a chart on screen, under the plot, wrapped onto as many rows as the width needs
// (render/charts/legend_painter.h says why Qt's own legend is not used).

#include <QStringList>
#include <QWidget>
#include <vector>

#include "render/charts/legend_painter.h"

class QChart;

namespace calivera::ui {

class LegendStrip : public QWidget {
  Q_OBJECT

 public:
  explicit LegendStrip(QWidget* parent = nullptr);

  void setChart(const QChart* chart);  // nullptr: no entries
  const std::vector<charts::LegendEntry>& entries() const { return entries_; }
  QStringList labels() const;
  int rowsForWidth(int width) const;

  bool hasHeightForWidth() const override { return true; }
  int heightForWidth(int width) const override;
  QSize sizeHint() const override;

 protected:
  void paintEvent(QPaintEvent* event) override;

 private:
  std::vector<charts::LegendEntry> entries_;
};

}  // namespace calivera::ui
