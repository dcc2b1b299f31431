#pragma once
// Calibration view: observed proportion against predicted risk. Shows the ideal line, core's
// smoothed (loess) calibration curve, the grouped observed proportions with their Wilson 95% CIs
// as vertical bars, the distribution of predicted risks as a histogram along the bottom (its
// height is relative; a hidden right-hand axis scales it to the lowest fifth of the plot), and a
// vertical line at the threshold.

#include <vector>

#include "core/metrics/validation.h"
#include "ui/charts/linked_chart.h"

class QLineSeries;

namespace calivera::ui::charts {

class CalibrationChart : public LinkedChart {
 public:
  CalibrationChart(const Calibration& calibration, const RiskHistogram& distribution);

  void setThreshold(const ThresholdSnapshot& snapshot) override;
  std::optional<double> thresholdAt(QPointF value) const override;
  QString describeAt(QPointF value) const override;
  QString exportName() const override { return QStringLiteral("calibration"); }

  double markedThreshold() const;
  double axisMax() const { return axisMax_; }

 private:
  std::vector<CalibrationGroup> groups_;
  std::vector<CalibrationCurvePoint> curve_;
  double axisMax_ = 1.0;
  QLineSeries* marker_ = nullptr;
};

}  // namespace calivera::ui::charts
