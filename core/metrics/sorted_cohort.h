#pragma once
// The cohort sorted once by predicted risk, shared by every rank- and threshold-based metric
// (AUC, ROC, Hosmer-Lemeshow groups, threshold table, decision curve, loess), so a validation of
// n patients costs one O(n log n) sort.

#include <cstddef>
#include <cstdint>
#include <vector>

#include "core/metrics/threshold_index.h"

namespace calivera {

struct SortedCohort {
  std::vector<double> risk;                  // ascending
  std::vector<std::uint8_t> event;           // outcome in the same order, 0 or 1
  std::vector<std::uint32_t> order;          // order[i]: input index of the i-th smallest risk
  std::vector<std::size_t> eventsAtOrAbove;  // size n + 1: events among positions i..n-1
  std::size_t events = 0;

  std::size_t size() const { return risk.size(); }
  std::size_t nonEvents() const { return risk.size() - events; }
  // First position whose risk is >= threshold (flag risk >= t).
  std::size_t firstAtOrAbove(double threshold) const;
  ConfusionCounts countsAt(double threshold) const;
};

// outcome: 0/1 (values > 0.5 count as events). Ties keep the input order (stable).
SortedCohort sortCohort(const std::vector<double>& risk, const std::vector<double>& outcome);

// Type-7 sample quantile (Hyndman & Fan, Am Stat 1996; R's default) of ascending values.
double quantileType7(const std::vector<double>& sortedValues, double probability);

}  // namespace calivera
