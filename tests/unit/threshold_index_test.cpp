// ThresholdIndex against direct counting over every patient (the definition: flag risk >= t).
#include "core/metrics/threshold_index.h"

#include <gtest/gtest.h>

#include <random>

namespace calivera {
namespace {

ConfusionCounts countDirectly(const std::vector<double>& risk, const std::vector<double>& y,
                              double t) {
  ConfusionCounts c;
  for (std::size_t i = 0; i < risk.size(); ++i) {
    const bool flagged = risk[i] >= t;
    const bool event = y[i] > 0.5;
    if (flagged && event) ++c.tp;
    if (flagged && !event) ++c.fp;
    if (!flagged && event) ++c.fn;
    if (!flagged && !event) ++c.tn;
  }
  return c;
}

TEST(ThresholdIndex, MatchesDirectCountingIncludingTiesAtTheThreshold) {
  std::mt19937 generator(7);
  std::uniform_int_distribution<int> grid(0, 20);
  std::bernoulli_distribution coin(0.3);
  std::vector<double> risk, y;
  for (int i = 0; i < 500; ++i) {
    risk.push_back(grid(generator) / 20.0);  // many ties, some exactly at the thresholds below
    y.push_back(coin(generator) ? 1.0 : 0.0);
  }
  const ThresholdIndex index(risk, y);
  for (double t : {-0.1, 0.0, 0.05, 0.1, 0.33, 0.5, 0.95, 1.0, 1.1}) {
    const ConfusionCounts expected = countDirectly(risk, y, t);
    const ConfusionCounts got = index.countsAt(t);
    EXPECT_EQ(got.tp, expected.tp) << t;
    EXPECT_EQ(got.fp, expected.fp) << t;
    EXPECT_EQ(got.tn, expected.tn) << t;
    EXPECT_EQ(got.fn, expected.fn) << t;
  }
}

TEST(ThresholdIndex, EmptyInputGivesZeroCounts) {
  const ThresholdIndex index({}, {});
  const ConfusionCounts c = index.countsAt(0.5);
  EXPECT_EQ(c.tp + c.fp + c.tn + c.fn, 0u);
}

}  // namespace
}  // namespace calivera
