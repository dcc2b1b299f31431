// `calivera validate --cluster` (the real executable) on Aids2 (Australian AIDS survival data,
// 2843 patients in four real state groups; Debian r-cran-mass) against R: every site's measures
// computed by hand from their definitions (DeLong placements, glm for the recalibration models)
// and the pools from metafor 3.8-1 (Debian r-cran-metafor: rma(method = "REML"), test = "adhoc"
// for the never-narrower Hartung-Knapp-Sidik-Jonkman interval, the Riley prediction interval).
// Script and values: tests/reference/scripts/aids2_sites.R, tests/reference/data/aids2_sites.json.
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <nlohmann/json.hpp>
#include <optional>

#include "tests/reference/reference_csv.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

using testing::referencePath;

double logistic(double x) {
  return 1.0 / (1.0 + std::exp(-x));
}

double backTransform(const std::string& scale, double x) {
  if (scale == "logit") return logistic(x);
  if (scale == "log") return std::exp(x);
  return x;
}

class Aids2Sites : public ::testing::Test {
 protected:
  static void SetUpTestSuite() {
    const testing::TempDir dir("aids2_sites");
    const std::string json = dir.file("result.json");
    const testing::CliRun run =
        testing::runCalivera({"validate", "--data", referencePath("aids2_sites.csv"), "--outcome",
                              "dead", "--risk", "risk", "--cluster", "state", "--json", json});
    ASSERT_EQ(run.status, 0) << run.err;
    std::ifstream in(json);
    ours_ = nlohmann::json::parse(in);
    std::ifstream referenceIn(referencePath("aids2_sites.json"));
    reference_ = nlohmann::json::parse(referenceIn);
  }
  // One run of the executable serves every test of the suite.
  static inline std::optional<nlohmann::json> ours_;
  static inline nlohmann::json reference_;
};

TEST_F(Aids2Sites, EverySiteMatchesRByHand) {
  ASSERT_TRUE(ours_.has_value());
  const nlohmann::json& sites = ours_->at("clusters").at("sites");
  const nlohmann::json& expected = reference_.at("sites");
  ASSERT_EQ(sites.size(), expected.size());
  for (std::size_t s = 0; s < sites.size(); ++s) {
    const nlohmann::json& a = sites[s];
    const nlohmann::json& b = expected[s];
    EXPECT_EQ(a.at("name"), b.at("name"));
    EXPECT_EQ(a.at("n"), b.at("n"));
    EXPECT_EQ(a.at("events"), b.at("events"));
    for (const char* key :
         {"auc", "auc_se", "oe_ratio", "log_oe_se", "calibration_intercept",
          "calibration_intercept_se", "calibration_slope", "calibration_slope_se"}) {
      // The recalibration fits stop at their own tolerances (ours: a Newton step below 1e-10;
      // R's glm at epsilon 1e-15), which leaves SEs agreeing to about 5e-8; hence 1e-7.
      const double tolerance = 1e-7;
      const double want = b.at(key).get<double>();
      EXPECT_NEAR(a.at(key).get<double>(), want, tolerance * std::max(1.0, std::abs(want)))
          << b.at("name") << " " << key;
    }
  }
}

TEST_F(Aids2Sites, PoolsMatchMetafor) {
  ASSERT_TRUE(ours_.has_value());
  const nlohmann::json& pooled = ours_->at("clusters").at("pooled");
  for (const auto& [key, r] : reference_.at("pooled").items()) {
    SCOPED_TRACE(key);
    const nlohmann::json& p = pooled.at(key);
    const std::string scale = r.at("scale");
    EXPECT_EQ(p.at("scale"), scale);
    EXPECT_EQ(p.at("k"), r.at("k"));
    // The per-site inputs carry the fit tolerances above into the pools; 1e-7 covers them.
    constexpr double kTolerance = 1e-7;
    const auto natural = [&](double x) { return backTransform(scale, x); };
    EXPECT_NEAR(p.at("estimate").get<double>(), natural(r.at("estimate").get<double>()),
                kTolerance);
    EXPECT_NEAR(p.at("tau2").get<double>(), r.at("tau2").get<double>(), kTolerance);
    EXPECT_NEAR(p.at("i2").get<double>(), r.at("i2").get<double>(), kTolerance);
    for (int end = 0; end < 2; ++end) {
      EXPECT_NEAR(p.at("ci")[end].get<double>(), natural(r.at("ci_adhoc")[end].get<double>()),
                  kTolerance);
      EXPECT_NEAR(p.at("ci_hksj_untruncated")[end].get<double>(),
                  natural(r.at("ci_knha")[end].get<double>()), kTolerance);
      EXPECT_NEAR(p.at("prediction_interval")[end].get<double>(),
                  natural(r.at("pi")[end].get<double>()), kTolerance);
      EXPECT_NEAR(p.at("fixed_effect").at("ci")[end].get<double>(),
                  natural(r.at("fe_ci")[end].get<double>()), kTolerance);
    }
    EXPECT_NEAR(p.at("fixed_effect").at("estimate").get<double>(),
                natural(r.at("fe_estimate").get<double>()), kTolerance);
    EXPECT_TRUE(p.at("excluded").empty());
  }
}

TEST_F(Aids2Sites, NetBenefitBySummedCountsIsTheWholeCohorts) {
  ASSERT_TRUE(ours_.has_value());
  // Every patient has a state, so the summed counts are the whole cohort's: the pooled value
  // must equal the decision curve of the same run at the same threshold.
  const nlohmann::json& curve = ours_->at("decision_curve");
  const nlohmann::json& pooled = ours_->at("clusters").at("net_benefit");
  ASSERT_FALSE(pooled.empty());
  for (const nlohmann::json& entry : pooled) {
    const double t = entry.at("threshold");
    bool found = false;
    for (const nlohmann::json& point : curve) {
      if (std::abs(point.at("threshold").get<double>() - t) < 1e-12) {
        found = true;
        EXPECT_NEAR(entry.at("by_counts").at("estimate").get<double>(),
                    point.at("net_benefit").get<double>(), 1e-15)
            << t;
      }
    }
    EXPECT_TRUE(found) << t;
    EXPECT_EQ(entry.at("by_counts").at("n"), 2843);
    EXPECT_EQ(entry.at("random_effects").at("k"), 4);
  }
}

}  // namespace
}  // namespace calivera
