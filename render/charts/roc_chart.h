#pragma once
// ROC curve (sensitivity against 1 - specificity) with the chance diagonal and the operating point
// of the current threshold. The curve points come thinned from core (Discrimination::roc); the
// AUC shown in the title is core's exact value with its DeLong 95% CI. Further models validated on
// the same patients can be overlaid (addComparison), each named with its AUC in the legend.

#include <vector>

#include "core/metrics/validation.h"
#include "render/charts/linked_chart.h"

class QLineSeries;
class QScatterSeries;

namespace calivera::charts {

class RocChart : public LinkedChart {
 public:
  explicit RocChart(const Discrimination& discrimination);

  void setThreshold(const ThresholdSnapshot& snapshot) override;
  std::optional<double> thresholdAt(QPointF value) const override;
  QString describeAt(QPointF value) const override;
  QString exportName() const override { return QStringLiteral("roc"); }

  QPointF operatingPoint() const;  // (FPR, TPR) currently marked

  // The ROC curve of a further model, in its own colour and dash pattern (overlay_series.h),
  // named "name (AUC 0.xxx)" in the legend. Picking a threshold stays with the main model.
  void addComparison(const QString& name, const Discrimination& discrimination);
  std::size_t comparisonCount() const { return comparisons_.size(); }

 private:
  struct Comparison {
    QString name;
    std::vector<RocPoint> points;
  };
  const RocPoint* nearest(QPointF value, double maxDistance) const;

  std::vector<RocPoint> points_;
  std::vector<Comparison> comparisons_;
  QScatterSeries* operatingPoint_ = nullptr;
};

}  // namespace calivera::charts
