#pragma once
// Percentile bootstrap 95% intervals (Efron 1979; Efron & Tibshirani 1993) for the validation
// measures of a fixed model on one cohort: every replicate resamples patients with replacement
// and recomputes the measures with the same validate() the point estimates come from, so an
// interval always belongs to the number printed beside it.
//
// Bands: net benefit at every decision-curve threshold, and the smoothed calibration curve at
// fixed risk grid points (each replicate's curve is interpolated linearly at the grid; a grid
// point outside the replicate's range of risks is left out of that replicate, and the band
// reports how many replicates it rests on).
//
// Edge cases: a resample with one outcome class fails (counted in `failed`, left out of the
// intervals); replicates 0 -> no result (callers skip). Same seed -> identical intervals for any
// thread count (see bootstrap.h).

#include <cstddef>
#include <cstdint>
#include <string>
#include <vector>

#include "core/metrics/validation.h"
#include "core/uncertainty/bootstrap.h"

namespace calivera {

struct BootstrapEstimate {
  double estimate = 0.0;  // the point estimate on the cohort itself
  Interval ci;            // percentile 95%
  std::size_t replicatesUsed = 0;
};

struct BandPoint {
  double x = 0.0;         // threshold (decision curve) or risk (calibration curve)
  double estimate = 0.0;  // point estimate on the cohort
  Interval ci;
  std::size_t replicatesUsed = 0;
};

struct ValidationBootstrap {
  BootstrapSummary run;
  BootstrapEstimate auc, brier, brierScaled, calibrationIntercept, calibrationSlope, oeRatio, ici,
      e90;
  std::vector<BandPoint> netBenefit;        // one per decision-curve threshold
  std::vector<BandPoint> calibrationCurve;  // at calibrationGrid points inside the risk range
  std::vector<std::string> warnings;
};

struct ValidationBootstrapOptions {
  BootstrapOptions bootstrap;
  // Risk grid for the calibration band; empty: 0.01..0.99 by 0.01, kept where the cohort has risks.
  std::vector<double> calibrationGrid;
};

// `apparent` is validate(input, options) on the full cohort (its numbers are the estimates).
ValidationBootstrap bootstrapValidation(const ValidationInput& input,
                                        const ValidationOptions& options,
                                        const ValidationResult& apparent,
                                        const ValidationBootstrapOptions& bootstrapOptions);

// Linear interpolation of a calibration curve (sorted by risk) at `risk`; NaN outside its range.
double interpolateCurve(const std::vector<CalibrationCurvePoint>& curve, double risk);

}  // namespace calivera
