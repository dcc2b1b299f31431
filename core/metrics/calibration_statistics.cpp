#include "core/metrics/calibration_statistics.h"

#include <boost/math/distributions/normal.hpp>
#include <cmath>
#include <cstddef>
#include <limits>

namespace calivera {

double twoSidedNormalP(double z) {
  if (!std::isfinite(z)) return std::isnan(z) ? z : 0.0;
  return 2.0 * boost::math::cdf(boost::math::complement(boost::math::normal(), std::abs(z)));
}

ObservedExpected observedExpected(const std::vector<double>& risk,
                                  const std::vector<double>& outcome, double z) {
  ObservedExpected oe;
  for (std::size_t i = 0; i < risk.size(); ++i) {
    oe.observed += outcome[i] > 0.5 ? 1.0 : 0.0;
    oe.expected += risk[i];
  }
  const double nan = std::numeric_limits<double>::quiet_NaN();
  oe.ratio = oe.expected > 0.0 ? oe.observed / oe.expected : nan;
  if (oe.observed > 0.0 && oe.expected > 0.0) {
    const double half = z * std::sqrt(1.0 / oe.observed);
    oe.ci = {oe.ratio * std::exp(-half), oe.ratio * std::exp(half)};
  } else {
    oe.ci = {nan, nan};
  }
  return oe;
}

SpiegelhalterTest spiegelhalter(const std::vector<double>& risk,
                                const std::vector<double>& outcome) {
  double numerator = 0.0, variance = 0.0;
  for (std::size_t i = 0; i < risk.size(); ++i) {
    const double p = risk[i];
    const double y = outcome[i] > 0.5 ? 1.0 : 0.0;
    numerator += (y - p) * (1.0 - 2.0 * p);
    variance += (1.0 - 2.0 * p) * (1.0 - 2.0 * p) * p * (1.0 - p);
  }
  SpiegelhalterTest t;
  if (variance > 0.0) {
    t.z = numerator / std::sqrt(variance);
    t.pValue = twoSidedNormalP(t.z);
  } else {
    t.z = t.pValue = std::numeric_limits<double>::quiet_NaN();
  }
  return t;
}

}  // namespace calivera
