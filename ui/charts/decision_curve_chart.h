#pragma once
// Decision curve (Vickers & Elkin, Med Decis Making 2006): net benefit of the model, of treating
// everyone and of treating no one across threshold probabilities, with the range of clinically
// reasonable thresholds (set by the user, not derived from the data) shaded, and a vertical line at
// the current threshold. Per the authors' guidance the curve is read over the shaded range only.

#include <vector>

#include "core/metrics/validation.h"
#include "ui/charts/linked_chart.h"

class QAreaSeries;
class QLineSeries;

namespace calivera::ui::charts {

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

 private:
  std::vector<DecisionCurvePoint> curve_;
  double xMax_ = 1.0, yMin_ = -0.05, yMax_ = 0.1;
  QLineSeries* marker_ = nullptr;
  QAreaSeries* range_ = nullptr;
  QLineSeries* rangeUpper_ = nullptr;
  QLineSeries* rangeLower_ = nullptr;
};

}  // namespace calivera::ui::charts
