#pragma once
// Profile-likelihood 95% confidence intervals for the coefficients of a maximum-likelihood
// logistic fit (Venzon & Moolgavkar, Appl Stat 1988): the interval for beta_j holds the values b
// at which the deviance of the fit with beta_j fixed at b (the other coefficients re-estimated,
// b * x_j as an offset) exceeds the minimum deviance by at most the chi-square(1) 95% quantile,
// 3.841. Unlike the Wald interval it follows the likelihood's own shape, which matters for small
// samples, rare events and large coefficients.
//
// Each bound is found by bracketing and bisection on the profile deviance to 1e-6 of the
// coefficient's SE. Cost: about 2 x 25 constrained fits per coefficient, so meant for the fit
// table of moderate cohorts, not for every bootstrap replicate.
//
// Edge cases: a bound the profile never reaches within 50 SE (the likelihood flattens, as under
// quasi-separation) is +/- infinity and reported in `warnings`; a constrained fit that fails to
// converge leaves that bound NaN with a warning. Not defined for Firth fits (penalized profiles
// are a different method): the caller uses Wald intervals there.

#include <Eigen/Dense>
#include <string>
#include <vector>

#include "core/fit/logistic_fit.h"

namespace calivera {

struct ProfileBounds {
  double lo = 0.0;
  double hi = 0.0;
};

struct ProfileIntervals {
  std::vector<ProfileBounds> ci;  // one per column of X
  std::vector<std::string> warnings;
  int constrainedFits = 0;
};

// `fit` is fitLogistic(X, y, nullptr, options) without Firth, converged.
ProfileIntervals profileLikelihoodIntervals(const Eigen::MatrixXd& X, const Eigen::VectorXd& y,
                                            const FitResult& fit, const FitOptions& options);

}  // namespace calivera
