#include "core/metrics/decision_curve.h"

#include <limits>
#include <stdexcept>

namespace calivera {

DecisionCurvePoint netBenefitAt(double threshold, std::size_t tp, std::size_t fp, std::size_t tn,
                                std::size_t fn) {
  if (!(threshold > 0.0 && threshold < 1.0)) {
    throw std::invalid_argument("decision-curve threshold must lie strictly between 0 and 1");
  }
  const double n = static_cast<double>(tp + fp + tn + fn);
  const double odds = threshold / (1.0 - threshold);
  const double prevalence = static_cast<double>(tp + fn) / n;
  DecisionCurvePoint p;
  p.threshold = threshold;
  p.netBenefit = static_cast<double>(tp) / n - static_cast<double>(fp) / n * odds;
  p.netBenefitTreatAll = prevalence - (1.0 - prevalence) * odds;
  p.standardizedNetBenefit =
      prevalence > 0.0 ? p.netBenefit / prevalence : std::numeric_limits<double>::quiet_NaN();
  p.interventionsAvoidedPer100 = (p.netBenefit - p.netBenefitTreatAll) / odds * 100.0;
  return p;
}

std::vector<DecisionCurvePoint> decisionCurve(const SortedCohort& sorted,
                                              const std::vector<double>& thresholds) {
  std::vector<DecisionCurvePoint> curve;
  curve.reserve(thresholds.size());
  for (const double t : thresholds) {
    const ConfusionCounts c = sorted.countsAt(t);
    curve.push_back(netBenefitAt(t, c.tp, c.fp, c.tn, c.fn));
  }
  return curve;
}

}  // namespace calivera
