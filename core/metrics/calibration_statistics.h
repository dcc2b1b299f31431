#pragma once
// Calibration summaries that need no model fit.
//
// O/E ratio = sum(y) / sum(p). Its 95% CI uses the Poisson approximation for the observed count,
// SE(ln O/E) = sqrt(1 / O), i.e. exp(ln(O/E) +/- z sqrt(1/O)) — common practice in validation
// studies and meta-analysis of O/E (Debray et al., BMJ 2017;356:i6460, who also give
// var(ln O/E) ~ 1/O; memory), treating the expected count as fixed. O = 0 gives O/E = 0 and no
// interval (NaN bounds).
//
// Spiegelhalter z (Stat Med 1986;5:421-33): z = sum (y - p)(1 - 2p) / sqrt(sum (1 - 2p)^2 p (1 -
// p)), standard normal under perfect calibration; two-sided p from the normal distribution
// (boost::math). Risks of exactly 0 or 1 add nothing to the variance; all risks equal to 0.5 (or
// 0/1) leave the variance 0 and z undefined (NaN).

#include <vector>

#include "core/metrics/validation.h"

namespace calivera {

struct ObservedExpected {
  double observed = 0.0;
  double expected = 0.0;
  double ratio = 0.0;
  Interval ci;
};

struct SpiegelhalterTest {
  double z = 0.0;
  double pValue = 0.0;
};

ObservedExpected observedExpected(const std::vector<double>& risk,
                                  const std::vector<double>& outcome, double z = 1.959963984540054);
SpiegelhalterTest spiegelhalter(const std::vector<double>& risk,
                                const std::vector<double>& outcome);

// Two-sided p-value of a standard normal statistic.
double twoSidedNormalP(double z);

}  // namespace calivera
