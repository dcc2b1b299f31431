#include "core/fit/spline_knots.h"

#include <algorithm>
#include <cmath>

#include "core/util/errors.h"
#include "core/util/number_format.h"

namespace calivera {
namespace {

std::vector<double> harrellProbabilities(int knots) {
  switch (knots) {
    case 3:
      return {0.10, 0.50, 0.90};
    case 4:
      return {0.05, 0.35, 0.65, 0.95};
    case 5:
      return {0.05, 0.275, 0.50, 0.725, 0.95};
    case 6:
      return {0.05, 0.23, 0.41, 0.59, 0.77, 0.95};
    default:
      return {0.025, 0.1833, 0.3417, 0.50, 0.6583, 0.8167, 0.975};
  }
}

double type7(const std::vector<double>& sorted, double p) {
  const double h = (static_cast<double>(sorted.size()) - 1.0) * p;
  const auto lo = static_cast<std::size_t>(std::floor(h));
  const std::size_t hi = std::min(lo + 1, sorted.size() - 1);
  return sorted[lo] + (h - std::floor(h)) * (sorted[hi] - sorted[lo]);
}

}  // namespace

std::vector<double> defaultSplineKnots(std::vector<double> values, int knots,
                                       const std::string& column) {
  if (knots < kMinSplineKnots || knots > kMaxSplineKnots) {
    throw InputError("spline for '" + column + "': give 3 to 7 knots, not " +
                     std::to_string(knots));
  }
  if (values.empty()) throw AnalysisError("spline for '" + column + "': no values");
  std::sort(values.begin(), values.end());
  std::vector<double> out;
  for (const double p : harrellProbabilities(knots)) out.push_back(type7(values, p));
  for (std::size_t i = 1; i < out.size(); ++i) {
    if (!(out[i] > out[i - 1])) {
      throw AnalysisError("spline for '" + column + "': its values are too tied for " +
                          std::to_string(knots) + " distinct knots (quantiles " +
                          formatShortest(out[i - 1]) + " and " + formatShortest(out[i]) +
                          " coincide); use fewer knots or a linear term");
    }
  }
  return out;
}

}  // namespace calivera
