#include "core/sites/random_effects.h"

#include <algorithm>
#include <boost/math/distributions/chi_squared.hpp>
#include <boost/math/distributions/students_t.hpp>
#include <cassert>
#include <cmath>

namespace calivera {
namespace {

constexpr double kZ975 = 1.959963984540054;

struct WeightedMean {
  double mean = 0.0;
  double sumW = 0.0, sumW2 = 0.0, sumW3 = 0.0;
  double weightedSquares = 0.0;   // sum w (y - mean)^2
  double weighted2Squares = 0.0;  // sum w^2 (y - mean)^2
};

WeightedMean weightedMean(const std::vector<double>& y, const std::vector<double>& v, double tau2) {
  WeightedMean m;
  double sumWy = 0.0;
  for (std::size_t i = 0; i < y.size(); ++i) {
    const double w = 1.0 / (v[i] + tau2);
    m.sumW += w;
    m.sumW2 += w * w;
    m.sumW3 += w * w * w;
    sumWy += w * y[i];
  }
  m.mean = sumWy / m.sumW;
  for (std::size_t i = 0; i < y.size(); ++i) {
    const double w = 1.0 / (v[i] + tau2);
    const double d = y[i] - m.mean;
    m.weightedSquares += w * d * d;
    m.weighted2Squares += w * w * d * d;
  }
  return m;
}

double tQuantile(double df) {
  return boost::math::quantile(boost::math::students_t(df), 0.975);
}

}  // namespace

RandomEffectsOutcome poolRandomEffects(const std::vector<double>& estimates,
                                       const std::vector<double>& variances,
                                       const RandomEffectsOptions& options) {
  assert(options.isValid());
  assert(estimates.size() == variances.size());
  for (std::size_t i = 0; i < estimates.size(); ++i) {
    assert(std::isfinite(estimates[i]) && std::isfinite(variances[i]) && variances[i] > 0.0);
  }
  RandomEffectsOutcome outcome;
  const std::size_t k = estimates.size();
  if (k < 2) {
    outcome.problem = "fewer than two sites with an estimate: nothing to pool";
    return outcome;
  }
  const double df = static_cast<double>(k - 1);
  RandomEffectsPool p;
  p.k = k;

  const WeightedMean fixed = weightedMean(estimates, variances, 0.0);
  p.fixedEstimate = fixed.mean;
  p.fixedSe = 1.0 / std::sqrt(fixed.sumW);
  p.fixedCi = {p.fixedEstimate - kZ975 * p.fixedSe, p.fixedEstimate + kZ975 * p.fixedSe};
  p.q = fixed.weightedSquares;
  p.qPValue = boost::math::cdf(boost::math::complement(boost::math::chi_squared(df), p.q));

  // DerSimonian-Laird start, then REML Fisher scoring. With W = diag(w*) and
  // P = W - w* w*' / sum w*: score = (y'PPy - tr P) / 2, information = tr(PP) / 2, where
  // y'PPy = sum w*^2 (y - mean)^2, tr P = sum w* - sum w*^2 / sum w*,
  // tr(PP) = sum w*^2 - 2 sum w*^3 / sum w* + (sum w*^2)^2 / (sum w*)^2.
  double tau2 = std::max(0.0, (p.q - df) / (fixed.sumW - fixed.sumW2 / fixed.sumW));
  bool converged = false;
  for (int iteration = 1; iteration <= options.maxIterations; ++iteration) {
    const WeightedMean m = weightedMean(estimates, variances, tau2);
    const double traceP = m.sumW - m.sumW2 / m.sumW;
    const double tracePP =
        m.sumW2 - 2.0 * m.sumW3 / m.sumW + (m.sumW2 * m.sumW2) / (m.sumW * m.sumW);
    const double step = (m.weighted2Squares - traceP) / tracePP;
    const double next = std::max(0.0, tau2 + step);
    const double change = std::abs(next - tau2);
    tau2 = next;
    p.iterations = iteration;
    if (!std::isfinite(tau2)) break;
    if (change <= options.tolerance * std::max(1.0, tau2)) {
      converged = true;
      break;
    }
  }
  if (!converged) {
    outcome.problem = "the REML estimate of the between-site variance did not converge in " +
                      std::to_string(options.maxIterations) + " iterations";
    return outcome;
  }
  p.tau2 = tau2;

  const WeightedMean random = weightedMean(estimates, variances, tau2);
  p.estimate = random.mean;
  p.se = 1.0 / std::sqrt(random.sumW);
  p.ciWald = {p.estimate - kZ975 * p.se, p.estimate + kZ975 * p.se};
  const double t = tQuantile(df);
  p.hksjScale = random.weightedSquares / df;
  const double seHksj = std::sqrt(p.hksjScale / random.sumW);
  p.ciHksj = {p.estimate - t * seHksj, p.estimate + t * seHksj};
  const double seTruncated = std::sqrt(std::max(1.0, p.hksjScale) / random.sumW);
  p.ci = {p.estimate - t * seTruncated, p.estimate + t * seTruncated};

  const double typicalVariance = df * fixed.sumW / (fixed.sumW * fixed.sumW - fixed.sumW2);
  p.i2 = tau2 / (tau2 + typicalVariance);
  if (k >= 3) {
    const double half = tQuantile(static_cast<double>(k - 2)) * std::sqrt(tau2 + p.se * p.se);
    p.predictionInterval = Interval{p.estimate - half, p.estimate + half};
  }
  outcome.pool = p;
  return outcome;
}

}  // namespace calivera
