#pragma once
// Decision curve (Vickers & Elkin, Med Decis Making 2006): net benefit of the model, of treating
// everyone and of treating no one across threshold probabilities, with the range of clinically
// reasonable thresholds (set by the user, not derived from the data) shaded, and a vertical line at
// the current threshold. Per the authors' guidance the curve is read over the shaded range only.
// With the uncertainty layer: a bootstrap band around the model's net benefit (setNetBenefitBand)
// and the net-benefit curves of further models (addComparison).

#include <vector>

#include "core/metrics/validation.h"
#include "core/uncertainty/validation_bootstrap.h"
#include "render/charts/linked_chart.h"

class QAreaSeries;
class QLineSeries;
class QValueAxis;

namespace calivera::charts {

class DecisionCurveChart : public LinkedChart {
 public:
  DecisionCurveChart(const std::vector<DecisionCurvePoint>& curve, const CohortSummary& cohort);

  void setThreshold(const ThresholdSnapshot& snapshot) override;
  std::optional<double> thresholdAt(QPointF value) const override;
  QString describeAt(QPointF value) const override;
  QString exportName() const override { return QStringLiteral("decision_curve"); }

  void setReasonableRange(double lo, double hi);
  // No range was chosen (command-line reports): removes the shaded area and its legend entry.
  void clearReasonableRange();
  double markedThreshold() const;
  double yMin() const { return yMin_; }
  double yMax() const { return yMax_; }

  // Shaded percentile 95% band of the model's net benefit (ValidationBootstrap::netBenefit);
  // points without a finite interval are left out. The y axis grows to hold the band (its floor
  // stops at minus the axis top, where only extreme thresholds reach). A second call replaces it.
  void setNetBenefitBand(const std::vector<BandPoint>& band);
  QAreaSeries* netBenefitBand() const { return band_; }
  // The net-benefit curve of a further model on the same patients, in its own colour and dash
  // pattern (overlay_series.h), named in the legend.
  void addComparison(const QString& name, const std::vector<DecisionCurvePoint>& curve);
  std::size_t comparisonCount() const { return comparisons_.size(); }

 private:
  struct Comparison {
    QString name;
    std::vector<DecisionCurvePoint> curve;
    QLineSeries* series = nullptr;
  };
  // Sets the y axis (nice numbers) and redraws everything that depends on it.
  void setYRange(double lo, double hi);
  void drawCurves();

  std::vector<DecisionCurvePoint> curve_;
  double xMax_ = 1.0, yMin_ = -0.05, yMax_ = 0.1;
  QLineSeries* marker_ = nullptr;
  QAreaSeries* range_ = nullptr;
  QLineSeries* rangeUpper_ = nullptr;
  QLineSeries* rangeLower_ = nullptr;
  QValueAxis* yAxis_ = nullptr;
  QLineSeries* treatAll_ = nullptr;
  QLineSeries* model_ = nullptr;
  std::vector<BandPoint> bandPoints_;
  QAreaSeries* band_ = nullptr;
  std::vector<Comparison> comparisons_;
};

}  // namespace calivera::charts
