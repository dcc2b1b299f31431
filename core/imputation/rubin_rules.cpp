#include "core/imputation/rubin_rules.h"

#include <algorithm>
#include <boost/math/distributions/students_t.hpp>
#include <cassert>
#include <cmath>

namespace calivera {

RubinPooled poolByRubin(const std::vector<double>& estimates, const std::vector<double>& variances,
                        double completeDataDf, double level) {
  assert(estimates.size() == variances.size() && estimates.size() >= 2);
  assert(completeDataDf > 0.0);
  const double m = static_cast<double>(estimates.size());
  RubinPooled pooled;
  for (std::size_t i = 0; i < estimates.size(); ++i) {
    pooled.estimate += estimates[i];
    pooled.withinVariance += variances[i];
  }
  pooled.estimate /= m;
  pooled.withinVariance /= m;
  double squares = 0.0;
  for (double q : estimates) squares += (q - pooled.estimate) * (q - pooled.estimate);
  pooled.betweenVariance = squares / (m - 1.0);
  pooled.totalVariance = pooled.withinVariance + (1.0 + 1.0 / m) * pooled.betweenVariance;
  pooled.relativeIncrease = pooled.withinVariance > 0.0
                                ? (1.0 + 1.0 / m) * pooled.betweenVariance / pooled.withinVariance
                                : 0.0;
  // Barnard & Rubin (1999), eqs. 3-4, with lambda floored as in mice.
  const double lambda = std::max(
      pooled.totalVariance > 0.0 ? (1.0 + 1.0 / m) * pooled.betweenVariance / pooled.totalVariance
                                 : 0.0,
      1e-4);
  const double dfOld = (m - 1.0) / (lambda * lambda);
  const double nu = completeDataDf;
  const double dfObserved = (nu + 1.0) / (nu + 3.0) * nu * (1.0 - lambda);
  pooled.completeDataDf = nu;
  pooled.df = dfOld * dfObserved / (dfOld + dfObserved);
  pooled.fractionMissingInformation =
      (pooled.relativeIncrease + 2.0 / (pooled.df + 3.0)) / (pooled.relativeIncrease + 1.0);
  const boost::math::students_t t(pooled.df);
  const double half = boost::math::quantile(t, 0.5 + level / 2.0) * std::sqrt(pooled.totalVariance);
  pooled.ci = {pooled.estimate - half, pooled.estimate + half};
  return pooled;
}

}  // namespace calivera
