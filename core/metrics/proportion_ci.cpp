#include "core/metrics/proportion_ci.h"

#include <algorithm>
#include <boost/math/distributions/beta.hpp>
#include <cmath>

namespace calivera {

// Wilson 1927: the roots in p of (phat - p)^2 = z^2 p (1 - p) / n.
Interval wilsonInterval(std::size_t k, std::size_t n, double z) {
  if (n == 0) return {0.0, 1.0};
  const double nn = static_cast<double>(n);
  const double p = static_cast<double>(k) / nn;
  const double z2 = z * z;
  const double denominator = 1.0 + z2 / nn;
  const double centre = (p + z2 / (2.0 * nn)) / denominator;
  const double halfWidth = z * std::sqrt(p * (1.0 - p) / nn + z2 / (4.0 * nn * nn)) / denominator;
  Interval ci{std::max(0.0, centre - halfWidth), std::min(1.0, centre + halfWidth)};
  if (k == 0) ci.lo = 0.0;
  if (k == n) ci.hi = 1.0;
  return ci;
}

// Clopper & Pearson 1934 via beta quantiles: lo = B(a/2; k, n-k+1), hi = B(1-a/2; k+1, n-k).
Interval clopperPearsonInterval(std::size_t k, std::size_t n, double level) {
  if (n == 0) return {0.0, 1.0};
  const double alpha = 1.0 - level;
  const double kk = static_cast<double>(k);
  const double nn = static_cast<double>(n);
  Interval ci{0.0, 1.0};
  if (k > 0)
    ci.lo = boost::math::quantile(boost::math::beta_distribution<>(kk, nn - kk + 1.0), alpha / 2.0);
  if (k < n)
    ci.hi = boost::math::quantile(boost::math::beta_distribution<>(kk + 1.0, nn - kk),
                                  1.0 - alpha / 2.0);
  return ci;
}

}  // namespace calivera
