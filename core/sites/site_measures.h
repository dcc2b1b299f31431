#pragma once
// What pooling across sites needs from one site, and nothing more: counts, the measures with their
// standard errors, why a measure cannot be pooled, and the threshold counts of net benefit. Built
// from a site's own validation (validate --cluster) or read from a site summary file
// (calivera summarize / pool, core/sites/site_summary.h), so both routes pool the same numbers
// through the same code (core/sites/site_pooling.h). Aggregates only: no patient's value.

#include <cstddef>
#include <limits>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "core/metrics/validation.h"

namespace calivera {

struct SiteThresholdCounts {
  double threshold = 0.0;
  std::size_t truePositives = 0, falsePositives = 0;
  bool suppressed = false;  // a cell below the site's suppression threshold: counts withheld
};

struct SiteMeasures {
  static constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
  std::string name;
  std::size_t n = 0, events = 0;
  bool missingLevel = false;  // the patients with no site value: shown, never pooled
  bool hasMetrics = false;    // false: see noMetricsReason (one outcome class, ...)
  std::string noMetricsReason;
  double auc = kNaN, aucSe = kNaN;
  Interval aucCi{kNaN, kNaN};  // DeLong, logit-transformed
  double oeRatio = kNaN;
  double intercept = kNaN, interceptSe = kNaN;
  double slope = kNaN, slopeSe = kNaN;
  double brier = kNaN;
  // Measure key (kPooledMeasureKeys) -> why this site cannot give it; absent: it can.
  std::map<std::string, std::string> problems;
  std::vector<std::string> warnings;
  std::vector<SiteThresholdCounts> thresholds;
  // The site's smoothed calibration curve read at risks 0.01, 0.02, ..., 0.99 inside its range
  // (calibrationCurveOnGrid): a shape for drawing every site on one axes, never a patient's risk.
  std::vector<CalibrationCurvePoint> calibrationCurve;

  // sqrt(1/O - 1/n): the SE of log(O/E) with O binomial and E fixed; NaN when not positive.
  double logOeSe() const;
};

// `curve` (sorted by risk) read at risks 0.01, 0.02, ..., 0.99 inside its range, by linear
// interpolation between its points.
std::vector<CalibrationCurvePoint> calibrationCurveOnGrid(
    const std::vector<CalibrationCurvePoint>& curve);

// The pooled measures, in the order they are reported.
inline constexpr const char* kPooledMeasureKeys[] = {"c_statistic", "oe_ratio",
                                                     "calibration_intercept", "calibration_slope"};

// One site from its own validation (`metrics` absent when it could not be validated, with
// `noMetricsReason`), with its threshold counts at `thresholds` taken from `counted` (the site's
// threshold table; each of `thresholds` must be in it). `suppressBelow` > 0 withholds the counts
// at a threshold when any of TP, FP, FN, TN lies in (0, suppressBelow).
SiteMeasures siteMeasures(const std::string& name, std::size_t n, std::size_t events,
                          const ValidationResult* metrics, const std::string& noMetricsReason,
                          const std::vector<std::string>& warnings,
                          const std::vector<ThresholdRow>& counted,
                          const std::vector<double>& thresholds, std::size_t suppressBelow = 0);

}  // namespace calivera
