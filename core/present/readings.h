#pragma once
// Plain-language readings of the validation results for the summary panel (and the report), as
// plain C++ so they can be tested without widgets. Each reading states what a number means on this
// cohort and where the yardstick comes from.
//
// Calibration hierarchy (Van Calster et al., J Clin Epidemiol 2016;74:167-76):
//   mean     - calibration-in-the-large: the average predicted risk matches the event rate
//              (intercept with the linear predictor as offset, target 0);
//   weak     - additionally the calibration slope is 1 (predictions neither too extreme nor too
//              modest) - judged here by the 95% CIs covering 0 and 1;
//   moderate - the observed proportion matches the predicted risk across the range (the smoothed
//              calibration curve follows the diagonal) - judged from the curve, no formal test;
//   strong   - calibration within every covariate pattern; the authors call it utopic, it is not
//              assessed.
// Sample-size yardsticks for external validation: at least 100 events and 100 non-events
// (Vergouwe et al., J Clin Epidemiol 2005 - from memory), 200 events preferred (Collins, Ogundimu
// & Altman, Stat Med 2016 - from memory).

#include <string>
#include <vector>

#include "core/metrics/validation.h"

namespace calivera {

struct HierarchyReading {
  bool meanMet = false;
  bool weakMet = false;
  std::string level;        // "none", "mean", "weak": the highest level the CIs support
  std::string explanation;  // one paragraph in plain words
};

HierarchyReading readCalibrationHierarchy(const Calibration& calibration);
std::string readDiscrimination(const Discrimination& discrimination);
std::string readHosmerLemeshow(const HosmerLemeshow& hl);
// What the summary adds to the validation's own warnings (which hold the sample-size warnings,
// core/metrics/size_warnings.h): the note that apparent performance is optimistic.
std::vector<std::string> readingWarnings(const CohortSummary& cohort);

}  // namespace calivera
