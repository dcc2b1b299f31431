#include "core/uncertainty/validation_bootstrap.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <sstream>

#include "core/uncertainty/bootstrap_measures.h"

namespace calivera {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
constexpr std::size_t kScalarCount = kBootstrappedMeasureCount;

// The scalar measures in the catalog's order (core/uncertainty/bootstrap_measures.h).
std::vector<double> scalarsOf(const ValidationResult& r) {
  std::vector<double> values;
  values.reserve(kScalarCount);
  for (const BootstrappedMeasure& m : bootstrappedMeasures()) values.push_back(m.estimate(r));
  return values;
}

BootstrapEstimate estimateOf(const BootstrapRun& run, std::size_t column, double estimate) {
  const PercentileInterval ci = percentileInterval(run, column);
  return {estimate, {ci.lo, ci.hi}, ci.replicatesUsed};
}

}  // namespace

double interpolateCurve(const std::vector<CalibrationCurvePoint>& curve, double risk) {
  if (curve.empty() || risk < curve.front().risk || risk > curve.back().risk) return kNaN;
  const auto above =
      std::lower_bound(curve.begin(), curve.end(), risk,
                       [](const CalibrationCurvePoint& p, double r) { return p.risk < r; });
  if (above == curve.begin()) return above->observed;
  const auto below = above - 1;
  if (above->risk == below->risk) return above->observed;
  const double f = (risk - below->risk) / (above->risk - below->risk);
  return below->observed + f * (above->observed - below->observed);
}

ValidationBootstrap bootstrapValidation(const ValidationInput& input,
                                        const ValidationOptions& options,
                                        const ValidationResult& apparent,
                                        const ValidationBootstrapOptions& bootstrapOptions) {
  ValidationBootstrap result;

  std::vector<double> grid;
  const auto& curve = apparent.calibration.curve;
  const std::vector<double> candidates = bootstrapOptions.calibrationGrid.empty()
                                             ? thresholdRange(0.01, 0.99, 0.01)
                                             : bootstrapOptions.calibrationGrid;
  for (double x : candidates) {
    if (!curve.empty() && x >= curve.front().risk && x <= curve.back().risk) grid.push_back(x);
  }
  const std::size_t thresholdCount = apparent.decisionCurve.size();
  const std::size_t total = kScalarCount + thresholdCount + grid.size();

  ValidationOptions replicateOptions = options;
  replicateOptions.progress = nullptr;
  const auto statistic = [&](const std::vector<std::uint32_t>& sample) {
    ValidationInput resampled;
    resampled.outcome.reserve(sample.size());
    resampled.risk.reserve(sample.size());
    for (const std::uint32_t i : sample) {
      resampled.outcome.push_back(input.outcome[i]);
      resampled.risk.push_back(input.risk[i]);
    }
    if (input.linearPredictor) {
      std::vector<double> lp;
      lp.reserve(sample.size());
      for (const std::uint32_t i : sample) lp.push_back((*input.linearPredictor)[i]);
      resampled.linearPredictor = std::move(lp);
    }
    // validate() throws AnalysisError for a one-class resample: the engine
    // counts it as failed.
    const ValidationResult r = validate(resampled, replicateOptions);
    std::vector<double> values = scalarsOf(r);
    values.reserve(total);
    for (std::size_t t = 0; t < thresholdCount; ++t) {
      values.push_back(t < r.decisionCurve.size() ? r.decisionCurve[t].netBenefit : kNaN);
    }
    for (double x : grid) values.push_back(interpolateCurve(r.calibration.curve, x));
    return values;
  };
  const BootstrapRun run =
      runBootstrap(input.outcome.size(), total, statistic, bootstrapOptions.bootstrap);
  result.run = summarize(run, bootstrapOptions.bootstrap);

  const std::vector<double> point = scalarsOf(apparent);
  for (std::size_t s = 0; s < kScalarCount; ++s) {
    result.*(bootstrappedMeasures()[s].interval) = estimateOf(run, s, point[s]);
  }
  for (std::size_t t = 0; t < thresholdCount; ++t) {
    const BootstrapEstimate e =
        estimateOf(run, kScalarCount + t, apparent.decisionCurve[t].netBenefit);
    result.netBenefit.push_back(
        {apparent.decisionCurve[t].threshold, e.estimate, e.ci, e.replicatesUsed});
  }
  for (std::size_t g = 0; g < grid.size(); ++g) {
    const BootstrapEstimate e =
        estimateOf(run, kScalarCount + thresholdCount + g, interpolateCurve(curve, grid[g]));
    result.calibrationCurve.push_back({grid[g], e.estimate, e.ci, e.replicatesUsed});
  }
  if (run.failed > 0) {
    std::ostringstream message;
    message << run.failed << " of " << result.run.replicates
            << " bootstrap resamples could not be evaluated (" << run.firstFailure
            << "); intervals rest on the others";
    result.warnings.push_back(message.str());
  }
  const auto sparse = std::count_if(
      result.calibrationCurve.begin(), result.calibrationCurve.end(), [&](const BandPoint& p) {
        return p.replicatesUsed < static_cast<std::size_t>(0.9 * result.run.replicates);
      });
  if (sparse > 0) {
    result.warnings.push_back(std::to_string(sparse) +
                              " calibration band points lie outside the risk range of more than "
                              "10% of the resamples (band edges are less reliable)");
  }
  return result;
}

}  // namespace calivera
