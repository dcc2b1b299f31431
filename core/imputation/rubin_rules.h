#pragma once
// Rubin's rules for one scalar estimated in each of m imputed datasets (Rubin, Multiple
// Imputation for Nonresponse in Surveys, Wiley 1987, ch. 3): the pooled estimate is the mean,
// the total variance T = W + (1 + 1/m) B with W the mean within-imputation variance and B the
// between-imputation variance (m - 1 denominator). The interval uses Student's t with the
// Barnard-Rubin degrees of freedom (Barnard & Rubin, Biometrika 1999;86:948-955) for
// complete-data degrees of freedom nu_com; the fraction of missing information is
// (r + 2 / (df + 3)) / (r + 1) with r = (1 + 1/m) B / W (Rubin 1987, eq. 3.1.10).
// As mice 3.15's pool.scalar (van Buuren, Flexible Imputation of Missing Data, 2nd ed., 2018,
// sec. 2.3), lambda = (1 + 1/m) B / T is floored at 1e-4 in the degrees of freedom, so that
// B = 0 (identical imputations) gives a large finite df instead of an infinite one.

#include <string>
#include <vector>

#include "core/metrics/validation.h"

namespace calivera {

struct RubinPooled {
  double estimate = 0.0;  // on the pooling scale
  double withinVariance = 0.0;
  double betweenVariance = 0.0;
  double totalVariance = 0.0;
  double relativeIncrease = 0.0;  // r
  double fractionMissingInformation = 0.0;
  double df = 0.0;  // Barnard-Rubin
  double completeDataDf = 0.0;
  Interval ci;  // 95%, on the pooling scale
};

// `estimates` and `variances` (within-imputation, squared standard errors) of one measure, one
// per imputation, m >= 2, all finite, variances >= 0; completeDataDf > 0.
RubinPooled poolByRubin(const std::vector<double>& estimates, const std::vector<double>& variances,
                        double completeDataDf, double level = 0.95);

}  // namespace calivera
