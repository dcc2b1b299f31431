#include "core/uncertainty/weighted_metrics.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>
#include <utility>

namespace calivera {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
constexpr int kMaxIterations = 100;
constexpr double kStepTolerance = 1e-11;

double weightOf(const std::vector<double>& weights, std::size_t i) {
  return weights.empty() ? 1.0 : weights[i];
}

double expit(double x) {
  return 1.0 / (1.0 + std::exp(-x));
}

}  // namespace

std::vector<std::uint32_t> ascendingOrder(const std::vector<double>& values) {
  // Sorting (value, index) pairs keeps the comparisons in cache (an index sort chases pointers);
  // the index breaks ties, so the order is fully determined.
  std::vector<std::pair<double, std::uint32_t>> keyed(values.size());
  for (std::size_t i = 0; i < values.size(); ++i)
    keyed[i] = {values[i], static_cast<std::uint32_t>(i)};
  std::sort(keyed.begin(), keyed.end());
  std::vector<std::uint32_t> order(values.size());
  for (std::size_t i = 0; i < keyed.size(); ++i) order[i] = keyed[i].second;
  return order;
}

double weightedAuc(const std::vector<double>& lp, const std::vector<double>& y,
                   const std::vector<std::uint32_t>& order, const std::vector<double>& weights) {
  // Walk tie groups upwards: each event beats the non-events below it and ties half of its group.
  double nonEventsBelow = 0.0, events = 0.0, concordant = 0.0;
  for (std::size_t i = 0; i < order.size();) {
    std::size_t j = i;
    double groupEvents = 0.0, groupNonEvents = 0.0;
    while (j < order.size() && lp[order[j]] == lp[order[i]]) {
      const double w = weightOf(weights, order[j]);
      (y[order[j]] > 0.5 ? groupEvents : groupNonEvents) += w;
      ++j;
    }
    concordant += groupEvents * (nonEventsBelow + 0.5 * groupNonEvents);
    nonEventsBelow += groupNonEvents;
    events += groupEvents;
    i = j;
  }
  if (!(events > 0.0) || !(nonEventsBelow > 0.0)) return kNaN;
  return concordant / (events * nonEventsBelow);
}

double weightedOffsetIntercept(const std::vector<double>& offset, const std::vector<double>& y,
                               const std::vector<double>& weights) {
  // The score S(a) = sum w (y - expit(a + offset)) falls strictly as a rises, so its one root is
  // found by Newton's method kept inside a bracket [lo, hi] with S(lo) > 0 > S(hi), bisecting
  // whenever a Newton step would leave it. Plain Newton from 0 diverges when the offset is large
  // and uncentred (every expit near 0 or 1, information near 0).
  double sumW = 0.0, sumWy = 0.0, sumWo = 0.0;
  for (std::size_t i = 0; i < offset.size(); ++i) {
    const double w = weightOf(weights, i);
    sumW += w;
    sumWy += w * y[i];
    sumWo += w * offset[i];
  }
  if (!(sumW > 0.0) || !(sumWy > 0.0) || !(sumWy < sumW)) return kNaN;  // no finite root
  const auto scoreAndInformation = [&](double a, double& information) {
    double score = 0.0;
    information = 0.0;
    for (std::size_t i = 0; i < offset.size(); ++i) {
      const double w = weightOf(weights, i);
      if (w == 0.0) continue;
      const double p = expit(a + offset[i]);
      score += w * (y[i] - p);
      information += w * p * (1.0 - p);
    }
    return score;
  };
  const double mean = sumWy / sumW;
  double a = std::log(mean / (1.0 - mean)) - sumWo / sumW;  // exact when the offset is constant
  double information = 0.0;
  double lo = a - 1.0, hi = a + 1.0;
  for (int k = 0; k < 64 && scoreAndInformation(lo, information) <= 0.0; ++k) lo -= (hi - lo);
  for (int k = 0; k < 64 && scoreAndInformation(hi, information) >= 0.0; ++k) hi += (hi - lo);
  for (int iteration = 0; iteration < 4 * kMaxIterations; ++iteration) {
    const double score = scoreAndInformation(a, information);
    if (score > 0.0) {
      lo = a;
    } else if (score < 0.0) {
      hi = a;
    } else {
      return a;
    }
    double next = information > 0.0 ? a + score / information : kNaN;
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);  // the Newton step left the bracket
    const double step = next - a;
    a = next;
    if (std::fabs(step) < kStepTolerance * (1.0 + std::fabs(a)) ||
        hi - lo < kStepTolerance * (1.0 + std::fabs(a))) {
      return a;
    }
  }
  return kNaN;
}

InterceptSlope weightedCalibrationSlope(const std::vector<double>& lp, const std::vector<double>& y,
                                        const std::vector<double>& weights) {
  // Newton-Raphson on (a, b) with the LP centred, for a well-conditioned 2 x 2 information.
  double sumW = 0.0, sumWx = 0.0;
  for (std::size_t i = 0; i < lp.size(); ++i) {
    sumW += weightOf(weights, i);
    sumWx += weightOf(weights, i) * lp[i];
  }
  const double centre = sumW > 0.0 ? sumWx / sumW : 0.0;
  double a = centre, b = 1.0;  // a is the intercept on the centred scale
  for (int iteration = 0; iteration < kMaxIterations; ++iteration) {
    double u0 = 0.0, u1 = 0.0, i00 = 0.0, i01 = 0.0, i11 = 0.0;
    for (std::size_t i = 0; i < lp.size(); ++i) {
      const double w = weightOf(weights, i);
      if (w == 0.0) continue;
      const double x = lp[i] - centre;
      const double p = expit(a + b * x);
      const double r = w * (y[i] - p);
      const double v = w * p * (1.0 - p);
      u0 += r;
      u1 += r * x;
      i00 += v;
      i01 += v * x;
      i11 += v * x * x;
    }
    const double determinant = i00 * i11 - i01 * i01;
    if (!(determinant > 0.0)) return {kNaN, kNaN};
    const double da = (i11 * u0 - i01 * u1) / determinant;
    const double db = (i00 * u1 - i01 * u0) / determinant;
    a += da;
    b += db;
    if (!std::isfinite(a) || !std::isfinite(b)) return {kNaN, kNaN};
    if (std::fabs(da) < kStepTolerance * (1.0 + std::fabs(a)) &&
        std::fabs(db) < kStepTolerance * (1.0 + std::fabs(b))) {
      return {a - b * centre, b};
    }
  }
  return {kNaN, kNaN};
}

WeightedMeasures weightedMeasures(const std::vector<double>& lp, const std::vector<double>& y,
                                  const std::vector<std::uint32_t>& order,
                                  const std::vector<double>& weights) {
  WeightedMeasures m;
  m.auc = weightedAuc(lp, y, order, weights);
  m.calibrationIntercept = weightedOffsetIntercept(lp, y, weights);
  m.calibrationSlope = weightedCalibrationSlope(lp, y, weights).slope;
  double sum = 0.0, total = 0.0;
  for (std::size_t i = 0; i < lp.size(); ++i) {
    const double w = weightOf(weights, i);
    const double residual = y[i] - expit(lp[i]);
    sum += w * residual * residual;
    total += w;
  }
  m.brier = total > 0.0 ? sum / total : kNaN;
  return m;
}

}  // namespace calivera
