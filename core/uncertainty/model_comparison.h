#pragma once
// Comparing two or more models on the same patients.
//
// AUC: DeLong, DeLong & Clarke-Pearson, Biometrics 1988;44:837-45. For model r the placement
// values of event i and non-event j are V10_r(i) = P(score of i > score of a non-event) and
// V01_r(j) = P(score of an event > score of j), ties counted one half; AUC_r = mean V10_r. The
// covariance of the AUCs is S = S10/m + S01/n with S10, S01 the sample covariances (divisor m-1,
// n-1) of the placement values over the m events and n non-events. The paired test of models r, s
// is z = (A_r - A_s) / sqrt(S_rr + S_ss - 2 S_rs), two-sided normal p. The placement values come
// from midranks in O(n log n) (Sun & Xu, IEEE Signal Process Lett 2014;21:1389-93).
//
// Net benefit (Vickers & Elkin, Med Decis Making 2006): NB(t) = TP/n - FP/n * t/(1-t), flag risk
// >= t. The difference between two models at each threshold gets a percentile bootstrap interval
// from resampling patients (both models on the same resample, so the pairing is kept).
//
// Edge cases: one outcome class -> AnalysisError; identical scores -> difference 0 with variance 0,
// reported with z and p as NaN and a warning; fewer than 2 events or non-events -> covariance NaN.

#include <cstddef>
#include <string>
#include <vector>

#include "core/metrics/auc_delong.h"
#include "core/metrics/validation.h"
#include "core/uncertainty/bootstrap.h"

namespace calivera {

// Covariance matrix (row-major, k x k) of the AUCs of k scores on the same patients, from the
// placement values of core/metrics/auc_delong.h (each from delongPlacements on the same rows).
std::vector<std::vector<double>> delongCovariance(const std::vector<DelongPlacements>& components);

struct PairedAucTest {
  std::size_t first = 0, second = 0;  // indices of the models compared
  double aucFirst = 0.0, aucSecond = 0.0;
  double difference = 0.0;  // aucFirst - aucSecond
  double se = 0.0;          // sqrt(S11 + S22 - 2 S12)
  Interval differenceCi;    // difference +/- 1.96 se
  double z = 0.0;
  double pValue = 1.0;       // two-sided
  double correlation = 0.0;  // S12 / sqrt(S11 S22)
};

PairedAucTest pairedDelongTest(const std::vector<DelongPlacements>& components,
                               const std::vector<std::vector<double>>& covariance,
                               std::size_t first, std::size_t second);

struct NetBenefitDifferencePoint {
  double threshold = 0.0;
  double netBenefitFirst = 0.0, netBenefitSecond = 0.0;
  double difference = 0.0;  // first - second
  Interval ci;              // bootstrap percentile 95%; lo = hi = NaN without bootstrap
};

struct ModelPairComparison {
  PairedAucTest auc;
  std::vector<NetBenefitDifferencePoint> netBenefit;
};

struct ModelComparison {
  std::vector<std::string> models;  // names in input order
  std::vector<double> aucs;
  std::vector<std::vector<double>> aucCovariance;
  std::vector<ModelPairComparison> pairs;  // every pair (r < s)
  BootstrapSummary bootstrap;              // replicates 0: no net-benefit intervals
  std::vector<std::string> warnings;
};

struct ComparisonOptions {
  std::vector<double> thresholds;  // net-benefit thresholds; empty: 0.01..0.99 by 0.01
  BootstrapOptions bootstrap;      // replicates 0: no intervals for the net-benefit difference
};

// risks[r][i]: risk of patient i under model r. Throws InputError when sizes differ or fewer than
// two models are given, AnalysisError for one outcome class.
ModelComparison compareModels(const std::vector<std::string>& names,
                              const std::vector<std::vector<double>>& risks,
                              const std::vector<double>& outcome, const ComparisonOptions& options);

}  // namespace calivera
