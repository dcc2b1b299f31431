#pragma once
// AUC (c-statistic) with its DeLong standard error.
//
// AUC = P(risk of an event > risk of a non-event) + 1/2 P(tie) (Mann-Whitney). DeLong, DeLong &
// Clarke-Pearson (Biometrics 1988;44:837-45) write it through placement values: for event i,
// V10_i = (#non-events below + 1/2 #tied) / n0; for non-event j, V01_j = (#events above +
// 1/2 #tied) / n1. AUC = mean V10 = mean V01 and Var(AUC) = S10/n1 + S01/n0 with S10, S01 the
// sample variances (denominator n - 1) of the placement values. Sun & Xu (IEEE Signal Process
// Lett 2014;21:1389-93) obtain the placement values from midranks in O(n log n):
// V10_i = (Tz_i - Tx_i)/n0 with Tz the midrank in the pooled sample and Tx within the events.
// Here the same midranks are read off one pass over the risk-sorted cohort: within a block of
// tied risks the pooled and within-class midranks differ by the other class's count below plus
// half its count in the block.
//
// Confidence interval on the logit scale: logit(A) +/- z SE / (A (1 - A)), back-transformed, so it
// never passes 0 or 1; the plain A +/- z SE is also given.
//
// Edge cases: one class empty -> std::invalid_argument (validate() reports it as an AnalysisError
// first). A single event (or non-event) makes its variance term undefined; it is taken as 0 and
// `varianceIncomplete` is set. AUC of exactly 0 or 1 has SE 0 and a degenerate interval.

#include <cstddef>
#include <vector>

#include "core/metrics/sorted_cohort.h"
#include "core/metrics/validation.h"

namespace calivera {

// DeLong's structural components (placement values) per patient, in input order, so a paired
// comparison of models on the same patients (core/uncertainty/model_comparison.h) can form the
// covariance S12 from them without re-deriving the midrank algorithm.
struct DelongPlacements {
  double auc = 0.0;
  std::vector<double> v10;  // one per event, in the order events occur in the input
  std::vector<double> v01;  // one per non-event, in input order
  double s10 = 0.0;         // sample variance of v10
  double s01 = 0.0;         // sample variance of v01
  double variance = 0.0;    // s10 / n1 + s01 / n0
  bool varianceIncomplete = false;
};

struct AucEstimate {
  double auc = 0.0;
  double se = 0.0;
  Interval ciLogit;
  Interval ciPlain;
  bool varianceIncomplete = false;
};

DelongPlacements delongPlacements(const std::vector<double>& risk,
                                  const std::vector<double>& outcome);
DelongPlacements delongPlacements(const SortedCohort& sorted);

// AUC, DeLong SE and both 95% intervals without storing per-patient components.
AucEstimate aucWithDelong(const SortedCohort& sorted, double z = 1.959963984540054);

// Both intervals for a given AUC and SE.
Interval aucLogitInterval(double auc, double se, double z);
Interval aucPlainInterval(double auc, double se, double z);

}  // namespace calivera
