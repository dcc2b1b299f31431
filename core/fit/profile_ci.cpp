#include "core/fit/profile_ci.h"

#include <cmath>
#include <limits>

#include "core/util/errors.h"

namespace calivera {
namespace {

constexpr double kChiSquare95 = 3.841458820694124;  // chi-square(1) 0.95 quantile
constexpr double kMaxSteps = 50.0;                  // search no further than 50 SE out
constexpr double kBisectionTolerance = 1e-6;        // in units of the coefficient's SE

// Deviance of the fit with column j fixed at b; NaN when the constrained fit fails.
class ProfileDeviance {
 public:
  ProfileDeviance(const Eigen::MatrixXd& X, const Eigen::VectorXd& y, Eigen::Index j,
                  const FitOptions& options)
      : y_(y), xj_(X.col(j)), options_(options) {
    others_.resize(X.rows(), X.cols() - 1);
    Eigen::Index k = 0;
    for (Eigen::Index c = 0; c < X.cols(); ++c) {
      if (c != j) others_.col(k++) = X.col(c);
    }
    options_.progress = nullptr;
  }

  double operator()(double b, int& fits) const {
    ++fits;
    const Eigen::VectorXd offset = b * xj_;
    if (others_.cols() == 0) {
      // Only this coefficient: the deviance at b needs no fit.
      double deviance = 0.0;
      for (Eigen::Index i = 0; i < y_.size(); ++i) {
        const double p = 1.0 / (1.0 + std::exp(-offset[i]));
        deviance -= 2.0 * (y_[i] > 0.5 ? std::log(p) : std::log1p(-p));
      }
      return deviance;
    }
    const FitResult r = fitLogistic(others_, y_, &offset, options_);
    if (!r.converged) return std::numeric_limits<double>::quiet_NaN();
    return r.deviance;
  }

 private:
  Eigen::MatrixXd others_;
  const Eigen::VectorXd& y_;
  Eigen::VectorXd xj_;
  FitOptions options_;
};

// The bound on one side (direction -1 or +1): where the profile deviance crosses `target`.
double findBound(const ProfileDeviance& deviance, double estimate, double se, double target,
                 int direction, int& fits, bool& failed) {
  double inside = estimate;
  double step = se;
  double outside = estimate + direction * step;
  while (true) {
    const double d = deviance(outside, fits);
    if (std::isnan(d)) {
      failed = true;
      return std::numeric_limits<double>::quiet_NaN();
    }
    if (d > target) break;
    inside = outside;
    step *= 2.0;
    if (step > kMaxSteps * se) return direction * std::numeric_limits<double>::infinity();
    outside = estimate + direction * step;
  }
  while (std::fabs(outside - inside) > kBisectionTolerance * se) {
    const double middle = 0.5 * (inside + outside);
    const double d = deviance(middle, fits);
    if (std::isnan(d)) {
      failed = true;
      return std::numeric_limits<double>::quiet_NaN();
    }
    (d > target ? outside : inside) = middle;
  }
  return 0.5 * (inside + outside);
}

}  // namespace

ProfileIntervals profileLikelihoodIntervals(const Eigen::MatrixXd& X, const Eigen::VectorXd& y,
                                            const FitResult& fit, const FitOptions& options) {
  if (options.firth) {
    throw AnalysisError("profile-likelihood intervals are not defined here for Firth fits");
  }
  ProfileIntervals out;
  const double target = fit.deviance + kChiSquare95;
  for (Eigen::Index j = 0; j < X.cols(); ++j) {
    const ProfileDeviance deviance(X, y, j, options);
    const double estimate = fit.beta[j];
    const double se = fit.se[j] > 0.0 && std::isfinite(fit.se[j]) ? fit.se[j] : 1.0;
    ProfileBounds bounds;
    bool failed = false;
    bounds.lo = findBound(deviance, estimate, se, target, -1, out.constrainedFits, failed);
    bounds.hi = findBound(deviance, estimate, se, target, +1, out.constrainedFits, failed);
    if (failed) {
      out.warnings.push_back("column " + std::to_string(j) +
                             ": a constrained fit did not converge; its profile bound is missing");
    } else if (std::isinf(bounds.lo) || std::isinf(bounds.hi)) {
      out.warnings.push_back("column " + std::to_string(j) +
                             ": the profile likelihood flattens (no bound within 50 SE), as under "
                             "separation");
    }
    out.ci.push_back(bounds);
  }
  return out;
}

}  // namespace calivera
