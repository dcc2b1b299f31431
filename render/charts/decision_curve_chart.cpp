#include "render/charts/decision_curve_chart.h"

#include <QtCharts/QAreaSeries>
#include <QtCharts/QLineSeries>
#include <QtCharts/QValueAxis>
#include <algorithm>
#include <cmath>

#include "render/charts/chart_style.h"
#include "render/charts/chart_text.h"
#include "render/charts/overlay_series.h"

namespace calivera::charts {

DecisionCurveChart::DecisionCurveChart(const std::vector<DecisionCurvePoint>& curve,
                                       const CohortSummary& cohort)
    : curve_(curve) {
  applyChartStyle(this, QStringLiteral("Decision curve — net benefit across thresholds"));
  // Net benefit cannot exceed the prevalence; below a small negative margin treat-all only dives.
  const double prevalence = cohort.prevalence > 0 ? cohort.prevalence : 0.1;
  yMax_ = std::ceil(prevalence * 1.1 * 100.0) / 100.0;
  yMin_ = -std::max(0.01, std::ceil(prevalence * 0.3 * 100.0) / 100.0);
  xMax_ =
      curve_.empty() ? 1.0 : std::clamp(std::ceil(curve_.back().threshold * 10.0) / 10.0, 0.1, 1.0);

  // One tick per 0.1, or per 0.05 on a short range (0.3 with one decimal printed 0.1 twice).
  const bool fine = xMax_ <= 0.5;
  const int xTicks = static_cast<int>(std::lround(xMax_ * (fine ? 20 : 10))) + 1;
  auto* x = makeAxis(QStringLiteral("Threshold probability (0–1)"), 0, xMax_,
                     fine ? "%.2f" : "%.1f", xMax_ >= 0.99 ? 6 : xTicks);
  auto* y = makeAxis(QStringLiteral("Net benefit"), yMin_, yMax_, "%.3f", 6);
  y->applyNiceNumbers();
  yMin_ = y->min();
  yMax_ = y->max();
  yAxis_ = y;
  addAxis(x, Qt::AlignBottom);
  addAxis(y, Qt::AlignLeft);
  auto attach = [&](QAbstractSeries* s) { addOnAxes(this, s, x, y); };

  rangeUpper_ = new QLineSeries;
  rangeLower_ = new QLineSeries;
  auto* range = new QAreaSeries(rangeUpper_, rangeLower_);
  rangeUpper_->setParent(range);
  rangeLower_->setParent(range);
  range->setName(QStringLiteral("Reasonable range"));
  QColor fill = roleColor(SeriesRole::Range);
  fill.setAlpha(45);
  range->setColor(fill);
  range->setBorderColor(roleColor(SeriesRole::Range));
  attach(range);
  range_ = range;

  auto* none = new QLineSeries;
  none->setName(QStringLiteral("Treat none"));
  none->setPen(rolePen(SeriesRole::TreatNone));
  none->append(0, 0);
  none->append(xMax_, 0);
  treatAll_ = new QLineSeries;
  treatAll_->setName(QStringLiteral("Treat all"));
  treatAll_->setPen(rolePen(SeriesRole::TreatAll));
  model_ = new QLineSeries;
  model_->setName(QStringLiteral("Model"));
  model_->setPen(rolePen(SeriesRole::Model));
  drawCurves();
  attach(none);
  attach(treatAll_);
  attach(model_);

  marker_ = new QLineSeries;
  marker_->setName(QStringLiteral("Threshold"));
  marker_->setPen(rolePen(SeriesRole::Threshold));
  marker_->append(0, yMin_);
  marker_->append(0, yMax_);
  attach(marker_);
  setReasonableRange(0.0, 0.0);
}

void DecisionCurveChart::setThreshold(const ThresholdSnapshot& snapshot) {
  marker_->replace({QPointF(snapshot.threshold, yMin_), QPointF(snapshot.threshold, yMax_)});
}

double DecisionCurveChart::markedThreshold() const {
  return marker_->at(0).x();
}

void DecisionCurveChart::setReasonableRange(double lo, double hi) {
  if (range_ == nullptr) return;
  rangeUpper_->replace({QPointF(lo, yMax_), QPointF(hi, yMax_)});
  rangeLower_->replace({QPointF(lo, yMin_), QPointF(hi, yMin_)});
}

void DecisionCurveChart::clearReasonableRange() {
  if (range_ == nullptr) return;
  discardSeries(this, range_);
  range_ = nullptr;
  rangeUpper_ = rangeLower_ = nullptr;
}

std::optional<double> DecisionCurveChart::thresholdAt(QPointF value) const {
  if (value.x() < 0 || value.x() > xMax_) return std::nullopt;
  return value.x();
}

QString DecisionCurveChart::describeAt(QPointF value) const {
  if (curve_.empty()) return {};
  auto it = std::lower_bound(curve_.begin(), curve_.end(), value.x(),
                             [](const DecisionCurvePoint& p, double t) { return p.threshold < t; });
  if (it == curve_.end()) --it;
  if (it != curve_.begin() &&
      std::abs(std::prev(it)->threshold - value.x()) < std::abs(it->threshold - value.x())) {
    --it;
  }
  QString text =
      QStringLiteral(
          "Threshold %1\nNet benefit: model %2, treat everyone %3, treat no one 0\n"
          "Interventions avoided per 100 patients vs treat everyone: %4")
          .arg(fixed(it->threshold, 3), fixed(it->netBenefit, 4), fixed(it->netBenefitTreatAll, 4),
               fixed(it->interventionsAvoidedPer100, 1));
  if (const BandPoint* b = nearestBandPoint(bandPoints_, it->threshold, 1e-9)) {
    text += QStringLiteral("\nModel, bootstrap 95% band: %1 to %2")
                .arg(fixed(b->ci.lo, 4), fixed(b->ci.hi, 4));
  }
  for (const Comparison& c : comparisons_) {
    const auto match = std::find_if(
        c.curve.begin(), c.curve.end(),
        [&](const DecisionCurvePoint& p) { return std::abs(p.threshold - it->threshold) < 1e-9; });
    if (match != c.curve.end()) {
      text += QStringLiteral("\n%1: net benefit %2").arg(c.name, fixed(match->netBenefit, 4));
    }
  }
  return text + QStringLiteral("\n(click to use this threshold)");
}

void DecisionCurveChart::drawCurves() {
  QList<QPointF> allPts, modelPts;
  for (const auto& p : curve_) {
    // Stop treat-all where it leaves the plot instead of drawing a flat line along the floor.
    if (p.netBenefitTreatAll >= yMin_) allPts.append(QPointF(p.threshold, p.netBenefitTreatAll));
    modelPts.append(QPointF(p.threshold, std::clamp(p.netBenefit, yMin_, yMax_)));
  }
  treatAll_->replace(allPts);
  model_->replace(modelPts);
  for (Comparison& c : comparisons_) {
    QList<QPointF> pts;
    for (const auto& p : c.curve)
      pts.append(QPointF(p.threshold, std::clamp(p.netBenefit, yMin_, yMax_)));
    c.series->replace(pts);
  }
}

void DecisionCurveChart::setYRange(double lo, double hi) {
  yAxis_->setRange(lo, hi);
  yAxis_->applyNiceNumbers();
  yMin_ = yAxis_->min();
  yMax_ = yAxis_->max();
  const double marked = markedThreshold();
  marker_->replace({QPointF(marked, yMin_), QPointF(marked, yMax_)});
  // The shaded range keeps its thresholds and spans the new height.
  if (range_ != nullptr) setReasonableRange(rangeUpper_->at(0).x(), rangeUpper_->at(1).x());
  drawCurves();
}

void DecisionCurveChart::setNetBenefitBand(const std::vector<BandPoint>& band) {
  discardSeries(this, band_);
  bandPoints_ = band;
  band_ = makeBandArea(band, QStringLiteral("Bootstrap 95% band"), roleColor(SeriesRole::Model));
  addOnAxesOf(this, band_, model_);
  double lo = yMin_, hi = yMax_;
  for (const BandPoint& p : band) {
    if (p.x > xMax_ || !std::isfinite(p.ci.lo) || !std::isfinite(p.ci.hi)) continue;
    lo = std::min(lo, p.ci.lo);
    hi = std::max(hi, p.ci.hi);
  }
  setYRange(std::max(lo, -hi), hi);
}

void DecisionCurveChart::addComparison(const QString& name,
                                       const std::vector<DecisionCurvePoint>& curve) {
  auto* line = new QLineSeries;
  line->setName(name);
  line->setPen(comparisonPen(comparisons_.size()));
  comparisons_.push_back({name, curve, line});
  drawCurves();
  addOnAxesOf(this, line, model_);
}

}  // namespace calivera::charts
