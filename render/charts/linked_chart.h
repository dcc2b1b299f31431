#pragma once
// Base of every chart that follows the shared decision threshold. A LinkedChart is a plain QChart:
// it holds copies of the result data it draws (built from core result structs), knows nothing
// about the main window, and can be shown in a QChartView or painted into any rect with
// renderChart() (chart_render.h), which is how the PDF report uses the same chart code.
//
// Moving the threshold only moves markers (a few points per chart); the curves are built once.

#include <QPointF>
#include <QString>
#include <QtCharts/QChart>
#include <optional>

#include "core/study/threshold_state.h"

namespace calivera::charts {

class LinkedChart : public QChart {
 public:
  using QChart::QChart;

  // Moves the threshold markers. Cheap: never rebuilds the curves.
  virtual void setThreshold(const ThresholdSnapshot& snapshot) = 0;
  // The threshold a click at `value` (chart coordinates) selects, if the chart supports picking.
  virtual std::optional<double> thresholdAt(QPointF value) const = 0;
  // Exact values under `value` for the tooltip; empty when nothing is near.
  virtual QString describeAt(QPointF value) const = 0;
  // A short file-name stem for exports ("roc", "calibration").
  virtual QString exportName() const = 0;
};

}  // namespace calivera::charts
