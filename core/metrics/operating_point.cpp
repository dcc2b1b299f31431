#include "core/metrics/operating_point.h"

#include <limits>

#include "core/metrics/decision_curve.h"
#include "core/metrics/threshold_table.h"

namespace calivera {

bool netBenefitDefinedAt(double threshold) {
  return threshold > 0.0 && threshold < 1.0;
}

OperatingPoint operatingPointAt(double threshold, const ConfusionCounts& c) {
  constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
  OperatingPoint p;
  p.row = thresholdRowFromCounts(threshold, c.tp, c.fp, c.tn, c.fn);
  const std::size_t nonEvents = c.fp + c.tn;
  p.falsePositiveRate =
      nonEvents == 0 ? kNaN : static_cast<double>(c.fp) / static_cast<double>(nonEvents);
  const std::size_t n = c.tp + c.fp + c.tn + c.fn;
  if (n > 0 && netBenefitDefinedAt(threshold)) {
    p.decision = netBenefitAt(threshold, c.tp, c.fp, c.tn, c.fn);
  } else {
    p.decision = DecisionCurvePoint{threshold, kNaN, kNaN, kNaN, kNaN};
  }
  return p;
}

}  // namespace calivera
