#pragma once
// Inverse-variance meta-analysis of k estimates y_i with known within-study variances v_i, as used
// to pool one performance measure across sites (Debray et al., BMJ 2017; Snell et al., Stat
// Methods Med Res 2018; Riley et al., BMJ 2016). All on the scale the caller pooled on.
//
//   Fixed effect:  w_i = 1/v_i, estimate sum(w y)/sum(w), SE 1/sqrt(sum w), Wald 95% CI.
//   Cochran's Q = sum w_i (y_i - fixed)^2 on k - 1 df.
//   tau^2: restricted maximum likelihood by Fisher scoring, truncated at 0 (Viechtbauer, J Educ
//     Behav Stat 2005), started from the DerSimonian-Laird estimate (Control Clin Trials 1986).
//   Random effects: w_i* = 1/(v_i + tau^2); estimate sum(w* y)/sum(w*); plain SE 1/sqrt(sum w*).
//   I^2 = tau^2 / (tau^2 + s^2) with the typical within-study variance
//     s^2 = (k - 1) sum w / ((sum w)^2 - sum w^2) (Higgins & Thompson, Stat Med 2002).
//   Confidence interval: Hartung-Knapp-Sidik-Jonkman (Hartung & Knapp, Stat Med 2001; Sidik &
//     Jonkman, Stat Med 2002): q = sum w_i* (y_i - estimate)^2 / (k - 1), SE_HK = sqrt(q / sum w*),
//     estimate +/- t(k-1, 0.975) SE_HK; reported with the ad hoc truncation q* = max(1, q) of
//     Knapp & Hartung (Stat Med 2003), discussed by Roever, Knapp & Friede (BMC Med Res Methodol
//     2015), so the interval is never narrower than the one with the plain SE and t on k - 1 df.
//     The untruncated interval is kept beside it.
//   95% prediction interval for a new site: estimate +/- t(k-2, 0.975) sqrt(tau^2 + SE^2) with the
//     plain SE (Riley, Higgins & Deeks, BMJ 2011; IntHout et al., BMJ Open 2016); k >= 3.

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "core/metrics/validation.h"

namespace calivera {

struct RandomEffectsOptions {
  int maxIterations = 1000;  // Fisher scoring steps for tau^2
  // Converged when a step changes tau^2 by less than this times max(1, tau^2).
  double tolerance = 1e-14;
  bool isValid() const { return maxIterations > 0 && tolerance > 0.0; }
};

struct RandomEffectsPool {
  std::size_t k = 0;
  // Fixed effect (common effect).
  double fixedEstimate = 0.0, fixedSe = 0.0;
  Interval fixedCi;
  double q = 0.0, qPValue = 0.0;  // Cochran's Q, k - 1 df
  // Random effects.
  double tau2 = 0.0;
  int iterations = 0;
  double estimate = 0.0;
  double se = 0.0;                             // plain: 1 / sqrt(sum w*)
  Interval ciWald;                             // estimate +/- 1.96 se
  double hksjScale = 0.0;                      // q of the HKSJ method, before truncation
  Interval ciHksj;                             // untruncated HKSJ, t on k - 1 df
  Interval ci;                                 // HKSJ with q* = max(1, q): the interval reported
  double i2 = 0.0;                             // proportion in [0, 1)
  std::optional<Interval> predictionInterval;  // k >= 3
};

struct RandomEffectsOutcome {
  std::optional<RandomEffectsPool> pool;  // absent: see problem
  std::string problem;                    // why there is no pool (fewer than 2 estimates, ...)
};

// `estimates` and `variances` pair up; every variance must be finite and > 0 and every estimate
// finite (asserted: the caller excludes the rest with a reason). Fewer than two estimates or a
// tau^2 iteration that does not converge gives a problem, never an exception.
RandomEffectsOutcome poolRandomEffects(const std::vector<double>& estimates,
                                       const std::vector<double>& variances,
                                       const RandomEffectsOptions& options = {});

}  // namespace calivera
