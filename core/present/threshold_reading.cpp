#include "core/present/threshold_reading.h"

#include <cmath>
#include <cstdio>

namespace calivera {
namespace {

std::string fixedText(double value, int decimals) {
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.*f", decimals, value);
  return buffer;
}

std::string percent(double proportion) {
  return fixedText(100.0 * proportion, 1) + "%";
}

}  // namespace

std::string calibrationAtThresholdText(const ThresholdSnapshot& s, const Calibration& c) {
  if (s.n == 0) return {};
  std::string text;
  const std::string oe = "observed/expected events " + fixedText(c.oeRatio, 2) + ", 95% CI " +
                         fixedText(c.oeCi.lo, 2) + " to " + fixedText(c.oeCi.hi, 2);
  if (!std::isfinite(c.oeRatio) || !std::isfinite(c.oeCi.lo) || !std::isfinite(c.oeCi.hi)) {
    text = "Calibration on this cohort could not be estimated.";
  } else if (c.oeCi.hi < 1.0) {
    text = "On this cohort the model's risks run high: fewer events occurred than it predicted (" +
           oe + "). A predicted " + percent(s.threshold) + " is not an observed " +
           percent(s.threshold) + " here.";
  } else if (c.oeCi.lo > 1.0) {
    text = "On this cohort the model's risks run low: more events occurred than it predicted (" +
           oe + "). A predicted " + percent(s.threshold) + " is not an observed " +
           percent(s.threshold) + " here.";
  } else {
    text = "On average, predicted and observed risks agree on this cohort (" + oe + ").";
  }
  const std::size_t flagged = s.counts.tp + s.counts.fp;
  if (flagged > 0 && std::isfinite(s.meanRiskFlagged)) {
    text += " Among the " + std::to_string(flagged) + " flagged patients the model predicts " +
            percent(s.meanRiskFlagged) + " on average; " + percent(s.ppv) + " had the event.";
  } else {
    text += " Nobody is flagged at this threshold.";
  }
  return text;
}

}  // namespace calivera
