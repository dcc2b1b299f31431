#pragma once
// Distribution of predicted risks by outcome: two stepped histograms, each as a percentage of its
// own group (patients with and without the event), so both are readable at any prevalence; a
// vertical cut line marks the threshold (patients at or right of it are flagged).

#include <vector>

#include "core/metrics/validation.h"
#include "render/charts/linked_chart.h"

class QLineSeries;

namespace calivera::charts {

class DistributionChart : public LinkedChart {
 public:
  explicit DistributionChart(const RiskHistogram& distribution);

  void setThreshold(const ThresholdSnapshot& snapshot) override;
  std::optional<double> thresholdAt(QPointF value) const override;
  QString describeAt(QPointF value) const override;
  QString exportName() const override { return QStringLiteral("risk_distribution"); }

  double markedThreshold() const;

 private:
  RiskHistogram histogram_;
  std::size_t events_ = 0, nonEvents_ = 0;
  double yMax_ = 1.0;
  QLineSeries* marker_ = nullptr;
};

}  // namespace calivera::charts
