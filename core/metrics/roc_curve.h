#pragma once
// Empirical ROC curve: one point per distinct risk (flag risk >= that risk), from (0, 0) (nobody
// flagged; threshold +infinity) to (1, 1). Thinning for plotting first drops points that lie on
// the straight line between their neighbours (no change to the area) and then, if still too
// many, keeps points evenly spaced along the curve's length plus both ends. The AUC is always
// computed from the full data (auc_delong.h), never from the thinned curve.

#include <cstddef>
#include <vector>

#include "core/metrics/sorted_cohort.h"
#include "core/metrics/validation.h"

namespace calivera {

std::vector<RocPoint> rocCurve(const SortedCohort& sorted);
std::vector<RocPoint> thinRocCurve(const std::vector<RocPoint>& curve, std::size_t maxPoints);

// Trapezoidal area under a curve of (fpr, tpr) points; equals the Mann-Whitney AUC on the full
// curve.
double areaUnderCurve(const std::vector<RocPoint>& curve);

}  // namespace calivera
