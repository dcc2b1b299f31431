#include "render/charts/calibration_chart.h"

#include <QGraphicsRectItem>
#include <QGraphicsSimpleTextItem>
#include <QtCharts/QAreaSeries>
#include <QtCharts/QLineSeries>
#include <QtCharts/QScatterSeries>
#include <QtCharts/QValueAxis>
#include <algorithm>
#include <cmath>

#include "core/present/measures.h"
#include "render/charts/chart_style.h"
#include "render/charts/chart_text.h"
#include "render/charts/histogram_series.h"
#include "render/charts/overlay_series.h"

namespace calivera::charts {

namespace {

// Zooms to the risks that occur (rounded up to a tenth), so a low-risk cohort is not squeezed
// into a corner; never below 0.2 so the ideal line stays readable.
double axisLimit(const Calibration& c) {
  double top = 0.0;
  for (const auto& g : c.groups) top = std::max({top, g.riskHi, g.observedCi.hi});
  for (const auto& p : c.curve) top = std::max({top, p.risk, p.observed});
  return std::clamp(std::ceil(top * 10.0 - 1e-9) / 10.0, 0.2, 1.0);
}

// The observed axis's label step: few enough labels for a short plot (a quarter-screen chart
// is about 150 pixels high), fine enough to read a low-risk cohort.
double tickStep(double axisMax) {
  if (axisMax <= 0.3) return 0.05;
  return axisMax <= 0.6 ? 0.1 : 0.2;
}
// The risk-distribution strip below the zero line: just under one tick step deep.
double stripDepthFor(double axisMax) {
  return 0.95 * tickStep(axisMax);
}

}  // namespace

CalibrationChart::CalibrationChart(const Calibration& calibration,
                                   const RiskHistogram& distribution)
    : groups_(calibration.groups),
      curve_(calibration.curve),
      distribution_(distribution),
      axisMax_(axisLimit(calibration)),
      stripDepth_(stripDepthFor(axisMax_)) {
  applyChartStyle(this, QStringLiteral("Calibration"));
  // x: one tick per 0.1 (axisMax_ is a multiple of 0.1), or per 0.05 when zoomed in closely.
  const bool fine = axisMax_ <= 0.3;
  const int tickCount = static_cast<int>(std::lround(axisMax_ * (fine ? 20 : 10))) + 1;
  auto* x = makeAxis(QStringLiteral("Predicted risk (0–1)"), 0, axisMax_, fine ? "%.2f" : "%.1f",
                     tickCount);
  // The observed axis is labelled from 0 up only: below 0 lies the strip of the risk
  // distribution, which shares the x axis but has no observed scale. Ticks are anchored at 0 and
  // the strip is a little shallower than one tick step, so no negative label appears.
  auto* y = makeAxis(QStringLiteral("Observed risk"), -stripDepth_, axisMax_,
                     fine ? "%.2f" : "%.1f", tickCount);
  y->setTickType(QValueAxis::TicksDynamic);
  y->setTickAnchor(0.0);
  y->setTickInterval(tickStep(axisMax_));
  addAxis(x, Qt::AlignBottom);
  addAxis(y, Qt::AlignLeft);
  auto attach = [&](QAbstractSeries* s) { addOnAxes(this, s, x, y); };

  // The risk distribution hangs below the zero line, scaled so the fullest bin fills the strip;
  // drawn first so every line lies over it. Bins beyond the axis are cut at it.
  std::vector<double> totals(distribution.eventCounts.size());
  double maxCount = 1.0;
  for (std::size_t i = 0; i < totals.size(); ++i) {
    totals[i] = static_cast<double>(distribution.eventCounts[i] + distribution.nonEventCounts[i]);
    maxCount = std::max(maxCount, totals[i]);
  }
  std::vector<double> edges = distribution.binEdges;
  while (edges.size() > 2 && edges[edges.size() - 2] >= axisMax_) {
    edges.pop_back();
    totals.pop_back();
  }
  if (!edges.empty()) edges.back() = std::min(edges.back(), axisMax_);
  for (double& t : totals) t = -0.9 * stripDepth_ * t / maxCount;
  if (!totals.empty()) {
    auto* strip = makeHistogramArea(edges, totals);
    strip->setName(QStringLiteral("Risk distribution (strip)"));
    // A light fill with a dark outline, so the strip survives greyscale print (a hatch pattern
    // would be lost: the report replays charts from SVG, whose renderer ignores patterns).
    strip->setBrush(QColor(205, 205, 205));
    strip->setBorderColor(palette::kGrey);
    attach(strip);
  }
  auto* zero = new QLineSeries;  // the strip's top edge, a firm line under the observed scale
  zero->setPen(QPen(palette::kGrey, 1.0));
  zero->append(0, 0);
  zero->append(axisMax_, 0);
  attach(zero);
  hideFromLegend(this, zero);

  auto* ideal = new QLineSeries;
  ideal->setName(QStringLiteral("Predicted = observed"));
  ideal->setPen(rolePen(SeriesRole::Reference));
  ideal->append(0, 0);
  ideal->append(axisMax_, axisMax_);
  attach(ideal);

  auto* smooth = new QLineSeries;
  smooth->setName(QStringLiteral("Smoothed (loess)"));
  smooth->setPen(rolePen(SeriesRole::Model));
  QList<QPointF> pts;
  for (const auto& p : curve_) pts.append(QPointF(p.risk, std::clamp(p.observed, 0.0, axisMax_)));
  smooth->replace(pts);
  attach(smooth);

  // Each risk group: a diamond at (mean predicted, observed share) on a vertical interval with
  // short caps.
  const double cap = axisMax_ * 0.008;
  for (const auto& g : groups_) {
    auto* bar = new QLineSeries;
    bar->setPen(rolePen(SeriesRole::Groups));
    const double lo = std::max(g.observedCi.lo, 0.0), hi = std::min(g.observedCi.hi, axisMax_);
    bar->replace({QPointF(g.meanRisk - cap, lo), QPointF(g.meanRisk + cap, lo),
                  QPointF(g.meanRisk, lo), QPointF(g.meanRisk, hi), QPointF(g.meanRisk - cap, hi),
                  QPointF(g.meanRisk + cap, hi)});
    attach(bar);
    hideFromLegend(this, bar);  // the group markers' legend entry names the intervals too
  }
  auto* observed = new QScatterSeries;
  observed->setName(QStringLiteral("Risk groups, 95% CI"));
  observed->setMarkerShape(QScatterSeries::MarkerShapeRotatedRectangle);
  observed->setMarkerSize(10);
  observed->setColor(roleColor(SeriesRole::Groups));
  observed->setBorderColor(Qt::white);
  for (const auto& g : groups_) observed->append(g.meanRisk, g.observedProportion);
  attach(observed);

  marker_ = new QLineSeries;
  marker_->setName(QStringLiteral("Threshold"));
  marker_->setPen(rolePen(SeriesRole::Threshold));
  marker_->append(0, -stripDepth_);
  marker_->append(0, axisMax_);
  attach(marker_);

  addSummaryBox(calibration);
}

void CalibrationChart::addSummaryBox(const Calibration& c) {
  // The summary numbers sit in a small box in the plot's upper-left corner (observed far above
  // predicted at low risk, where a model's curve rarely goes), not in the title; the targets are
  // the measure catalog's (core/present/measures.h).
  const auto line = [](const char* shortName, const char* key, double value) {
    return QStringLiteral("%1 %2 (target %3)")
        .arg(QString::fromUtf8(shortName), fixed(value, 2),
             QString::fromUtf8(measureByKey(key).target));
  };
  const QString text = QStringList{line("Slope", "calibration_slope", c.slope),
                                   line("Intercept", "calibration_intercept", c.intercept),
                                   line("O/E", "oe_ratio", c.oeRatio)}
                           .join(QChar('\n'));
  summary_ = new QGraphicsRectItem(this);  // owned by the chart (Qt parent)
  summary_->setBrush(QColor(255, 255, 255, 210));
  summary_->setPen(QPen(QColor(170, 170, 170), 0));
  summary_->setZValue(100);
  auto* label = new QGraphicsSimpleTextItem(text, summary_);
  QFont font = titleFont();
  font.setBold(false);
  font.setPointSizeF(7.5);
  label->setFont(font);
  label->setPos(5, 3);
  summary_->setRect(label->boundingRect().adjusted(0, 0, 10, 6));
  connect(this, &QChart::plotAreaChanged, this,
          [this](const QRectF& plot) { summary_->setPos(plot.topLeft() + QPointF(6, 6)); });
}

QString CalibrationChart::summaryText() const {
  for (QGraphicsItem* child : summary_->childItems()) {
    if (auto* label = dynamic_cast<QGraphicsSimpleTextItem*>(child)) return label->text();
  }
  return {};
}

void CalibrationChart::setThreshold(const ThresholdSnapshot& snapshot) {
  marker_->replace(
      {QPointF(snapshot.threshold, -stripDepth_), QPointF(snapshot.threshold, axisMax_)});
}

double CalibrationChart::markedThreshold() const {
  return marker_->at(0).x();
}

std::optional<double> CalibrationChart::thresholdAt(QPointF value) const {
  if (value.x() < 0 || value.x() > axisMax_) return std::nullopt;
  return value.x();
}

QString CalibrationChart::describeAt(QPointF value) const {
  const double tolerance = axisMax_ * 0.02;
  if (value.y() < 0) {  // the risk-distribution strip: the bin under the pointer
    const auto& e = distribution_.binEdges;
    for (std::size_t i = 0; i + 1 < e.size() && i < distribution_.eventCounts.size(); ++i) {
      if (value.x() < e[i] || value.x() >= e[i + 1]) continue;
      const std::size_t events = distribution_.eventCounts[i];
      return QStringLiteral("Predicted risk %1 to %2: %3 patients, %4 with the event")
          .arg(fixed(e[i], 3), fixed(e[i + 1], 3))
          .arg(events + distribution_.nonEventCounts[i])
          .arg(events);
    }
    return {};
  }
  for (std::size_t i = 0; i < groups_.size(); ++i) {
    const auto& g = groups_[i];
    if (std::abs(g.meanRisk - value.x()) < tolerance && value.y() >= g.observedCi.lo - tolerance &&
        value.y() <= g.observedCi.hi + tolerance) {
      return QStringLiteral(
                 "Risk group %1 (risks %2 to %3), %4 patients\nMean predicted risk %5\n"
                 "Observed %6 events = %7 (95% CI %8 to %9)")
          .arg(i + 1)
          .arg(fixed(g.riskLo, 3), fixed(g.riskHi, 3))
          .arg(g.n)
          .arg(fixed(g.meanRisk, 4))
          .arg(g.observed)
          .arg(fixed(g.observedProportion, 4), fixed(g.observedCi.lo, 4),
               fixed(g.observedCi.hi, 4));
    }
  }
  if (curve_.empty()) return describeOverlays(value, tolerance);
  auto it = std::lower_bound(curve_.begin(), curve_.end(), value.x(),
                             [](const CalibrationCurvePoint& p, double r) { return p.risk < r; });
  if (it == curve_.end()) --it;
  if (std::abs(it->observed - value.y()) > tolerance * 2) return describeOverlays(value, tolerance);
  QString text = QStringLiteral("Smoothed curve: predicted %1, observed %2")
                     .arg(fixed(it->risk, 4), fixed(it->observed, 4));
  if (const BandPoint* b = nearestBandPoint(bandPoints_, it->risk, tolerance)) {
    text += QStringLiteral("\nSmoothed curve, bootstrap 95% band at %1: %2 to %3")
                .arg(fixed(b->x, 3), fixed(b->ci.lo, 4), fixed(b->ci.hi, 4));
  }
  const QString overlays = describeOverlays(value, tolerance);
  return overlays.isEmpty() ? text : text + QStringLiteral("\n") + overlays;
}

void CalibrationChart::setCurveBand(const std::vector<BandPoint>& band) {
  discardSeries(this, band_);
  bandPoints_ = band;
  band_ = makeBandArea(band, QStringLiteral("Bootstrap 95% band"), roleColor(SeriesRole::Model));
  addOnAxesOf(this, band_, marker_);
}

void CalibrationChart::addComparison(const QString& name, const Calibration& calibration) {
  auto* line = new QLineSeries;
  line->setName(name);
  line->setPen(comparisonPen(comparisons_.size()));
  QList<QPointF> pts;
  for (const auto& p : calibration.curve) {
    // Kept inside the plot: vector output does not clip series.
    if (p.risk <= axisMax_) pts.append(QPointF(p.risk, std::clamp(p.observed, 0.0, axisMax_)));
  }
  line->replace(pts);
  addOnAxesOf(this, line, marker_);
  comparisons_.push_back({name, calibration.curve});
}

// The overlaid curves near `value`: "name: predicted p, observed o" per curve within reach.
QString CalibrationChart::describeOverlays(QPointF value, double tolerance) const {
  QStringList lines;
  for (const Comparison& c : comparisons_) {
    const double observed = interpolateCurve(c.curve, value.x());
    if (std::isfinite(observed) && std::abs(observed - value.y()) <= tolerance * 2) {
      lines.append(QStringLiteral("%1: predicted %2, observed %3")
                       .arg(c.name, fixed(value.x(), 4), fixed(observed, 4)));
    }
  }
  return lines.join(QChar('\n'));
}

}  // namespace calivera::charts
