// Paired DeLong test against values computed by hand in R from the 1988
// definitions (tests/reference/scripts/paired_delong_birthwt.R; data birthwt
// from r-cran-mass), and the single-AUC DeLong SE of the Hanley-McNeil rating
// table (docs/methods.md, computed).
#include <gtest/gtest.h>

#include <fstream>
#include <nlohmann/json.hpp>

#include "core/metrics/auc_delong.h"
#include "core/uncertainty/model_comparison.h"

namespace calivera {
namespace {

constexpr double kTolerance = 1e-12;

nlohmann::json loadReference() {
  std::ifstream in(std::string(CALIVERA_SOURCE_DIR) +
                   "/tests/reference/data/paired_delong_birthwt.json");
  return nlohmann::json::parse(in);
}

TEST(PairedDelong, MatchesTheHandComputationInROnBirthwt) {
  const auto ref = loadReference();
  const auto y = ref["outcome"].get<std::vector<double>>();
  const std::vector<DelongPlacements> components = {
      delongPlacements(ref["score_a"].get<std::vector<double>>(), y),
      delongPlacements(ref["score_b"].get<std::vector<double>>(), y)};
  const auto covariance = delongCovariance(components);
  EXPECT_NEAR(components[0].auc, ref["auc_a"].get<double>(), kTolerance);
  EXPECT_NEAR(components[1].auc, ref["auc_b"].get<double>(), kTolerance);
  EXPECT_NEAR(covariance[0][0], ref["var_a"].get<double>(), kTolerance);
  EXPECT_NEAR(covariance[1][1], ref["var_b"].get<double>(), kTolerance);
  EXPECT_NEAR(covariance[0][1], ref["cov_ab"].get<double>(), kTolerance);
  const PairedAucTest test = pairedDelongTest(components, covariance, 0, 1);
  EXPECT_NEAR(test.se, ref["se_difference"].get<double>(), kTolerance);
  EXPECT_NEAR(test.z, ref["z"].get<double>(), 1e-10);
  EXPECT_NEAR(test.pValue, ref["p_value"].get<double>(), 1e-10);
}

TEST(PairedDelong, HanleyMcNeilRatingTableDelongSe) {
  // Hanley & McNeil, Radiology 1982 (table from memory; AUC 0.8932 and DeLong
  // SE 0.030724 computed, docs/methods.md).
  const int nonDiseased[] = {33, 6, 6, 11, 2};
  const int diseased[] = {3, 2, 2, 11, 33};
  std::vector<double> score, y;
  for (int rating = 1; rating <= 5; ++rating) {
    for (int k = 0; k < nonDiseased[rating - 1]; ++k) {
      score.push_back(rating);
      y.push_back(0);
    }
    for (int k = 0; k < diseased[rating - 1]; ++k) {
      score.push_back(rating);
      y.push_back(1);
    }
  }
  const std::vector<DelongPlacements> c = {delongPlacements(score, y)};
  EXPECT_NEAR(c[0].auc, 0.8932, 5e-5);
  EXPECT_NEAR(std::sqrt(delongCovariance(c)[0][0]), 0.030724, 5e-7);
}

TEST(PairedDelong, IdenticalScoresGiveNoTest) {
  const std::vector<double> y = {0, 1, 0, 1, 1, 0};
  const std::vector<double> s = {0.1, 0.9, 0.3, 0.4, 0.8, 0.2};
  const std::vector<DelongPlacements> c = {delongPlacements(s, y), delongPlacements(s, y)};
  const PairedAucTest test = pairedDelongTest(c, delongCovariance(c), 0, 1);
  EXPECT_DOUBLE_EQ(test.difference, 0.0);
  EXPECT_TRUE(std::isnan(test.pValue));
}

}  // namespace
}  // namespace calivera
