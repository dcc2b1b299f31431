// The panel's calibration sentence (core/present/threshold_reading.h) and the index's mean
// predicted risk among flagged patients, on small cohorts worked by hand.
#include "core/present/threshold_reading.h"

#include <gtest/gtest.h>

#include <cmath>

#include "core/metrics/threshold_index.h"

namespace calivera {
namespace {

TEST(ThresholdReading, MeanRiskAmongFlaggedByHand) {
  const ThresholdIndex index({0.05, 0.2, 0.3, 0.6}, {0, 0, 1, 1});
  EXPECT_DOUBLE_EQ(index.meanRiskFlaggedAt(0.2), (0.2 + 0.3 + 0.6) / 3.0);
  EXPECT_DOUBLE_EQ(index.meanRiskFlaggedAt(0.6), 0.6);
  EXPECT_TRUE(std::isnan(index.meanRiskFlaggedAt(0.7)));
}

TEST(ThresholdReading, SaysWhenRisksRunHighAndGivesTheFlaggedRates) {
  ThresholdSnapshot s;
  s.threshold = 0.10;
  s.n = 1000;
  s.counts = ConfusionCounts{40, 160, 30, 770};
  s.ppv = 40.0 / 200.0;
  s.meanRiskFlagged = 0.27;
  Calibration c;
  c.oeRatio = 0.74;
  c.oeCi = {0.70, 0.77};
  const std::string text = calibrationAtThresholdText(s, c);
  EXPECT_NE(text.find("risks run high"), std::string::npos) << text;
  EXPECT_NE(text.find("0.74, 95% CI 0.70 to 0.77"), std::string::npos) << text;
  EXPECT_NE(text.find("A predicted 10.0% is not an observed 10.0% here"), std::string::npos);
  EXPECT_NE(text.find("Among the 200 flagged patients the model predicts 27.0% on average; 20.0% "
                      "had the event"),
            std::string::npos)
      << text;
  c.oeRatio = 1.3;
  c.oeCi = {1.1, 1.5};
  EXPECT_NE(calibrationAtThresholdText(s, c).find("risks run low"), std::string::npos);
  c.oeRatio = 1.0;
  c.oeCi = {0.9, 1.1};
  const std::string agree = calibrationAtThresholdText(s, c);
  EXPECT_NE(agree.find("agree"), std::string::npos);
  EXPECT_EQ(agree.find("is not an observed"), std::string::npos);
  EXPECT_TRUE(calibrationAtThresholdText(ThresholdSnapshot{}, c).empty());
}

}  // namespace
}  // namespace calivera
