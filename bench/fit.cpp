// Times fitLogistic on simulated N x 20 designs (intercept + 19 standard-normal columns, true
// coefficients +-0.1..0.3) held in memory, and the calibration paths (offset-only intercept,
// slope on the LP) at N = 1e6. Prints seconds, an estimate of GFLOP/s for the X'WX updates
// (N p^2 per iteration for the symmetric rank-k update), iterations and the peak RSS.
#include <sys/resource.h>

#include <chrono>
#include <cmath>
#include <cstdio>
#include <random>
#include <thread>

#include "core/fit/logistic_fit.h"

namespace {

double peakRssMegabytes() {
  rusage usage{};
  getrusage(RUSAGE_SELF, &usage);
  return static_cast<double>(usage.ru_maxrss) / 1024.0;  // Linux reports kilobytes
}

struct Simulated {
  Eigen::MatrixXd X;
  Eigen::VectorXd y;
  Eigen::VectorXd lp;
};

Simulated simulate(Eigen::Index n, Eigen::Index p) {
  std::mt19937_64 random(20261201);
  std::normal_distribution<double> normal;
  std::uniform_real_distribution<double> uniform;
  Simulated s{Eigen::MatrixXd(n, p), Eigen::VectorXd(n), Eigen::VectorXd(n)};
  Eigen::VectorXd beta(p);
  beta[0] = -1.5;
  for (Eigen::Index j = 1; j < p; ++j) beta[j] = (j % 2 ? 1 : -1) * (0.1 + 0.2 * j / p);
  for (Eigen::Index i = 0; i < n; ++i) {
    s.X(i, 0) = 1.0;
    for (Eigen::Index j = 1; j < p; ++j) s.X(i, j) = normal(random);
  }
  s.lp = s.X * beta;
  for (Eigen::Index i = 0; i < n; ++i) {
    s.y[i] = uniform(random) < 1.0 / (1.0 + std::exp(-s.lp[i])) ? 1.0 : 0.0;
  }
  return s;
}

template <typename Fit>
void timeIt(const char* label, Eigen::Index n, Eigen::Index p, unsigned threads, Fit&& fit) {
  const auto start = std::chrono::steady_clock::now();
  const calivera::FitResult result = fit(threads);
  const double seconds =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  // Passes = iterations + the starting evaluation; each does N p^2 flops in the rank-k update.
  const double flops = static_cast<double>(result.iterations + 1) * static_cast<double>(n) *
                       static_cast<double>(p * p);
  std::printf("%-22s N=%8lld p=%2lld threads=%u  %.3f s  %5.1f GFLOP/s  iterations=%d  %s\n", label,
              static_cast<long long>(n), static_cast<long long>(p), threads, seconds,
              flops / seconds / 1e9, result.iterations,
              result.converged ? "converged" : "NOT converged");
}

}  // namespace

int main() {
  const unsigned hardware = std::max(1u, std::thread::hardware_concurrency());
  for (const Eigen::Index n : {Eigen::Index{100000}, Eigen::Index{1000000}}) {
    const Simulated s = simulate(n, 20);
    for (const unsigned threads : {1u, std::min(2u, hardware)}) {
      timeIt("maximum likelihood", n, 20, threads, [&](unsigned t) {
        calivera::FitOptions options;
        options.threads = t;
        return calivera::fitLogistic(s.X, s.y, nullptr, options);
      });
    }
    if (n == 1000000) {
      timeIt("Firth", n, 20, std::min(2u, hardware), [&](unsigned t) {
        calivera::FitOptions options;
        options.threads = t;
        options.firth = true;
        return calivera::fitLogistic(s.X, s.y, nullptr, options);
      });
      const Eigen::MatrixXd ones = Eigen::MatrixXd::Ones(n, 1);
      Eigen::MatrixXd slopeDesign(n, 2);
      slopeDesign << ones, s.lp;
      timeIt("calibration intercept", n, 1, std::min(2u, hardware), [&](unsigned t) {
        calivera::FitOptions options;
        options.threads = t;
        return calivera::fitLogistic(ones, s.y, &s.lp, options);
      });
      timeIt("calibration slope", n, 2, std::min(2u, hardware), [&](unsigned t) {
        calivera::FitOptions options;
        options.threads = t;
        return calivera::fitLogistic(slopeDesign, s.y, nullptr, options);
      });
    }
  }
  std::printf("peak RSS %.0f MB\n", peakRssMegabytes());
  return 0;
}
