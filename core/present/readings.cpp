#include "core/present/readings.h"

#include <cmath>
#include <cstdio>

#include "core/present/number_text.h"

namespace calivera {

namespace {

std::string format(const char* pattern, double a, double b = 0.0, double c = 0.0) {
  char buffer[256];
  std::snprintf(buffer, sizeof buffer, pattern, a, b, c);
  return buffer;
}

bool covers(const Interval& ci, double value) {
  return ci.lo <= value && value <= ci.hi;
}

}  // namespace

HierarchyReading readCalibrationHierarchy(const Calibration& c) {
  HierarchyReading r;
  r.meanMet = covers(c.interceptCi, 0.0);
  r.weakMet = r.meanMet && covers(c.slopeCi, 1.0);
  r.level = r.weakMet ? "weak" : (r.meanMet ? "mean" : "none");
  std::string text;
  if (r.meanMet) {
    text = format(
        "Mean calibration: reached. The calibration intercept %.2f (95%% CI %.2f to "
        "%.2f) is compatible with 0, so on average the predicted risks match the "
        "observed event rate. ",
        c.intercept, c.interceptCi.lo, c.interceptCi.hi);
  } else {
    text = format(
               "Mean calibration: not reached. The calibration intercept is %.2f (95%% CI %.2f "
               "to %.2f); ",
               c.intercept, c.interceptCi.lo, c.interceptCi.hi) +
           (c.intercept < 0 ? "the model predicts too high risks on average in this cohort. "
                            : "the model predicts too low risks on average in this cohort. ");
  }
  if (covers(c.slopeCi, 1.0)) {
    text += format("The calibration slope %.2f (95%% CI %.2f to %.2f) is compatible with 1",
                   c.slope, c.slopeCi.lo, c.slopeCi.hi) +
            (r.meanMet ? ", so weak calibration is reached. " : ". ");
  } else if (c.slope < 1.0) {
    text += format(
        "The calibration slope %.2f (95%% CI %.2f to %.2f) is below 1: predictions "
        "are too extreme (high risks too high, low risks too low), typical of an "
        "overfitted model. ",
        c.slope, c.slopeCi.lo, c.slopeCi.hi);
  } else {
    text += format(
        "The calibration slope %.2f (95%% CI %.2f to %.2f) is above 1: predictions "
        "are too modest (they vary less than the observed risks). ",
        c.slope, c.slopeCi.lo, c.slopeCi.hi);
  }
  text += format(
      "Moderate calibration is judged from the smoothed curve: on average it lies "
      "%.3f from the ideal line (ICI), at most %.3f for 90%% of patients (E90). "
      "Strong calibration (within every combination of predictors) is not assessable.",
      c.ici, c.e90);
  r.explanation = text;
  return r;
}

std::string readDiscrimination(const Discrimination& d) {
  // Numbers through the one formatter (core/present/number_text.h): an AUC without an interval
  // (one event) says so instead of printing "nan".
  std::string text = "AUC " + formatNumber(d.auc, 3);
  if (std::isfinite(d.aucCi.lo) && std::isfinite(d.aucCi.hi)) {
    text += " (95% CI " + formatRange(d.aucCi.lo, d.aucCi.hi, 3) + ")";
  }
  if (!std::isfinite(d.auc)) return text + ": not defined for this cohort.";
  return text +
         ": a randomly chosen patient with the event has a higher predicted risk than a randomly "
         "chosen patient without it in " +
         formatNumber(d.auc * 100.0, 0) + "% of such pairs (50% = no better than chance).";
}

std::string readHosmerLemeshow(const HosmerLemeshow& hl) {
  const std::string p = formatPValue(hl.pValue);
  return "Hosmer-Lemeshow statistic " + formatNumber(hl.statistic, 2) + " on " +
         std::to_string(hl.df) + " degrees of freedom, p " + (p.rfind("<", 0) == 0 ? p : "= " + p) +
         ". The test depends on the grouping, has no direction and rejects nearly every model "
         "in large cohorts; read the calibration curve, intercept and slope first.";
}

std::vector<std::string> readingWarnings(const CohortSummary& cohort) {
  // The sample-size shortfalls themselves are among the validation's own warnings
  // (core/metrics/size_warnings.h); this adds what only the reading needs.
  std::vector<std::string> out;
  if (cohort.apparent) {
    out.emplace_back(
        "These results are apparent performance on the model's own development data; they are "
        "optimistic and say little about performance in new patients.");
  }
  return out;
}

}  // namespace calivera
