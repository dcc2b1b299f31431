#include "render/charts/calibration_chart.h"

#include <QtCharts/QAreaSeries>
#include <QtCharts/QLineSeries>
#include <QtCharts/QScatterSeries>
#include <QtCharts/QValueAxis>
#include <algorithm>
#include <cmath>

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

}  // namespace

CalibrationChart::CalibrationChart(const Calibration& calibration,
                                   const RiskHistogram& distribution)
    : groups_(calibration.groups), curve_(calibration.curve), axisMax_(axisLimit(calibration)) {
  applyChartStyle(this, QStringLiteral("Calibration — slope %1, intercept %2")
                            .arg(fixed(calibration.slope, 2), fixed(calibration.intercept, 2)));
  // One tick per 0.1 (axisMax_ is a multiple of 0.1), or per 0.05 when zoomed in closely.
  const bool fine = axisMax_ <= 0.3;
  const int tickCount = static_cast<int>(std::lround(axisMax_ * (fine ? 20 : 10))) + 1;
  auto* x = makeAxis(QStringLiteral("Predicted risk (0–1)"), 0, axisMax_, fine ? "%.2f" : "%.1f",
                     tickCount);
  auto* y =
      makeAxis(QStringLiteral("Observed (0–1)"), 0, axisMax_, fine ? "%.2f" : "%.1f", tickCount);
  addAxis(x, Qt::AlignBottom);
  addAxis(y, Qt::AlignLeft);
  auto attach = [&](QAbstractSeries* s, QValueAxis* yAxis) { addOnAxes(this, s, x, yAxis); };

  // Histogram first so that every line is drawn over it.
  std::size_t maxCount = 1;
  std::vector<double> totals(distribution.eventCounts.size());
  for (std::size_t i = 0; i < totals.size(); ++i) {
    totals[i] = static_cast<double>(distribution.eventCounts[i] + distribution.nonEventCounts[i]);
    maxCount = std::max(maxCount, static_cast<std::size_t>(totals[i]));
  }
  auto* histogramAxis = new QValueAxis;
  histogramAxis->setRange(0, static_cast<double>(maxCount) * 5.0);
  histogramAxis->setVisible(false);
  addAxis(histogramAxis, Qt::AlignRight);
  // Bins beyond the axis are cut at it: drawn whole they ran past the plot in the PDF.
  std::vector<double> edges = distribution.binEdges;
  while (edges.size() > 2 && edges[edges.size() - 2] >= axisMax_) {
    edges.pop_back();
    totals.pop_back();
  }
  if (!edges.empty()) edges.back() = std::min(edges.back(), axisMax_);
  if (!totals.empty()) {
    auto* histogram = makeHistogramArea(edges, totals);
    histogram->setName(QStringLiteral("Histogram"));
    histogram->setColor(QColor(200, 200, 200, 150));
    histogram->setBorderColor(palette::kGrey);
    attach(histogram, histogramAxis);
  }

  auto* ideal = new QLineSeries;
  ideal->setName(QStringLiteral("Ideal"));
  ideal->setPen(rolePen(SeriesRole::Reference));
  ideal->append(0, 0);
  ideal->append(axisMax_, axisMax_);
  attach(ideal, y);

  auto* smooth = new QLineSeries;
  smooth->setName(QStringLiteral("Loess curve"));
  smooth->setPen(rolePen(SeriesRole::Model));
  QList<QPointF> pts;
  for (const auto& p : curve_) pts.append(QPointF(p.risk, p.observed));
  smooth->replace(pts);
  attach(smooth, y);

  for (const auto& g : groups_) {
    auto* bar = new QLineSeries;
    bar->setPen(rolePen(SeriesRole::Groups));
    bar->append(g.meanRisk, g.observedCi.lo);
    bar->append(g.meanRisk, g.observedCi.hi);
    attach(bar, y);
    hideFromLegend(this, bar);  // the group markers' legend entry names the CI bars too
  }
  auto* observed = new QScatterSeries;
  observed->setName(QStringLiteral("Groups, 95% CI"));
  observed->setMarkerShape(QScatterSeries::MarkerShapeRectangle);
  observed->setMarkerSize(9);
  observed->setColor(Qt::white);
  observed->setBorderColor(palette::kBlack);
  for (const auto& g : groups_) observed->append(g.meanRisk, g.observedProportion);
  attach(observed, y);

  marker_ = new QLineSeries;
  marker_->setName(QStringLiteral("Threshold"));
  marker_->setPen(rolePen(SeriesRole::Threshold));
  marker_->append(0, 0);
  marker_->append(0, axisMax_);
  attach(marker_, y);
}

void CalibrationChart::setThreshold(const ThresholdSnapshot& snapshot) {
  marker_->replace({QPointF(snapshot.threshold, 0), QPointF(snapshot.threshold, axisMax_)});
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
