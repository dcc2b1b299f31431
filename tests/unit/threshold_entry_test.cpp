// Threshold entry (core/present/threshold_entry.h): probability, percentage and harm-to-benefit
// ratio. The ratio-to-threshold relation t = harm / (harm + benefit) follows from the odds
// t / (1 - t) = harm / benefit (Vickers & Elkin, Med Decis Making 2006), checked by hand here.
#include "core/present/threshold_entry.h"

#include <gtest/gtest.h>

namespace calivera {
namespace {

TEST(ThresholdEntry, ProbabilityPercentageAndRatio) {
  EXPECT_DOUBLE_EQ(*parseThresholdEntry("0.15").threshold, 0.15);
  EXPECT_DOUBLE_EQ(*parseThresholdEntry(" 15% ").threshold, 0.15);
  EXPECT_DOUBLE_EQ(*parseThresholdEntry("1:9").threshold, 0.10);  // odds 1/9
  EXPECT_DOUBLE_EQ(*parseThresholdEntry("1:4").threshold, 0.20);  // odds 1/4
  EXPECT_DOUBLE_EQ(*parseThresholdEntry("2.5%").threshold, 0.025);
}

TEST(ThresholdEntry, RefusesWithAReasonInsteadOfClamping) {
  const ThresholdEntry fifteen = parseThresholdEntry("15");
  EXPECT_FALSE(fifteen.threshold);
  EXPECT_NE(fifteen.error.find("15%"), std::string::npos) << fifteen.error;
  for (const char* bad : {"0", "1", "100%", "0%", "-0.1", "150", "abc", "1:0", ":3", "", "nan"}) {
    const ThresholdEntry e = parseThresholdEntry(bad);
    EXPECT_FALSE(e.threshold) << bad;
    EXPECT_FALSE(e.error.empty()) << bad;
  }
}

}  // namespace
}  // namespace calivera
