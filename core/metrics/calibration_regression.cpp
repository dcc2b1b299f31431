#include "core/metrics/calibration_regression.h"

#include <Eigen/Dense>
#include <cmath>
#include <future>
#include <string>
#include <vector>

#include "core/fit/logistic_fit.h"
#include "core/metrics/proportion_ci.h"
#include "core/util/parallel_size.h"

namespace calivera {
namespace {

// Newton-Raphson for the two recalibration models only (one or two parameters on the linear
// predictor): one pass over the patients per iteration, one exp per patient, so 10^6 patients
// cost milliseconds. Started at the perfect-calibration point (a = 0, b = 1), where Newton
// converges quadratically; a step that would raise the deviance is halved. Anything unusual
// (no convergence in kMaxIterations, non-finite values, e.g. under separation) returns false and
// the general fitter, fitLogistic, takes over with its separation and convergence diagnostics.
constexpr int kMaxIterations = 30;
constexpr double kStepTolerance = 1e-10;

struct SmallFit {
  Eigen::Vector2d beta{0.0, 1.0};  // (a, b); b fixed at 1 for the offset model
  Eigen::Matrix2d covariance = Eigen::Matrix2d::Zero();
};

struct Pass {
  Eigen::Vector2d score = Eigen::Vector2d::Zero();
  Eigen::Matrix2d information = Eigen::Matrix2d::Zero();
};

Pass evaluate(const std::vector<double>& lp, const std::vector<double>& y, double a, double b) {
  double s0 = 0, s1 = 0, i00 = 0, i01 = 0, i11 = 0;
  for (std::size_t i = 0; i < lp.size(); ++i) {
    const double mu = 1.0 / (1.0 + std::exp(-(a + b * lp[i])));
    const double r = y[i] - mu;
    const double w = mu * (1.0 - mu);
    s0 += r;
    s1 += r * lp[i];
    i00 += w;
    i01 += w * lp[i];
    i11 += w * lp[i] * lp[i];
  }
  Pass p;
  p.score << s0, s1;
  p.information << i00, i01, i01, i11;
  return p;
}

double deviance(const std::vector<double>& lp, const std::vector<double>& y, double a, double b) {
  double sum = 0.0;
  for (std::size_t i = 0; i < lp.size(); ++i) {
    const double eta = a + b * lp[i];
    // -log P(y | eta) = softplus(eta) - y eta, computed without overflow.
    const double softplus = std::max(eta, 0.0) + std::log1p(std::exp(-std::abs(eta)));
    sum += softplus - y[i] * eta;
  }
  return 2.0 * sum;
}

bool newtonFit(const std::vector<double>& lp, const std::vector<double>& y, bool withSlope,
               SmallFit& fit) {
  double a = 0.0, b = 1.0;
  for (int iteration = 0; iteration < kMaxIterations; ++iteration) {
    const Pass p = evaluate(lp, y, a, b);
    Eigen::Vector2d step(0.0, 0.0);
    if (withSlope) {
      const Eigen::LDLT<Eigen::Matrix2d> ldlt(p.information);
      if (ldlt.info() != Eigen::Success || !(ldlt.vectorD().minCoeff() > 0.0)) return false;
      step = ldlt.solve(p.score);
    } else {
      if (!(p.information(0, 0) > 0.0)) return false;
      step(0) = p.score(0) / p.information(0, 0);
    }
    if (!step.allFinite()) return false;
    // Large steps only happen far from the optimum; there the deviance guards against overshoot.
    if (step.cwiseAbs().maxCoeff() > 1.0) {
      const double current = deviance(lp, y, a, b);
      int halvings = 0;
      while (!(deviance(lp, y, a + step(0), b + step(1)) <= current) && halvings < 30) {
        step /= 2.0;
        ++halvings;
      }
      if (halvings == 30) return false;
    }
    a += step(0);
    b += step(1);
    if (step.cwiseAbs().maxCoeff() < kStepTolerance * (1.0 + std::max(std::abs(a), std::abs(b)))) {
      const Pass last = evaluate(lp, y, a, b);
      fit.beta << a, b;
      if (withSlope) {
        fit.covariance = last.information.inverse();
      } else {
        fit.covariance(0, 0) = 1.0 / last.information(0, 0);
      }
      return fit.covariance.allFinite();
    }
  }
  return false;
}

void noteProblems(const FitResult& fit, const std::string& what, std::vector<std::string>& out) {
  if (!fit.converged) out.push_back(what + ": the logistic fit did not converge");
  for (const std::string& w : fit.warnings) out.push_back(what + ": " + w);
}

// The general fitter, for the cases the small Newton iteration hands over.
SmallFit generalFit(const std::vector<double>& linearPredictor, const std::vector<double>& outcome,
                    bool withSlope, const std::string& what, std::vector<std::string>& warnings) {
  const auto n = static_cast<Eigen::Index>(linearPredictor.size());
  const Eigen::VectorXd lp = Eigen::Map<const Eigen::VectorXd>(linearPredictor.data(), n);
  const Eigen::VectorXd y = Eigen::Map<const Eigen::VectorXd>(outcome.data(), n);
  Eigen::MatrixXd design(n, withSlope ? 2 : 1);
  design.col(0).setOnes();
  if (withSlope) design.col(1) = lp;
  const FitResult result = fitLogistic(design, y, withSlope ? nullptr : &lp, FitOptions{});
  noteProblems(result, what, warnings);
  SmallFit fit;
  fit.beta(0) = result.beta(0);
  fit.covariance(0, 0) = result.se(0) * result.se(0);
  if (withSlope) {
    fit.beta(1) = result.beta(1);
    fit.covariance(1, 1) = result.se(1) * result.se(1);
  }
  return fit;
}

SmallFit recalibrationFit(const std::vector<double>& lp, const std::vector<double>& y,
                          bool withSlope, const std::string& what,
                          std::vector<std::string>& warnings) {
  SmallFit fit;
  if (newtonFit(lp, y, withSlope, fit)) return fit;
  return generalFit(lp, y, withSlope, what, warnings);
}

}  // namespace

CalibrationFit calibrationRegression(const std::vector<double>& linearPredictor,
                                     const std::vector<double>& outcome) {
  CalibrationFit c;
  // The two fits are independent: on a large cohort the slope model is fitted on a second
  // thread (issue 13). Its warnings are kept apart and appended after the first fit's, so the
  // result is the same as fitting one after the other.
  std::vector<std::string> slopeWarnings;
  const auto fitSlope = [&] {
    return recalibrationFit(linearPredictor, outcome, true, "calibration slope", slopeWarnings);
  };
  std::future<SmallFit> slopeJob;
  if (linearPredictor.size() >= kParallelFromPatients) {
    slopeJob = std::async(std::launch::async, fitSlope);
  }
  const SmallFit large =
      recalibrationFit(linearPredictor, outcome, false, "calibration-in-the-large", c.warnings);
  c.intercept = large.beta(0);
  c.interceptSe = std::sqrt(large.covariance(0, 0));
  c.interceptCi = {c.intercept - kZ95 * c.interceptSe, c.intercept + kZ95 * c.interceptSe};
  const SmallFit slope = slopeJob.valid() ? slopeJob.get() : fitSlope();
  c.warnings.insert(c.warnings.end(), slopeWarnings.begin(), slopeWarnings.end());
  c.slopeModelIntercept = slope.beta(0);
  c.slope = slope.beta(1);
  c.slopeSe = std::sqrt(slope.covariance(1, 1));
  c.slopeCi = {c.slope - kZ95 * c.slopeSe, c.slope + kZ95 * c.slopeSe};
  return c;
}

}  // namespace calivera
