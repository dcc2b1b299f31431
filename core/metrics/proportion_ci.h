#pragma once
// Confidence intervals for a binomial proportion k/n.
//
// Wilson score interval (Wilson, JASA 1927;22:209-12): the default everywhere in Calivera
// (observed proportions per calibration group, sensitivity/specificity/PPV/NPV), because it keeps
// close to nominal coverage for small n and for proportions near 0 or 1 and never leaves [0, 1].
// Clopper-Pearson "exact" interval (Biometrika 1934;26:404-13) from beta quantiles, conservative.
// Both compared by Newcombe, Stat Med 1998;17:857-72.
//
// Edge cases: n = 0 gives the uninformative interval [0, 1]; k = 0 gives lo = 0 and k = n gives
// hi = 1 exactly.

#include <cstddef>

#include "core/metrics/validation.h"

namespace calivera {

inline constexpr double kZ95 = 1.959963984540054;  // standard normal 97.5% quantile

Interval wilsonInterval(std::size_t k, std::size_t n, double z = kZ95);
Interval clopperPearsonInterval(std::size_t k, std::size_t n, double level = 0.95);

}  // namespace calivera
