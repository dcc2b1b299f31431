#pragma once
// Calibration view: observed share with the event against predicted risk. Shows the line where
// predicted equals observed, core's smoothed (loess) calibration curve, each risk group as a
// diamond on its Wilson 95% interval, and a vertical line at the threshold. The distribution of
// predicted risk is a separate hatched strip below the zero line, sharing the x axis (its height
// is relative: the fullest bin fills the strip). The calibration slope, intercept and O/E are in
// a small box in the plot's upper-left corner, not in the title. With the uncertainty layer: a
// shaded bootstrap band around the smoothed curve (setCurveBand) and the smoothed curves of further
// models (addComparison).

#include <vector>

#include "core/metrics/validation.h"
#include "core/uncertainty/validation_bootstrap.h"
#include "render/charts/linked_chart.h"

class QAreaSeries;
class QGraphicsRectItem;
class QLineSeries;

namespace calivera::charts {

class CalibrationChart : public LinkedChart {
 public:
  CalibrationChart(const Calibration& calibration, const RiskHistogram& distribution);

  void setThreshold(const ThresholdSnapshot& snapshot) override;
  std::optional<double> thresholdAt(QPointF value) const override;
  QString describeAt(QPointF value) const override;
  QString exportName() const override { return QStringLiteral("calibration"); }

  double markedThreshold() const;
  double axisMax() const { return axisMax_; }
  // Depth of the risk-distribution strip below 0, in observed-axis units.
  double stripDepth() const { return stripDepth_; }
  // The summary box's lines ("Slope 0.77 (target 1)", "Intercept ...", "O/E ...").
  QString summaryText() const;

  // Shaded percentile 95% band of the smoothed curve (ValidationBootstrap::calibrationCurve);
  // grid points without a finite interval are left out. A second call replaces the band.
  void setCurveBand(const std::vector<BandPoint>& band);
  QAreaSeries* curveBand() const { return band_; }
  // The smoothed curve of a further model validated on the same patients, in its own colour and
  // dash pattern (overlay_series.h), named in the legend. Parts beyond the axes are clipped.
  void addComparison(const QString& name, const Calibration& calibration);
  std::size_t comparisonCount() const { return comparisons_.size(); }

 private:
  struct Comparison {
    QString name;
    std::vector<CalibrationCurvePoint> curve;
  };
  QString describeOverlays(QPointF value, double tolerance) const;
  void addSummaryBox(const Calibration& calibration);

  std::vector<BandPoint> bandPoints_;
  QAreaSeries* band_ = nullptr;
  std::vector<Comparison> comparisons_;
  std::vector<CalibrationGroup> groups_;
  std::vector<CalibrationCurvePoint> curve_;
  RiskHistogram distribution_;
  double axisMax_ = 1.0;
  double stripDepth_ = 0.0;
  QGraphicsRectItem* summary_ = nullptr;
  QLineSeries* marker_ = nullptr;
};

}  // namespace calivera::charts
