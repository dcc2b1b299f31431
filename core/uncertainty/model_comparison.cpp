#include "core/uncertainty/model_comparison.h"

#include <algorithm>
#include <boost/math/distributions/normal.hpp>
#include <cmath>
#include <limits>
#include <numeric>

#include "core/metrics/decision_curve.h"
#include "core/metrics/sorted_cohort.h"
#include "core/util/errors.h"

namespace calivera {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
constexpr double kZ975 = 1.959963984540054;

double sampleCovariance(const std::vector<double>& a, double meanA, const std::vector<double>& b,
                        double meanB) {
  if (a.size() < 2) return kNaN;
  double sum = 0.0;
  for (std::size_t i = 0; i < a.size(); ++i) sum += (a[i] - meanA) * (b[i] - meanB);
  return sum / static_cast<double>(a.size() - 1);
}

double twoSidedNormalP(double z) {
  const boost::math::normal standard;
  return 2.0 * boost::math::cdf(boost::math::complement(standard, std::fabs(z)));
}

double netBenefit(const SortedCohort& sorted, double threshold) {
  const ConfusionCounts c = sorted.countsAt(threshold);
  return netBenefitAt(threshold, c.tp, c.fp, c.tn, c.fn).netBenefit;
}

}  // namespace

std::vector<std::vector<double>> delongCovariance(const std::vector<DelongPlacements>& components) {
  const std::size_t k = components.size();
  std::vector<double> meanNonEvent(k);
  for (std::size_t r = 0; r < k; ++r) {
    const auto& v = components[r].v01;
    meanNonEvent[r] = std::accumulate(v.begin(), v.end(), 0.0) / static_cast<double>(v.size());
  }
  std::vector<std::vector<double>> covariance(k, std::vector<double>(k));
  for (std::size_t r = 0; r < k; ++r) {
    for (std::size_t s = r; s < k; ++s) {
      const auto& a = components[r];
      const auto& b = components[s];
      const double s10 = sampleCovariance(a.v10, a.auc, b.v10, b.auc);
      const double s01 = sampleCovariance(a.v01, meanNonEvent[r], b.v01, meanNonEvent[s]);
      covariance[r][s] = covariance[s][r] =
          s10 / static_cast<double>(a.v10.size()) + s01 / static_cast<double>(a.v01.size());
    }
  }
  return covariance;
}

PairedAucTest pairedDelongTest(const std::vector<DelongPlacements>& components,
                               const std::vector<std::vector<double>>& covariance,
                               std::size_t first, std::size_t second) {
  PairedAucTest test;
  test.first = first;
  test.second = second;
  test.aucFirst = components[first].auc;
  test.aucSecond = components[second].auc;
  test.difference = test.aucFirst - test.aucSecond;
  const double variance =
      covariance[first][first] + covariance[second][second] - 2.0 * covariance[first][second];
  test.se = std::sqrt(std::max(variance, 0.0));
  test.differenceCi = {test.difference - kZ975 * test.se, test.difference + kZ975 * test.se};
  test.correlation =
      covariance[first][second] / std::sqrt(covariance[first][first] * covariance[second][second]);
  if (test.se > 0.0) {
    test.z = test.difference / test.se;
    test.pValue = twoSidedNormalP(test.z);
  } else {
    test.z = kNaN;
    test.pValue = kNaN;
  }
  return test;
}

ModelComparison compareModels(const std::vector<std::string>& names,
                              const std::vector<std::vector<double>>& risks,
                              const std::vector<double>& outcome,
                              const ComparisonOptions& options) {
  if (risks.size() < 2 || names.size() != risks.size()) {
    throw InputError("a comparison needs at least two models, each with a name");
  }
  for (const auto& r : risks) {
    if (r.size() != outcome.size()) throw InputError("models were evaluated on different rows");
  }
  ModelComparison result;
  result.models = names;
  const auto events =
      std::count_if(outcome.begin(), outcome.end(), [](double y) { return y > 0.5; });
  if (events == 0 || events == static_cast<std::ptrdiff_t>(outcome.size())) {
    throw AnalysisError("a comparison needs both events and non-events");
  }
  std::vector<DelongPlacements> components;
  for (const auto& r : risks) components.push_back(delongPlacements(r, outcome));
  result.aucCovariance = delongCovariance(components);
  for (const auto& c : components) result.aucs.push_back(c.auc);

  const std::vector<double> thresholds =
      options.thresholds.empty() ? thresholdRange(0.01, 0.99, 0.01) : options.thresholds;
  std::vector<SortedCohort> indices;
  for (const auto& r : risks) indices.push_back(sortCohort(r, outcome));

  const std::size_t k = risks.size();
  for (std::size_t r = 0; r < k; ++r) {
    for (std::size_t s = r + 1; s < k; ++s) {
      ModelPairComparison pair;
      pair.auc = pairedDelongTest(components, result.aucCovariance, r, s);
      if (!(pair.auc.se > 0.0)) {
        result.warnings.push_back("models '" + names[r] + "' and '" + names[s] +
                                  "' rank the patients identically: no AUC test");
      }
      for (double t : thresholds) {
        NetBenefitDifferencePoint point;
        point.threshold = t;
        point.netBenefitFirst = netBenefit(indices[r], t);
        point.netBenefitSecond = netBenefit(indices[s], t);
        point.difference = point.netBenefitFirst - point.netBenefitSecond;
        point.ci = {kNaN, kNaN};
        pair.netBenefit.push_back(point);
      }
      result.pairs.push_back(std::move(pair));
    }
  }

  if (options.bootstrap.replicates <= 0) return result;

  // One statistic per (pair, threshold): the NB difference on the resample.
  const std::size_t perPair = thresholds.size();
  const auto statistic = [&](const std::vector<std::uint32_t>& sample) {
    std::vector<double> y(sample.size());
    for (std::size_t i = 0; i < sample.size(); ++i) y[i] = outcome[sample[i]];
    std::vector<SortedCohort> resampled;
    for (const auto& risk : risks) {
      std::vector<double> p(sample.size());
      for (std::size_t i = 0; i < sample.size(); ++i) p[i] = risk[sample[i]];
      resampled.push_back(sortCohort(p, y));
    }
    std::vector<double> values;
    values.reserve(result.pairs.size() * perPair);
    for (std::size_t r = 0; r < k; ++r) {
      for (std::size_t s = r + 1; s < k; ++s) {
        for (double t : thresholds) {
          values.push_back(netBenefit(resampled[r], t) - netBenefit(resampled[s], t));
        }
      }
    }
    return values;
  };
  const BootstrapRun run =
      runBootstrap(outcome.size(), result.pairs.size() * perPair, statistic, options.bootstrap);
  result.bootstrap = summarize(run, options.bootstrap);
  for (std::size_t p = 0; p < result.pairs.size(); ++p) {
    for (std::size_t t = 0; t < perPair; ++t) {
      const PercentileInterval ci = percentileInterval(run, p * perPair + t);
      result.pairs[p].netBenefit[t].ci = {ci.lo, ci.hi};
    }
  }
  return result;
}

}  // namespace calivera
