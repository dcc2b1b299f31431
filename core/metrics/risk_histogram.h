#pragma once
// Distribution of predicted risk by outcome: `bins` equal-width bins over [0, 1], bin k covering
// [k/bins, (k+1)/bins) and the last bin closed at 1, with event and non-event counts per bin.

#include <vector>

#include "core/metrics/validation.h"

namespace calivera {

RiskHistogram riskHistogram(const std::vector<double>& risk, const std::vector<double>& outcome,
                            int bins);

}  // namespace calivera
