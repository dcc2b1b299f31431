#include "core/sites/site_measures.h"

#include <algorithm>
#include <cassert>
#include <cmath>

namespace calivera {
namespace {

std::string firstWarningFrom(const ValidationResult& r, const std::string& prefix) {
  for (const std::string& w : r.warnings) {
    if (w.rfind(prefix, 0) == 0) return w;
  }
  return {};
}

bool isSmallCell(std::size_t count, std::size_t below) {
  return below > 0 && count > 0 && count < below;
}

// Why each measure cannot be pooled from this site, if it cannot (site_pooling.h lists the cases).
void notePoolingProblems(SiteMeasures& s, const ValidationResult& m) {
  if (!(s.auc > 0.0 && s.auc < 1.0)) {
    s.problems["c_statistic"] = "AUC of " + std::string(s.auc >= 1.0 ? "1" : "0") +
                                ": the logit scale is undefined (complete separation at this site)";
  } else if (!(std::isfinite(s.aucSe) && s.aucSe > 0.0)) {
    s.problems["c_statistic"] = "no DeLong standard error (a single event or a single non-event)";
  }
  if (!(s.oeRatio > 0.0 && std::isfinite(s.oeRatio))) {
    s.problems["oe_ratio"] = "O/E of 0 or undefined: the log scale is undefined";
  } else if (!std::isfinite(s.logOeSe())) {
    s.problems["oe_ratio"] = "every patient an event: no variance of O";
  }
  const auto regression = [&](const char* key, double value, double se, const char* prefix) {
    const std::string warning = firstWarningFrom(m, prefix);
    if (!warning.empty()) {
      s.problems[key] = warning;
    } else if (!(std::isfinite(value) && std::isfinite(se) && se > 0.0)) {
      s.problems[key] = std::string(prefix) + " no finite estimate and standard error";
    }
  };
  regression("calibration_intercept", s.intercept, s.interceptSe, "calibration-in-the-large:");
  regression("calibration_slope", s.slope, s.slopeSe, "calibration slope:");
}

}  // namespace

// The site's loess curve read at risks 0.01, 0.02, ..., 0.99 inside its range, by linear
// interpolation between the curve's points: a shape, never a patient's risk.
std::vector<CalibrationCurvePoint> calibrationCurveOnGrid(
    const std::vector<CalibrationCurvePoint>& curve) {
  std::vector<CalibrationCurvePoint> out;
  if (curve.size() < 2) return out;
  std::size_t j = 0;
  for (int k = 1; k <= 99; ++k) {
    const double risk = k / 100.0;
    if (risk < curve.front().risk || risk > curve.back().risk) continue;
    while (j + 2 < curve.size() && curve[j + 1].risk < risk) ++j;
    const CalibrationCurvePoint& a = curve[j];
    const CalibrationCurvePoint& b = curve[j + 1];
    const double span = b.risk - a.risk;
    const double f = span > 0.0 ? (risk - a.risk) / span : 0.0;
    out.push_back({risk, a.observed + f * (b.observed - a.observed)});
  }
  return out;
}

double SiteMeasures::logOeSe() const {
  const double variance = 1.0 / static_cast<double>(events) - 1.0 / static_cast<double>(n);
  return variance > 0.0 && std::isfinite(variance) ? std::sqrt(variance) : kNaN;
}

SiteMeasures siteMeasures(const std::string& name, std::size_t n, std::size_t events,
                          const ValidationResult* metrics, const std::string& noMetricsReason,
                          const std::vector<std::string>& warnings,
                          const std::vector<ThresholdRow>& counted,
                          const std::vector<double>& thresholds, std::size_t suppressBelow) {
  SiteMeasures s;
  s.name = name;
  s.n = n;
  s.events = events;
  s.warnings = warnings;
  if (metrics) {
    const ValidationResult& m = *metrics;
    s.hasMetrics = true;
    s.auc = m.discrimination.auc;
    s.aucSe = m.discrimination.aucSe;
    s.aucCi = m.discrimination.aucCi;
    s.oeRatio = m.calibration.oeRatio;
    s.intercept = m.calibration.intercept;
    s.interceptSe = m.calibration.interceptSe;
    s.slope = m.calibration.slope;
    s.slopeSe = m.calibration.slopeSe;
    s.brier = m.overall.brier;
    s.calibrationCurve = calibrationCurveOnGrid(m.calibration.curve);
    s.warnings.insert(s.warnings.end(), m.warnings.begin(), m.warnings.end());
    notePoolingProblems(s, m);
  } else {
    s.noMetricsReason = noMetricsReason;
    for (const char* key : kPooledMeasureKeys) s.problems[key] = noMetricsReason;
  }
  for (const double t : thresholds) {
    const auto row = std::find_if(counted.begin(), counted.end(), [&](const ThresholdRow& r) {
      return std::abs(r.threshold - t) < 1e-12;
    });
    assert(row != counted.end() && "every threshold is in the site's threshold table");
    const ThresholdRow& c = *row;
    SiteThresholdCounts counts{t, c.tp, c.fp, false};
    if (isSmallCell(c.tp, suppressBelow) || isSmallCell(c.fp, suppressBelow) ||
        isSmallCell(c.fn, suppressBelow) || isSmallCell(c.tn, suppressBelow)) {
      counts = {t, 0, 0, true};
    }
    s.thresholds.push_back(counts);
  }
  return s;
}

}  // namespace calivera
