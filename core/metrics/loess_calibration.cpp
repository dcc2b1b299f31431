#include "core/metrics/loess_calibration.h"

#include <Eigen/Dense>
#include <algorithm>
#include <cmath>
#include <stdexcept>

namespace calivera {
namespace {

// Weighted quadratic fit at x0 over x[begin, end), u = (x - x0)/h scaled so the 3x3 normal
// equations stay well conditioned; the fitted value at x0 is the constant coefficient.
double localQuadratic(const double* x, const double* y, std::size_t begin, std::size_t end,
                      double x0, double h, bool* singular) {
  double s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, t0 = 0, t1 = 0, t2 = 0;
  const double inverse = 1.0 / h;
  for (std::size_t i = begin; i < end; ++i) {
    const double u = (x[i] - x0) * inverse;
    const double d = std::min(std::abs(u), 1.0);
    const double c = 1.0 - d * d * d;
    const double w = c * c * c;
    const double wu = w * u;
    const double wu2 = wu * u;
    s0 += w;
    s1 += wu;
    s2 += wu2;
    s3 += wu2 * u;
    s4 += wu2 * u * u;
    t0 += w * y[i];
    t1 += wu * y[i];
    t2 += wu2 * y[i];
  }
  Eigen::Matrix3d a;
  a << s0, s1, s2, s1, s2, s3, s2, s3, s4;
  const Eigen::Vector3d b(t0, t1, t2);
  Eigen::LDLT<Eigen::Matrix3d> ldlt(a);
  const double scale = std::max(s0, 1e-300);
  const Eigen::Vector3d d = ldlt.vectorD().cwiseAbs();
  if (ldlt.info() == Eigen::Success && d.minCoeff() > 1e-10 * scale) return ldlt.solve(b)(0);
  *singular = true;
  Eigen::CompleteOrthogonalDecomposition<Eigen::Matrix3d> cod(a);
  cod.setThreshold(1e-10);
  return cod.solve(b)(0);
}

}  // namespace

std::vector<double> loessFitAt(const std::vector<double>& x, const std::vector<double>& y,
                               const std::vector<double>& at, double span, bool* pseudoInverse) {
  const std::size_t n = x.size();
  const auto q = static_cast<std::size_t>(std::floor(span * static_cast<double>(n)));
  if (q < 1 || q > n) throw std::invalid_argument("loess: span gives no neighbours");
  std::vector<double> fitted(at.size());
  std::size_t left = 0;  // window [left, left + q) holds the q nearest neighbours of x0
  for (std::size_t k = 0; k < at.size(); ++k) {
    const double x0 = at[k];
    while (left + q < n && x[left + q] - x0 < x0 - x[left]) ++left;
    const double h = std::max(x0 - x[left], x[left + q - 1] - x0);
    if (!(h > 0.0)) throw std::invalid_argument("loess: q nearest neighbours all at one value");
    fitted[k] = localQuadratic(x.data(), y.data(), left, left + q, x0, h, pseudoInverse);
  }
  return fitted;
}

LoessCalibration loessCalibration(const SortedCohort& sorted, const LoessOptions& options) {
  LoessCalibration result;
  const std::size_t n = sorted.size();
  const auto q = static_cast<std::size_t>(std::floor(options.span * static_cast<double>(n)));
  if (n == 0 || q < 3) {
    result.problem = "too few patients for a loess calibration curve";
    return result;
  }
  std::vector<double> y(sorted.event.begin(), sorted.event.end());
  const std::vector<double>& x = sorted.risk;
  // Fit points: every distinct risk, or a quantile grid at large n.
  std::vector<double> at;
  result.interpolated = n > options.exactMaxN && options.gridPoints >= 2;
  if (result.interpolated) {
    for (int k = 0; k < options.gridPoints; ++k) {
      at.push_back(quantileType7(x, static_cast<double>(k) / (options.gridPoints - 1)));
    }
  } else {
    at = x;
  }
  at.erase(std::unique(at.begin(), at.end()), at.end());
  if (at.size() < 2) {
    result.problem = "all predicted risks are equal; no calibration curve";
    result.interpolated = false;
    return result;
  }
  std::vector<double> fitted;
  try {
    fitted = loessFitAt(x, y, at, options.span, &result.pseudoInverseUsed);
  } catch (const std::invalid_argument&) {
    result.problem = "more than " + std::to_string(q) +
                     " patients share one risk value; loess neighbourhoods are degenerate";
    result.interpolated = false;
    return result;
  }
  // s(p) per sorted patient: the fit at its own risk, or linear interpolation on the grid.
  result.smoothed.resize(n);
  std::size_t k = 0;
  for (std::size_t i = 0; i < n; ++i) {
    while (k + 1 < at.size() && at[k + 1] <= x[i]) ++k;
    if (k + 1 == at.size() || at[k] == x[i]) {
      result.smoothed[i] = fitted[k];
    } else {
      const double f = (x[i] - at[k]) / (at[k + 1] - at[k]);
      result.smoothed[i] = fitted[k] + f * (fitted[k + 1] - fitted[k]);
    }
  }
  std::vector<double> error(n);
  double sum = 0.0;
  for (std::size_t i = 0; i < n; ++i) {
    error[i] = std::abs(x[i] - result.smoothed[i]);
    sum += error[i];
  }
  result.ici = sum / static_cast<double>(n);
  result.emax = *std::max_element(error.begin(), error.end());
  // Type-7 quantiles need only two order statistics each: selection instead of a full sort.
  const auto quantile = [&error, n](double probability) {
    const double index = static_cast<double>(n - 1) * probability;
    const auto lo = static_cast<std::size_t>(std::floor(index));
    std::nth_element(error.begin(), error.begin() + static_cast<std::ptrdiff_t>(lo), error.end());
    const double xLo = error[lo];
    if (lo + 1 >= n || index == static_cast<double>(lo)) return xLo;
    const double xHi =
        *std::min_element(error.begin() + static_cast<std::ptrdiff_t>(lo) + 1, error.end());
    const double h = index - static_cast<double>(lo);
    return (1.0 - h) * xLo + h * xHi;
  };
  result.e50 = quantile(0.5);
  result.e90 = quantile(0.9);
  // Plotting points: the fit points, evenly thinned.
  const std::size_t step =
      std::max<std::size_t>(1, (at.size() + options.curveMaxPoints - 1) /
                                   std::max<std::size_t>(options.curveMaxPoints, 1));
  for (std::size_t j = 0; j < at.size(); j += step) result.curve.push_back({at[j], fitted[j]});
  if (result.curve.back().risk != at.back()) result.curve.push_back({at.back(), fitted.back()});
  result.available = true;
  return result;
}

}  // namespace calivera
