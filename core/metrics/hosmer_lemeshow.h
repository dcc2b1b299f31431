#pragma once
// Hosmer-Lemeshow goodness-of-fit test by groups of predicted risk (Hosmer & Lemeshow, Commun
// Stat A 1980;9:1043-69), also the grouped calibration table.
//
// Grouping ("deciles of risk" for g = 10): cut points are the type-7 sample quantiles of the risks
// at k/g, k = 0..g; duplicate cut points are merged; intervals are right-closed with the lowest
// included: group 1 = [c0, c1], group k = (c_{k-1}, c_k]. Patients with the same risk therefore
// always fall in the same group (as Hosmer & Lemeshow require for tied covariate patterns), and
// with heavy ties fewer than g groups result. The statistic and its degrees of freedom use the
// number of groups actually formed, g*:
//   C = sum_k (O_k - E_k)^2 / (E_k (1 - E_k / n_k)),  E_k = sum of risks in group k,
//   df = g* - 2 on the development data (apparent), g* for a fixed model on new data (Hosmer,
//   Lemeshow & Sturdivant, Applied Logistic Regression 3rd ed. 2013 — memory).
// p = upper tail of chi-square(df) (boost::math). The statistic is NaN when a group has E_k = 0 or
// E_k = n_k (all risks 0 or all 1 in the group), and the p-value is NaN when df < 1; both come with
// a warning.

#include <string>
#include <vector>

#include "core/metrics/sorted_cohort.h"
#include "core/metrics/validation.h"

namespace calivera {

// Quantile groups of the sorted cohort with observed/expected counts and Wilson CIs.
std::vector<CalibrationGroup> riskGroups(const SortedCohort& sorted, int groups);

HosmerLemeshow hosmerLemeshow(const SortedCohort& sorted, int groups, bool apparent,
                              std::vector<std::string>& warnings);

}  // namespace calivera
