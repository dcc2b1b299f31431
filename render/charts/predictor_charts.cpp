#include "render/charts/predictor_charts.h"

#include <QGraphicsItem>
#include <QImage>
#include <QPainter>
#include <QPainterPath>
#include <QtCharts/QAreaSeries>
#include <QtCharts/QLegendMarker>
#include <QtCharts/QLineSeries>
#include <QtCharts/QScatterSeries>
#include <QtCharts/QValueAxis>
#include <algorithm>
#include <cmath>

#include "render/charts/chart_style.h"
#include "render/charts/chart_text.h"

namespace calivera::charts {

namespace {

QString q(const std::string& s) {
  return QString::fromStdString(s);
}

// Pads a data range by 3% on both sides so points on the edge stay visible.
std::pair<double, double> padded(double lo, double hi) {
  const double pad = hi > lo ? (hi - lo) * 0.03 : 1.0;
  return {lo - pad, hi + pad};
}

QString axisTitle(const std::string& variable, const std::string& unit) {
  return unit.empty() ? q(variable) + QStringLiteral(" (as in the cohort file)")
                      : QStringLiteral("%1 (%2)").arg(q(variable), q(unit));
}

QLineSeries* thresholdLine(const QString& name) {
  auto* s = new QLineSeries;
  s->setName(name);
  s->setPen(rolePen(SeriesRole::Threshold));
  return s;
}

}  // namespace

QBrush flaggedBrush() {
  QColor c = roleColor(SeriesRole::Threshold);
  c.setAlpha(110);
  return QBrush(c, Qt::BDiagPattern);
}

// Cells of the boundary chart's risk grid at or above the threshold, painted under the grid lines
// and the patients: a light tint of the threshold's colour plus its hatch. A graphics item of the
// chart (not a series) because QtCharts has no two-dimensional area series; it maps grid cells
// to the plot with the chart's own mapping, so it follows resizing and exports.
class FlaggedRegionItem : public QGraphicsItem {
 public:
  FlaggedRegionItem(QChart* chart, const BoundaryData* data, QAbstractSeries* anchor)
      : QGraphicsItem(chart), chart_(chart), data_(data), anchor_(anchor) {
    // Above the plot background (QtCharts draws it at z 0), below the grid lines and series.
    setZValue(0.5);
    QObject::connect(chart, &QChart::plotAreaChanged, chart,
                     [this](const QRectF&) { prepareGeometryChange(); });
  }
  void setThreshold(double threshold) {
    threshold_ = threshold;
    update();
  }
  QRectF boundingRect() const override { return chart_->plotArea(); }
  void paint(QPainter* painter, const QStyleOptionGraphicsItem*, QWidget*) override {
    const std::size_t nx = data_->xs.size(), ny = data_->ys.size();
    if (nx == 0 || ny == 0 || data_->risk.size() != nx * ny) return;
    const std::vector<double> xEdges = edges(data_->xs);
    const std::vector<double> yEdges = edges(data_->ys);
    QPainterPath region;
    region.setFillRule(Qt::WindingFill);
    for (std::size_t j = 0; j < ny; ++j) {
      std::size_t i = 0;
      while (i < nx) {
        if (!(data_->risk[j * nx + i] >= threshold_)) {
          ++i;
          continue;
        }
        std::size_t end = i;
        while (end < nx && data_->risk[j * nx + end] >= threshold_) ++end;
        const QPointF a = chart_->mapToPosition(QPointF(xEdges[i], yEdges[j]), anchor_);
        const QPointF b = chart_->mapToPosition(QPointF(xEdges[end], yEdges[j + 1]), anchor_);
        region.addRect(QRectF(a, b).normalized());
        i = end;
      }
    }
    painter->save();
    painter->setClipRect(chart_->plotArea());
    painter->setPen(Qt::NoPen);
    QColor tint = roleColor(SeriesRole::Threshold);
    tint.setAlpha(28);
    painter->fillPath(region, tint);
    painter->fillPath(region, flaggedBrush());
    painter->restore();
  }

 private:
  // Cell edges around grid coordinates: midpoints, and half a step beyond the ends.
  static std::vector<double> edges(const std::vector<double>& g) {
    std::vector<double> e(g.size() + 1);
    if (g.size() == 1) return {g[0] - 0.5, g[0] + 0.5};
    for (std::size_t k = 1; k < g.size(); ++k) e[k] = 0.5 * (g[k - 1] + g[k]);
    e.front() = g.front() - (e[1] - g.front());
    e.back() = g.back() + (g.back() - e[g.size() - 1]);
    return e;
  }
  QChart* chart_;
  const BoundaryData* data_;
  QAbstractSeries* anchor_;
  double threshold_ = 2.0;  // nothing flagged until the first threshold arrives
};

RiskCurveChart::RiskCurveChart(RiskCurveData data) : data_(std::move(data)) {
  applyChartStyle(this, QStringLiteral("Predicted risk against %1").arg(q(data_.variable)));
  double top = 0.05;
  for (double r : data_.risk) top = std::max(top, r);
  yMax_ = std::min(1.0, std::ceil(top * 1.1 * 20.0) / 20.0);
  const auto [xLo, xHi] =
      data_.x.empty() ? std::pair{0.0, 1.0} : padded(data_.x.front(), data_.x.back());
  auto* x = makeAxis(axisTitle(data_.variable, data_.unit), xLo, xHi, "%g", 6);
  auto* y = makeAxis(QStringLiteral("Predicted risk (0–1)"), 0, yMax_, "%.2f", 6);
  x->applyNiceNumbers();
  addAxis(x, Qt::AlignBottom);
  addAxis(y, Qt::AlignLeft);
  auto attach = [&](QAbstractSeries* s) { addOnAxes(this, s, x, y); };

  // The flagged side first, so the curve and the lines are drawn over it.
  flagged_ = new QAreaSeries(new QLineSeries(this));
  flagged_->setName(QStringLiteral("Flagged (risk at or above the threshold)"));
  flagged_->setBrush(flaggedBrush());
  flagged_->setPen(Qt::NoPen);
  attach(flagged_);
  auto* rug = new QScatterSeries;
  rug->setName(QStringLiteral("Cohort values"));
  QImage tick(3, 14, QImage::Format_ARGB32);
  tick.fill(QColor(0, 0, 0, 110));
  rug->setLightMarker(tick);
  rug->setMarkerSize(14);
  QList<QPointF> rugPts;
  for (double v : data_.rug) rugPts.append(QPointF(v, yMax_ * 0.015));
  rug->replace(rugPts);
  attach(rug);

  auto* curve = new QLineSeries;
  curve->setName(QStringLiteral("Model"));
  curve->setPen(rolePen(SeriesRole::Model));
  QList<QPointF> pts;
  for (std::size_t i = 0; i < data_.x.size(); ++i) pts.append(QPointF(data_.x[i], data_.risk[i]));
  curve->replace(pts);
  attach(curve);

  level_ = thresholdLine(QStringLiteral("Threshold"));
  attach(level_);
  for (int k = 0; k < kMaxCuts; ++k) {
    auto* cut = new QLineSeries;
    QPen pen = rolePen(SeriesRole::Threshold);
    pen.setStyle(Qt::DashLine);
    cut->setPen(pen);
    cut->setName(QStringLiteral("Cut point"));
    attach(cut);
    if (k > 0) hideFromLegend(this, cut);
    cutLines_.push_back(cut);
  }
}

void RiskCurveChart::setThreshold(const ThresholdSnapshot& snapshot) {
  const double t = snapshot.threshold;
  if (data_.x.empty()) return;
  level_->replace({QPointF(data_.x.front(), t), QPointF(data_.x.back(), t)});
  cuts_ = crossings(data_, t);
  // A step along the curve: the plot's height where risk >= t, nothing elsewhere, with vertical
  // edges at the crossings (interpolated between grid points as crossings() does).
  QList<QPointF> step;
  for (std::size_t i = 0; i < data_.x.size(); ++i) {
    const bool on = data_.risk[i] >= t;
    if (i > 0 && on != (data_.risk[i - 1] >= t)) {
      const double r0 = data_.risk[i - 1], r1 = data_.risk[i];
      const double f = r1 != r0 ? (t - r0) / (r1 - r0) : 0.0;
      const double xc = data_.x[i - 1] + f * (data_.x[i] - data_.x[i - 1]);
      step.append(QPointF(xc, on ? 0.0 : yMax_));
      step.append(QPointF(xc, on ? yMax_ : 0.0));
    }
    step.append(QPointF(data_.x[i], on ? yMax_ : 0.0));
  }
  flagged_->upperSeries()->replace(step);
  for (int k = 0; k < kMaxCuts; ++k) {
    if (k < static_cast<int>(cuts_.size())) {
      cutLines_[k]->replace({QPointF(cuts_[k], 0), QPointF(cuts_[k], yMax_)});
    } else {
      cutLines_[k]->clear();
    }
  }
}

std::optional<double> RiskCurveChart::thresholdAt(QPointF value) const {
  if (value.y() < 0 || value.y() > 1) return std::nullopt;
  return value.y();
}

QString RiskCurveChart::describeAt(QPointF value) const {
  if (data_.x.empty()) return {};
  const auto it = std::lower_bound(data_.x.begin(), data_.x.end(), value.x());
  const std::size_t i = std::min<std::size_t>(it - data_.x.begin(), data_.x.size() - 1);
  QString cuts;
  for (double c : cuts_) cuts += (cuts.isEmpty() ? "" : ", ") + QString::number(c, 'g', 5);
  return QStringLiteral(
             "%1 = %2: predicted risk %3\nCut point(s) at the threshold: %4\n"
             "(click to use the risk under the mouse as threshold)")
      .arg(q(data_.variable), QString::number(data_.x[i], 'g', 5), fixed(data_.risk[i], 4),
           cuts.isEmpty() ? QStringLiteral("none in range") : cuts);
}

BoundaryChart::BoundaryChart(BoundaryData data) : data_(std::move(data)) {
  applyChartStyle(this, QStringLiteral("Where predicted risk equals the threshold: %1 and %2")
                            .arg(q(data_.xVariable), q(data_.yVariable)));
  const auto [xLo, xHi] =
      data_.xs.empty() ? std::pair{0.0, 1.0} : padded(data_.xs.front(), data_.xs.back());
  const auto [yLo, yHi] =
      data_.ys.empty() ? std::pair{0.0, 1.0} : padded(data_.ys.front(), data_.ys.back());
  auto* x = makeAxis(axisTitle(data_.xVariable, data_.xUnit), xLo, xHi, "%g", 6);
  auto* y = makeAxis(axisTitle(data_.yVariable, data_.yUnit), yLo, yHi, "%g", 6);
  x->applyNiceNumbers();
  addAxis(x, Qt::AlignBottom);
  y->applyNiceNumbers();
  addAxis(y, Qt::AlignLeft);
  auto attach = [&](QAbstractSeries* s) { addOnAxes(this, s, x, y); };

  const QString thinned =
      data_.patientStride > 1
          ? QStringLiteral(", every %1th patient shown").arg(data_.patientStride)
          : QString();
  auto* without = new QScatterSeries;
  without->setName(QStringLiteral("No event (circles%1)").arg(thinned));
  without->setMarkerShape(QScatterSeries::MarkerShapeCircle);
  without->setMarkerSize(6);
  QColor blue = roleColor(SeriesRole::NonEvents);
  blue.setAlpha(150);
  without->setColor(blue);
  without->setBorderColor(blue.darker(140));
  auto* with = new QScatterSeries;
  with->setName(QStringLiteral("Event (triangles)"));
  with->setMarkerShape(QScatterSeries::MarkerShapeTriangle);
  with->setMarkerSize(9);
  with->setColor(roleColor(SeriesRole::Events));
  with->setBorderColor(palette::kBlack);
  QList<QPointF> a, b;
  for (const BoundaryPatient& p : data_.patients) (p.event ? a : b).append(QPointF(p.x, p.y));
  without->replace(b);
  with->replace(a);
  // The legend's swatch for the flagged side (an empty area with the item's brush).
  auto* swatch = new QAreaSeries(new QLineSeries(this));
  swatch->setName(QStringLiteral("Flagged side (risk at or above the threshold)"));
  swatch->setBrush(flaggedBrush());
  swatch->setPen(Qt::NoPen);
  attach(swatch);
  attach(without);
  attach(with);
  flagged_ = new FlaggedRegionItem(this, &data_, without);

  for (int k = 0; k < kMaxPieces; ++k) {
    auto* piece = new QLineSeries;
    QPen pen = rolePen(SeriesRole::Threshold);
    pen.setWidthF(3.0);
    piece->setPen(pen);
    piece->setName(QStringLiteral("Risk = threshold"));
    attach(piece);
    if (k > 0) hideFromLegend(this, piece);
    pieces_.push_back(piece);
  }
}

void BoundaryChart::setThreshold(const ThresholdSnapshot& snapshot) {
  flagged_->setThreshold(snapshot.threshold);
  boundary_ = contourAt(data_, snapshot.threshold);
  for (int k = 0; k < kMaxPieces; ++k) {
    if (k < static_cast<int>(boundary_.size())) {
      QList<QPointF> pts;
      for (const auto& [px, py] : boundary_[k]) pts.append(QPointF(px, py));
      pieces_[k]->replace(pts);
    } else {
      pieces_[k]->clear();
    }
  }
}

double BoundaryChart::riskAt(QPointF value) const {
  const std::size_t nx = data_.xs.size(), ny = data_.ys.size();
  if (nx == 0 || ny == 0) return std::nan("");
  auto nearest = [](const std::vector<double>& g, double v) {
    const auto it = std::lower_bound(g.begin(), g.end(), v);
    return std::min<std::size_t>(it - g.begin(), g.size() - 1);
  };
  return data_.risk[nearest(data_.ys, value.y()) * nx + nearest(data_.xs, value.x())];
}

std::optional<double> BoundaryChart::thresholdAt(QPointF value) const {
  const double r = riskAt(value);
  if (std::isnan(r)) return std::nullopt;
  return r;
}

QString BoundaryChart::describeAt(QPointF value) const {
  const double r = riskAt(value);
  if (std::isnan(r)) return {};
  return QStringLiteral(
             "%1 = %2, %3 = %4\nPredicted risk %5 (others held: %6)\n"
             "(click to make this risk the threshold)")
      .arg(q(data_.xVariable), QString::number(value.x(), 'g', 5), q(data_.yVariable),
           QString::number(value.y(), 'g', 5), fixed(r, 4), q(data_.heldText));
}

}  // namespace calivera::charts
