#pragma once
// Smoothed calibration curve and the calibration-error summaries of Austin & Steyerberg (Stat Med
// 2019;38:4051-65): s(p) = loess smooth of the outcome y on the predicted risk p;
// ICI = mean |p - s(p)| over patients, E50 = median, E90 = 90th percentile (type 7), Emax = max.
//
// The smoother reproduces R's loess(y ~ p, family = "gaussian", degree = 2, span = 0.75,
// surface = "direct") (Cleveland, Grosse & Shyu 1992): at each fit point x0 a weighted least
// squares quadratic in (x - x0) over all patients, tricube weights w = (1 - (d/h)^3)^3 for d < h
// and 0 otherwise, d = |x - x0|, h = the q-th smallest distance with q = floor(span * n) (span < 1;
// ties counted with multiplicity, so patients at distance exactly h get weight 0). R's default
// statistics = "approximate" only concerns the equivalent degrees of freedom and standard errors;
// with surface = "direct" its fitted values are these exact local fits (checked against R).
// A singular local system (fewer than 3 distinct risks with positive weight) is solved by
// pseudo-inverse, as R does, with a warning.
//
// The q nearest neighbours of x0 form a contiguous window of the risk-sorted cohort that slides
// monotonically as x0 increases, so finding them costs O(n) overall; each exact fit costs O(q).
// Up to `exactMaxN` patients every distinct risk gets its exact fit (O(n q)). Above it, exact fits
// are made at `gridPoints` type-7 quantiles of the risks (minimum and maximum included) and s(p)
// at each patient is linearly interpolated between them; `interpolated` says so.

#include <cstddef>
#include <string>
#include <vector>

#include "core/metrics/sorted_cohort.h"
#include "core/metrics/validation.h"

namespace calivera {

struct LoessOptions {
  double span = 0.75;
  std::size_t exactMaxN = 5000;
  int gridPoints = 500;
  std::size_t curveMaxPoints = 500;  // points returned for plotting
};

struct LoessCalibration {
  bool available = false;  // false: too few patients or all risks equal; see `problem`
  std::string problem;
  bool interpolated = false;
  bool pseudoInverseUsed = false;
  std::vector<double> smoothed;  // s(p) per position of the sorted cohort
  double ici = 0.0, e50 = 0.0, e90 = 0.0, emax = 0.0;
  std::vector<CalibrationCurvePoint> curve;
};

// Exact local quadratic fits at ascending points `at`, over ascending x with responses y.
// Sets *pseudoInverse when any local system was singular.
std::vector<double> loessFitAt(const std::vector<double>& x, const std::vector<double>& y,
                               const std::vector<double>& at, double span, bool* pseudoInverse);

LoessCalibration loessCalibration(const SortedCohort& sorted, const LoessOptions& options);

}  // namespace calivera
