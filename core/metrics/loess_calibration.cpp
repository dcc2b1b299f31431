#include "core/metrics/loess_calibration.h"

#include <Eigen/Dense>
#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <thread>

namespace calivera {
namespace {

// Weighted sums of one local fit: S_k = sum w u^k (k = 0..4), T_k = sum w y u^k (k = 0..2), with
// u = (x - x0) / h and tricube weight w = (1 - |u|^3)^3.
struct LocalSums {
  double s[5] = {0, 0, 0, 0, 0};
  double t[3] = {0, 0, 0};
};

void addPointsDirectly(const double* x, const double* y, std::size_t begin, std::size_t end,
                       double x0, double inverseH, LocalSums& sums) {
  for (std::size_t i = begin; i < end; ++i) {
    const double u = (x[i] - x0) * inverseH;
    const double d = std::min(std::abs(u), 1.0);
    const double c = 1.0 - d * d * d;
    const double w = c * c * c;
    const double wu = w * u;
    const double wu2 = wu * u;
    sums.s[0] += w;
    sums.s[1] += wu;
    sums.s[2] += wu2;
    sums.s[3] += wu2 * u;
    sums.s[4] += wu2 * u * u;
    sums.t[0] += w * y[i];
    sums.t[1] += wu * y[i];
    sums.t[2] += wu2 * y[i];
  }
}

// Blocks of consecutive sorted patients with their power sums about the block centre c:
// P_j = sum (x - c)^j (j <= 13), Q_j = sum y (x - c)^j (j <= 11). On one side of x0 the tricube
// weight is a polynomial in u: w = 1 - 3 s u^3 + 3 u^6 - s u^9 with s = sign(u), so the local sums
// over a block lying wholly on one side within distance h are exact combinations of its power
// sums, re-centred at x0 by the binomial theorem. Every term there is bounded by the block's
// count (|u| < 1 and |(c - x0)/h| < 1), so no cancellation beyond ~1e-12 relative can occur.
// Points in partly covered blocks (around x0 and at distance ~h) are summed directly, so the kink
// of |u|^3 at x0 and the cut-off at h are exact.
constexpr int kPowers = 14;   // j = 0..13
constexpr int kYPowers = 12;  // j = 0..11

class MomentBlocks {
 public:
  MomentBlocks(const std::vector<double>& x, const std::vector<double>& y, std::size_t blockSize)
      : size_(blockSize) {
    const std::size_t blocks = x.size() / size_;  // a trailing partial block is summed directly
    centre_.resize(blocks);
    p_.assign(blocks * kPowers, 0.0);
    q_.assign(blocks * kYPowers, 0.0);
    for (std::size_t b = 0; b < blocks; ++b) {
      const std::size_t begin = b * size_, end = begin + size_;
      const double c = 0.5 * (x[begin] + x[end - 1]);
      centre_[b] = c;
      double* p = &p_[b * kPowers];
      double* q = &q_[b * kYPowers];
      for (std::size_t i = begin; i < end; ++i) {
        const double t = x[i] - c;
        double power = 1.0;
        for (int j = 0; j < kPowers; ++j) {
          p[j] += power;
          if (j < kYPowers) q[j] += y[i] * power;
          power *= t;
        }
      }
    }
    for (int m = 0; m < kPowers; ++m) {
      binomial_[m][0] = 1.0;
      for (int j = 1; j <= m; ++j) {
        binomial_[m][j] = binomial_[m - 1][j - 1] + (j < m ? binomial_[m - 1][j] : 0.0);
      }
    }
  }

  std::size_t blockSize() const { return size_; }
  std::size_t blockCount() const { return centre_.size(); }

  // Adds the power sums A_m = sum u^m (m <= 13) and B_m = sum y u^m (m <= 11) of blocks
  // [first, last) to a and b.
  void addBlocks(std::size_t first, std::size_t last, double x0, double inverseH, double* a,
                 double* bsum) const {
    double scale[kPowers];
    scale[0] = 1.0;
    for (int j = 1; j < kPowers; ++j) scale[j] = scale[j - 1] * inverseH;
    for (std::size_t k = first; k < last; ++k) {
      const double delta = (centre_[k] - x0) * inverseH;
      double deltaPower[kPowers];
      deltaPower[0] = 1.0;
      for (int j = 1; j < kPowers; ++j) deltaPower[j] = deltaPower[j - 1] * delta;
      const double* p = &p_[k * kPowers];
      const double* q = &q_[k * kYPowers];
      double ps[kPowers], qs[kYPowers];
      for (int j = 0; j < kPowers; ++j) ps[j] = p[j] * scale[j];
      for (int j = 0; j < kYPowers; ++j) qs[j] = q[j] * scale[j];
      for (int m = 0; m < kPowers; ++m) {
        double sumP = 0.0, sumQ = 0.0;
        for (int j = 0; j <= m; ++j) {
          const double c = binomial_[m][j] * deltaPower[m - j];
          sumP += c * ps[j];
          if (m < kYPowers) sumQ += c * qs[j];
        }
        a[m] += sumP;
        if (m < kYPowers) bsum[m] += sumQ;
      }
    }
  }

 private:
  std::size_t size_;
  std::vector<double> centre_;
  std::vector<double> p_, q_;
  double binomial_[kPowers][kPowers] = {};
};

// Local sums over the patients at positions [begin, end), all on one side of x0 (sign -1: left,
// +1: right) and within distance h.
void addSide(const MomentBlocks& blocks, const double* x, const double* y, std::size_t begin,
             std::size_t end, double sign, double x0, double inverseH, LocalSums& sums) {
  const std::size_t size = blocks.blockSize();
  std::size_t firstBlock = (begin + size - 1) / size;
  std::size_t lastBlock = std::min(end / size, blocks.blockCount());
  if (firstBlock >= lastBlock) {
    addPointsDirectly(x, y, begin, end, x0, inverseH, sums);
    return;
  }
  addPointsDirectly(x, y, begin, firstBlock * size, x0, inverseH, sums);
  addPointsDirectly(x, y, lastBlock * size, end, x0, inverseH, sums);
  double a[kPowers] = {}, b[kYPowers] = {};
  blocks.addBlocks(firstBlock, lastBlock, x0, inverseH, a, b);
  for (int k = 0; k < 5; ++k) {
    sums.s[k] += a[k] - 3.0 * sign * a[k + 3] + 3.0 * a[k + 6] - sign * a[k + 9];
  }
  for (int k = 0; k < 3; ++k) {
    sums.t[k] += b[k] - 3.0 * sign * b[k + 3] + 3.0 * b[k + 6] - sign * b[k + 9];
  }
}

// The fitted value at x0 from the local sums: the constant of the weighted quadratic in u.
double solveLocal(const LocalSums& sums, bool* singular) {
  Eigen::Matrix3d a;
  a << sums.s[0], sums.s[1], sums.s[2], sums.s[1], sums.s[2], sums.s[3], sums.s[2], sums.s[3],
      sums.s[4];
  const Eigen::Vector3d b(sums.t[0], sums.t[1], sums.t[2]);
  Eigen::LDLT<Eigen::Matrix3d> ldlt(a);
  const double scale = std::max(sums.s[0], 1e-300);
  if (ldlt.info() == Eigen::Success && ldlt.vectorD().cwiseAbs().minCoeff() > 1e-10 * scale) {
    return ldlt.solve(b)(0);
  }
  *singular = true;
  Eigen::CompleteOrthogonalDecomposition<Eigen::Matrix3d> cod(a);
  cod.setThreshold(1e-10);
  return cod.solve(b)(0);
}

// Block size balancing the per-block binomial work (~200 operations) against the direct sums
// over partly covered blocks (~4 blocks of ~15 operations per point).
std::size_t blockSizeFor(std::size_t q) {
  return std::max<std::size_t>(32,
                               static_cast<std::size_t>(std::sqrt(3.3 * static_cast<double>(q))));
}

}  // namespace

namespace {

// Fits at at[first, last): the window of the q nearest neighbours slides right as x0 grows.
void fitRange(const MomentBlocks& blocks, const std::vector<double>& x,
              const std::vector<double>& y, const std::vector<double>& at, std::size_t q,
              std::size_t first, std::size_t last, std::vector<double>& fitted, bool* singular,
              bool* degenerate) {
  const std::size_t n = x.size();
  std::size_t left = 0;  // window [left, left + q)
  for (std::size_t k = first; k < last; ++k) {
    const double x0 = at[k];
    while (left + q < n && x[left + q] - x0 < x0 - x[left]) ++left;
    const double h = std::max(x0 - x[left], x[left + q - 1] - x0);
    if (!(h > 0.0)) {
      *degenerate = true;
      return;
    }
    // Positive weight only strictly inside (x0 - h, x0 + h); split at x0.
    const auto windowBegin = x.begin() + static_cast<std::ptrdiff_t>(left);
    const auto windowEnd = windowBegin + static_cast<std::ptrdiff_t>(q);
    const auto position = [&x](auto it) { return static_cast<std::size_t>(it - x.begin()); };
    const std::size_t from = position(std::upper_bound(windowBegin, windowEnd, x0 - h));
    const std::size_t middle = position(std::lower_bound(windowBegin, windowEnd, x0));
    const std::size_t to = position(std::lower_bound(windowBegin, windowEnd, x0 + h));
    const double inverseH = 1.0 / h;
    LocalSums sums;
    addSide(blocks, x.data(), y.data(), from, middle, -1.0, x0, inverseH, sums);
    addSide(blocks, x.data(), y.data(), middle, to, 1.0, x0, inverseH, sums);
    fitted[k] = solveLocal(sums, singular);
  }
}

// Below this much work (fit points x neighbours) a second thread costs more than it saves.
constexpr double kParallelWork = 2e7;

}  // namespace

std::vector<double> loessFitAt(const std::vector<double>& x, const std::vector<double>& y,
                               const std::vector<double>& at, double span, bool* pseudoInverse) {
  const std::size_t n = x.size();
  const auto q = static_cast<std::size_t>(std::floor(span * static_cast<double>(n)));
  if (q < 1 || q > n) throw std::invalid_argument("loess: span gives no neighbours");
  const MomentBlocks blocks(x, y, blockSizeFor(q));
  std::vector<double> fitted(at.size());
  bool singular[2] = {false, false};
  bool degenerate[2] = {false, false};
  const bool parallel = std::thread::hardware_concurrency() > 1 && at.size() >= 16 &&
                        static_cast<double>(at.size()) * static_cast<double>(q) > kParallelWork;
  if (parallel) {
    const std::size_t half = at.size() / 2;
    std::thread second(fitRange, std::cref(blocks), std::cref(x), std::cref(y), std::cref(at), q,
                       half, at.size(), std::ref(fitted), &singular[1], &degenerate[1]);
    fitRange(blocks, x, y, at, q, 0, half, fitted, &singular[0], &degenerate[0]);
    second.join();
  } else {
    fitRange(blocks, x, y, at, q, 0, at.size(), fitted, &singular[0], &degenerate[0]);
  }
  if (degenerate[0] || degenerate[1]) {
    throw std::invalid_argument("loess: q nearest neighbours all at one value");
  }
  *pseudoInverse = *pseudoInverse || singular[0] || singular[1];
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
