#include "core/metrics/threshold_table.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "core/metrics/proportion_ci.h"

namespace calivera {
namespace {

double ratio(std::size_t k, std::size_t n) {
  return n > 0 ? static_cast<double>(k) / static_cast<double>(n)
               : std::numeric_limits<double>::quiet_NaN();
}

}  // namespace

ThresholdRow thresholdRowFromCounts(double threshold, std::size_t tp, std::size_t fp,
                                    std::size_t tn, std::size_t fn) {
  ThresholdRow r;
  r.threshold = threshold;
  r.tp = tp;
  r.fp = fp;
  r.tn = tn;
  r.fn = fn;
  r.sensitivity = ratio(tp, tp + fn);
  r.specificity = ratio(tn, tn + fp);
  r.ppv = ratio(tp, tp + fp);
  r.npv = ratio(tn, tn + fn);
  r.sensitivityCi = wilsonInterval(tp, tp + fn);
  r.specificityCi = wilsonInterval(tn, tn + fp);
  r.ppvCi = wilsonInterval(tp, tp + fp);
  r.npvCi = wilsonInterval(tn, tn + fn);
  const std::size_t n = tp + fp + tn + fn;
  r.flaggedPer1000 = 1000.0 * ratio(tp + fp, n);
  r.eventsCaughtPer1000 = 1000.0 * ratio(tp, n);
  r.eventsMissedPer1000 = 1000.0 * ratio(fn, n);
  r.flaggedWithoutEventPer1000 = 1000.0 * ratio(fp, n);
  return r;
}

std::vector<ThresholdRow> thresholdTable(const SortedCohort& sorted,
                                         const std::vector<double>& thresholds) {
  std::vector<ThresholdRow> table;
  table.reserve(thresholds.size());
  for (const double t : thresholds) {
    const ConfusionCounts c = sorted.countsAt(t);
    table.push_back(thresholdRowFromCounts(t, c.tp, c.fp, c.tn, c.fn));
  }
  return table;
}

std::vector<double> defaultTableThresholds(const std::vector<ThresholdRow>& all) {
  std::vector<double> wanted;
  // A short table of the computed thresholds, never the full 99-row grid.
  if (all.size() <= 12) {
    for (const ThresholdRow& row : all) wanted.push_back(row.threshold);
    return wanted;
  }
  for (const double t : {0.05, 0.1, 0.2, 0.3, 0.5}) {
    const bool present = std::any_of(all.begin(), all.end(), [&](const ThresholdRow& r) {
      return std::abs(r.threshold - t) < 1e-9;
    });
    if (present) wanted.push_back(t);
  }
  return wanted;
}

}  // namespace calivera
