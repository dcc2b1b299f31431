#pragma once
// Calibration view: observed proportion against predicted risk. Shows the ideal line, core's
// smoothed (loess) calibration curve, the grouped observed proportions with their Wilson 95% CIs
// as vertical bars, the distribution of predicted risks as a histogram along the bottom (its
// height is relative; a hidden right-hand axis scales it to the lowest fifth of the plot), and a
// vertical line at the threshold. With the uncertainty layer: a shaded bootstrap band around the
// smoothed curve (setCurveBand) and the smoothed curves of further models (addComparison).

#include <vector>

#include "core/metrics/validation.h"
#include "core/uncertainty/validation_bootstrap.h"
#include "render/charts/linked_chart.h"

class QAreaSeries;
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

  std::vector<BandPoint> bandPoints_;
  QAreaSeries* band_ = nullptr;
  std::vector<Comparison> comparisons_;
  std::vector<CalibrationGroup> groups_;
  std::vector<CalibrationCurvePoint> curve_;
  double axisMax_ = 1.0;
  QLineSeries* marker_ = nullptr;
};

}  // namespace calivera::charts
