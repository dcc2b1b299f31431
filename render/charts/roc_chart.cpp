#include "render/charts/roc_chart.h"

#include <QtCharts/QLineSeries>
#include <QtCharts/QScatterSeries>
#include <QtCharts/QValueAxis>
#include <algorithm>
#include <cmath>

#include "render/charts/chart_style.h"
#include "render/charts/chart_text.h"
#include "render/charts/overlay_series.h"

namespace calivera::charts {

RocChart::RocChart(const Discrimination& discrimination) : points_(discrimination.roc) {
  applyChartStyle(this, QStringLiteral("ROC curve — AUC %1 (95% CI %2 to %3)")
                            .arg(fixed(discrimination.auc, 3), fixed(discrimination.aucCi.lo, 3),
                                 fixed(discrimination.aucCi.hi, 3)));
  auto* x = makeAxis(QStringLiteral("1 − specificity"), 0, 1, "%.1f", 6);
  auto* y = makeAxis(QStringLiteral("Sensitivity"), 0, 1, "%.1f", 6);
  addAxis(x, Qt::AlignBottom);
  addAxis(y, Qt::AlignLeft);

  auto* chance = new QLineSeries;
  chance->setName(QStringLiteral("Chance (AUC 0.5)"));
  chance->setPen(rolePen(SeriesRole::Reference));
  chance->append(0, 0);
  chance->append(1, 1);

  auto* curve = new QLineSeries;
  curve->setName(QStringLiteral("Model"));
  curve->setPen(rolePen(SeriesRole::Model));
  QList<QPointF> pts;
  pts.reserve(static_cast<qsizetype>(points_.size()));
  for (const RocPoint& p : points_) pts.append(QPointF(p.fpr, p.tpr));
  curve->replace(pts);

  operatingPoint_ = new QScatterSeries;
  operatingPoint_->setName(QStringLiteral("At the threshold"));
  operatingPoint_->setMarkerShape(QScatterSeries::MarkerShapeRectangle);
  operatingPoint_->setMarkerSize(13);
  operatingPoint_->setColor(roleColor(SeriesRole::Threshold));
  operatingPoint_->setBorderColor(palette::kBlack);
  operatingPoint_->append(0, 0);

  for (QAbstractSeries* s :
       {static_cast<QAbstractSeries*>(chance), static_cast<QAbstractSeries*>(curve),
        static_cast<QAbstractSeries*>(operatingPoint_)}) {
    addOnAxes(this, s, x, y);
  }
}

void RocChart::setThreshold(const ThresholdSnapshot& snapshot) {
  const double fpr = std::isfinite(snapshot.falsePositiveRate) ? snapshot.falsePositiveRate : 0;
  const double tpr = std::isfinite(snapshot.sensitivity) ? snapshot.sensitivity : 0;
  operatingPoint_->replace(0, QPointF(fpr, tpr));
}

QPointF RocChart::operatingPoint() const {
  return operatingPoint_->at(0);
}

namespace {

const RocPoint* nearestOf(const std::vector<RocPoint>& points, QPointF value, double maxDistance) {
  const RocPoint* best = nullptr;
  double bestDistance = maxDistance;
  for (const RocPoint& p : points) {
    const double d = std::hypot(p.fpr - value.x(), p.tpr - value.y());
    if (d < bestDistance) {
      bestDistance = d;
      best = &p;
    }
  }
  return best;
}

}  // namespace

const RocPoint* RocChart::nearest(QPointF value, double maxDistance) const {
  return nearestOf(points_, value, maxDistance);
}

void RocChart::addComparison(const QString& name, const Discrimination& discrimination) {
  auto* curve = new QLineSeries;
  curve->setName(QStringLiteral("%1 (AUC %2)").arg(name, fixed(discrimination.auc, 3)));
  curve->setPen(comparisonPen(comparisons_.size()));
  QList<QPointF> pts;
  pts.reserve(static_cast<qsizetype>(discrimination.roc.size()));
  for (const RocPoint& p : discrimination.roc) pts.append(QPointF(p.fpr, p.tpr));
  curve->replace(pts);
  addOnAxesOf(this, curve, operatingPoint_);
  comparisons_.push_back({name, discrimination.roc});
}

std::optional<double> RocChart::thresholdAt(QPointF value) const {
  const RocPoint* p = nearest(value, 0.08);
  if (p == nullptr) return std::nullopt;
  return std::clamp(p->threshold, 0.0, 1.0);
}

QString RocChart::describeAt(QPointF value) const {
  if (const RocPoint* p = nearest(value, 0.04)) {
    return QStringLiteral(
               "Threshold %1\nSensitivity %2\n1 − specificity %3\n(click to use this threshold)")
        .arg(fixed(std::clamp(p->threshold, 0.0, 1.0), 4), fixed(p->tpr, 4), fixed(p->fpr, 4));
  }
  // Off the main curve: the overlaid curves near the pointer, each at its own model's threshold.
  QStringList lines;
  for (const Comparison& c : comparisons_) {
    if (const RocPoint* p = nearestOf(c.points, value, 0.04)) {
      lines.append(QStringLiteral("%1: threshold %2, sensitivity %3, 1 − specificity %4")
                       .arg(c.name, fixed(std::clamp(p->threshold, 0.0, 1.0), 4), fixed(p->tpr, 4),
                            fixed(p->fpr, 4)));
    }
  }
  return lines.join(QChar('\n'));
}

}  // namespace calivera::charts
