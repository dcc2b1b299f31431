#pragma once
// ROC curve (sensitivity against 1 - specificity) with the chance diagonal and the operating point
// of the current threshold. The curve points come thinned from core (Discrimination::roc); the
// AUC shown in the title is core's exact value with its DeLong 95% CI.

#include <vector>

#include "core/metrics/validation.h"
#include "ui/charts/linked_chart.h"

class QLineSeries;
class QScatterSeries;

namespace calivera::ui::charts {

class RocChart : public LinkedChart {
 public:
  explicit RocChart(const Discrimination& discrimination);

  void setThreshold(const ThresholdSnapshot& snapshot) override;
  std::optional<double> thresholdAt(QPointF value) const override;
  QString describeAt(QPointF value) const override;
  QString exportName() const override { return QStringLiteral("roc"); }

  QPointF operatingPoint() const;  // (FPR, TPR) currently marked

 private:
  const RocPoint* nearest(QPointF value, double maxDistance) const;

  std::vector<RocPoint> points_;
  QScatterSeries* operatingPoint_ = nullptr;
};

}  // namespace calivera::ui::charts
