#pragma once
// Decision curve analysis (Vickers & Elkin, Med Decis Making 2006;26:565-74). A patient is
// flagged (treated) when risk >= t. At threshold t with odds w = t / (1 - t):
//   NB_model = TP/n - FP/n * w,   NB_treat_all = pi - (1 - pi) * w,   NB_treat_none = 0,
//   standardized NB = NB_model / pi (Kerr et al., J Clin Oncol 2016;34:2534-40),
//   interventions avoided per 100 = (NB_model - NB_treat_all) / w * 100.
// Thresholds must lie strictly between 0 and 1 (w is 0 or infinite otherwise).

#include <cstddef>
#include <vector>

#include "core/metrics/sorted_cohort.h"
#include "core/metrics/validation.h"

namespace calivera {

// From confusion counts at threshold t (n = tp + fp + tn + fn).
DecisionCurvePoint netBenefitAt(double threshold, std::size_t tp, std::size_t fp, std::size_t tn,
                                std::size_t fn);

std::vector<DecisionCurvePoint> decisionCurve(const SortedCohort& sorted,
                                              const std::vector<double>& thresholds);

}  // namespace calivera
