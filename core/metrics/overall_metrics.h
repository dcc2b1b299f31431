#pragma once
// Overall accuracy and a simple discrimination summary.
//
// Brier score (Brier, Mon Weather Rev 1950): mean (y - p)^2. Scaled Brier = 1 - Brier / Brier_max
// with Brier_max = pi (1 - pi), the score of predicting the observed prevalence pi to everyone
// (Steyerberg et al., Epidemiology 2010;21:128-38). Undefined (NaN) when pi is 0 or 1.
// Discrimination slope (Yates 1982; Steyerberg et al. 2010): mean risk among events minus mean
// risk among non-events; NaN when a class is empty.

#include <vector>

#include "core/metrics/validation.h"

namespace calivera {

Overall brierScores(const std::vector<double>& risk, const std::vector<double>& outcome);
double discriminationSlope(const std::vector<double>& risk, const std::vector<double>& outcome);

}  // namespace calivera
