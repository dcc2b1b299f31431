// `calivera predictor-space` (the Predictor space tab's numbers on the command line). The checks
// are analytic: for a model that is linear on the logit scale, the curve must be
// expit(b0 + sum b_k (x_k - c_k) / s_k) with the other predictors at the medians of the analysed
// patients, the crossing must solve it for the threshold, and every boundary point of the
// surface must satisfy the linear equation. Data: MASS::birthwt (Debian r-cran-mass); the model is
// fitted on it by `calivera fit`.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "core/data/csv_reader.h"
#include "core/model/model_io.h"
#include "tests/unit/birthwt_run.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

using testing::CliRun;
using testing::runCalivera;

double median(std::vector<double> v) {
  std::sort(v.begin(), v.end());
  const std::size_t n = v.size();
  return n % 2 ? v[n / 2] : (v[n / 2 - 1] + v[n / 2]) / 2.0;
}

class PredictorSpaceCommand : public ::testing::Test {
 protected:
  void SetUp() override {
    testing::writeBirthwtModel(model(), {"age", "lwt", "smoke", "ht"}, "four terms");
    const Model m = readModelFile(model());
    const Table table = readCsvFile(testing::birthwtPath(), CsvOptions{}).table;
    b0_ = m.intercept.coefficient;
    for (const Term& t : m.terms) {
      ASSERT_EQ(t.kind, TransformKind::Linear) << t.name;
      terms_.push_back(t);
      medians_[t.variable] = median(table.requireNumeric(t.variable).numbers);
    }
  }
  std::string model() const { return dir_.file("m.json"); }
  // The logit with `values` for the named variables and the medians for the rest.
  double logit(const std::map<std::string, double>& values) const {
    double lp = b0_;
    for (const Term& t : terms_) {
      const auto it = values.find(t.variable);
      const double x = it == values.end() ? medians_.at(t.variable) : it->second;
      lp += t.estimate.coefficient * (x - t.center) / t.scale;
    }
    return lp;
  }
  const Term& term(const std::string& variable) const {
    return *std::find_if(terms_.begin(), terms_.end(),
                         [&](const Term& t) { return t.variable == variable; });
  }
  std::vector<std::string> base() const {
    return {"predictor-space", "--data", testing::birthwtPath(), "--outcome", "low",
            "--model",         model()};
  }
  testing::TempDir dir_{"predictor_space"};
  double b0_ = 0.0;
  std::vector<Term> terms_;
  std::map<std::string, double> medians_;
};

TEST_F(PredictorSpaceCommand, CurveIsTheModelWithOthersAtTheirMedians) {
  std::vector<std::string> words = base();
  words.insert(words.end(),
               {"--predictor", "age", "--threshold", "0.3", "--json", dir_.file("c.json")});
  const CliRun run = runCalivera(words);
  ASSERT_EQ(run.status, 0) << run.err;
  const auto j = nlohmann::json::parse(testing::readWhole(dir_.file("c.json")));
  const auto values = j["values"].get<std::vector<double>>();
  const auto risk = j["risk"].get<std::vector<double>>();
  ASSERT_EQ(values.size(), 200u);
  for (std::size_t i = 0; i < values.size(); i += 13) {
    const double expected = 1.0 / (1.0 + std::exp(-logit({{"age", values[i]}})));
    EXPECT_NEAR(risk[i], expected, 1e-12) << values[i];
  }
  // Where the curve crosses 0.3 (linear interpolation between grid points; the curve is smooth,
  // so within a small tolerance of the exact solution).
  const double exact =
      term("age").center + term("age").scale *
                               (std::log(0.3 / 0.7) - (logit({{"age", term("age").center}}))) /
                               term("age").estimate.coefficient;
  const auto cuts = j["crossings"].get<std::vector<double>>();
  if (exact > values.front() && exact < values.back()) {
    ASSERT_EQ(cuts.size(), 1u);
    EXPECT_NEAR(cuts[0], exact, 0.02);
  } else {
    EXPECT_TRUE(cuts.empty());
  }
  EXPECT_NE(j["caution"].get<std::string>().find("clinical governance"), std::string::npos);
}

TEST_F(PredictorSpaceCommand, HeldValuesAndTheBoundaryOfTwoPredictors) {
  std::vector<std::string> words = base();
  words.insert(words.end(), {"--predictor", "age", "--predictor", "lwt", "--hold", "smoke=1",
                             "--threshold", "0.35", "--grid", "40", "--json", dir_.file("s.json"),
                             "--csv", dir_.file("s.csv")});
  const CliRun run = runCalivera(words);
  ASSERT_EQ(run.status, 0) << run.err;
  const auto j = nlohmann::json::parse(testing::readWhole(dir_.file("s.json")));
  EXPECT_EQ(j["x_values"].size(), 40u);
  const double target = std::log(0.35 / 0.65);
  std::size_t checked = 0;
  for (const auto& line : j["boundary"]) {
    for (const auto& point : line) {
      const double x = point[0].get<double>(), y = point[1].get<double>();
      // Interpolated on the logit scale along grid edges: exact for a linear logit.
      EXPECT_NEAR(logit({{"age", x}, {"lwt", y}, {"smoke", 1.0}}), target, 1e-9);
      ++checked;
    }
  }
  EXPECT_GT(checked, 10u);
  // The CSV holds the same grid, one row per point, and no patient values.
  const std::string csv = testing::readWhole(dir_.file("s.csv"));
  EXPECT_EQ(std::count(csv.begin(), csv.end(), '\n'), 40 * 40 + 1);
  EXPECT_EQ(csv.rfind("x_value,y_value,risk\n", 0), 0u);
}

TEST_F(PredictorSpaceCommand, BadRequestsAreRefusedWithoutOutput) {
  const auto refused = [&](std::vector<std::string> extra, const std::string& message) {
    std::vector<std::string> words = base();
    words.insert(words.end(), extra.begin(), extra.end());
    words.insert(words.end(), {"--json", dir_.file("never.json")});
    const CliRun run = runCalivera(words, 60);
    EXPECT_EQ(run.status, 2) << message;
    EXPECT_NE(run.err.find(message), std::string::npos) << run.err;
    EXPECT_FALSE(std::filesystem::exists(dir_.file("never.json")));
  };
  refused({"--predictor", "weight"}, "no variable 'weight'");
  refused({}, "--predictor");
  refused({"--predictor", "age", "--predictor", "lwt", "--predictor", "ht"}, "--predictor");
  refused({"--predictor", "age", "--hold", "lwt=heavy"}, "lwt");
  refused({"--predictor", "age", "--threshold", "1"}, "--threshold");
  refused({"--predictor", "age", "--points", "1"}, "--points");
  // The text summary ends with the caution.
  std::vector<std::string> words = base();
  words.insert(words.end(), {"--predictor", "lwt"});
  const CliRun text = runCalivera(words);
  ASSERT_EQ(text.status, 0) << text.err;
  EXPECT_NE(text.out.find("Other predictors held at: age = "), std::string::npos) << text.out;
  EXPECT_NE(text.out.rfind("clinical governance"), std::string::npos);
}

}  // namespace
}  // namespace calivera
