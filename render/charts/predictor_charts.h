#pragma once
// Charts of the model in predictor space (data from core/study/predictor_space.h):
//   RiskCurveChart - predicted risk against one predictor, the others held fixed; the threshold
//                    as a horizontal line and the cut point(s) where the curve crosses it as
//                    vertical lines; the cohort's values as a rug along the bottom; the
//                    predictor values whose risk reaches the threshold (the flagged side) hatched.
//   BoundaryChart  - two predictors; the patients (events: orange triangles, non-events: blue
//                    circles) and the boundary where predicted risk equals the threshold, traced
//                    from a grid evaluation of the model (a curve for splines or interactions),
//                    with the flagged side (risk at or above the threshold) tinted and hatched,
//                    so it reads in greyscale and without colour vision.

#include <vector>

#include "core/study/predictor_space.h"
#include "render/charts/linked_chart.h"

class QAreaSeries;
class QLineSeries;
class QValueAxis;

namespace calivera::charts {

class RiskCurveChart : public LinkedChart {
 public:
  explicit RiskCurveChart(RiskCurveData data);

  void setThreshold(const ThresholdSnapshot& snapshot) override;
  std::optional<double> thresholdAt(QPointF value) const override;
  QString describeAt(QPointF value) const override;
  QString exportName() const override { return QStringLiteral("risk_curve"); }

  const std::vector<double>& cutPoints() const { return cuts_; }

 private:
  static constexpr int kMaxCuts = 4;
  RiskCurveData data_;
  double yMax_ = 1.0;
  QLineSeries* level_ = nullptr;
  std::vector<QLineSeries*> cutLines_;
  std::vector<double> cuts_;
  QAreaSeries* flagged_ = nullptr;
};

class FlaggedRegionItem;

class BoundaryChart : public LinkedChart {
 public:
  explicit BoundaryChart(BoundaryData data);

  void setThreshold(const ThresholdSnapshot& snapshot) override;
  std::optional<double> thresholdAt(QPointF value) const override;
  QString describeAt(QPointF value) const override;
  QString exportName() const override { return QStringLiteral("risk_boundary"); }

  // The boundary currently drawn (one polyline per piece).
  const std::vector<Polyline>& boundary() const { return boundary_; }

 private:
  static constexpr int kMaxPieces = 12;
  double riskAt(QPointF value) const;
  BoundaryData data_;
  std::vector<QLineSeries*> pieces_;
  std::vector<Polyline> boundary_;
  FlaggedRegionItem* flagged_ = nullptr;
};

// The brush of the flagged side in both charts: the threshold's colour, hatched.
QBrush flaggedBrush();

}  // namespace calivera::charts
