// Calivera's chained-equations imputation (core/imputation/chained_equations.h).
// The simulation tests are property tests, stated as such: a cohort generated here from a known
// logistic model (invented data, fixed seed) with predictor values made missing at random given
// the outcome, where complete-case analysis is known to be biased (the complete cases
// under-represent events; White & Carlin, Stat Med 2010) and imputation with the outcome in the
// imputation model is known to remove the bias (Moons et al., J Clin Epidemiol 2006).
#include "core/imputation/chained_equations.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <fstream>
#include <map>
#include <random>
#include <set>
#include <sstream>

#include "core/data/csv_reader.h"
#include "core/metrics/validation_run.h"
#include "core/util/errors.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

// The generating model, also the validated model: risks are right on the full data.
constexpr const char* kModel = R"json({
  "format": "calivera-model/1", "name": "simulated (property test)", "outcome": "y",
  "intercept": {"coefficient": -1.0},
  "terms": [
    {"name": "x1", "variable": "x1", "transform": "linear", "estimate": {"coefficient": 0.8}},
    {"name": "x2 b", "variable": "x2", "transform": "indicator", "level": "b",
     "estimate": {"coefficient": 0.7}},
    {"name": "x2 c", "variable": "x2", "transform": "indicator", "level": "c",
     "estimate": {"coefficient": 1.2}},
    {"name": "x3", "variable": "x3", "transform": "linear", "estimate": {"coefficient": 0.5}},
    {"name": "x4 yes", "variable": "x4", "transform": "indicator", "level": "yes",
     "estimate": {"coefficient": -0.6}}
  ]
})json";

struct SimulatedCohort {
  std::string full;        // CSV, no missing value
  std::string incomplete;  // the same patients, x1, x2 and x4 missing at random given y
};

SimulatedCohort simulate(std::size_t n, std::uint64_t seed) {
  std::mt19937_64 generator(seed);
  std::normal_distribution<double> normal;
  std::uniform_real_distribution<double> uniform;
  std::ostringstream full, incomplete;
  full << "y,x1,x2,x3,x4\n";
  incomplete << "y,x1,x2,x3,x4\n";
  for (std::size_t i = 0; i < n; ++i) {
    const double x1 = normal(generator);
    const double x3 = 0.5 * x1 + std::sqrt(0.75) * normal(generator);
    // x2 depends on x1 (so it can be predicted), three levels.
    const double wb = std::exp(0.6 * x1), wc = std::exp(-0.2 + 1.0 * x1);
    const double u = uniform(generator) * (1.0 + wb + wc);
    const char* x2 = u < 1.0 ? "a" : u < 1.0 + wb ? "b" : "c";
    const char* x4 = uniform(generator) < 1.0 / (1.0 + std::exp(-(0.8 * x3))) ? "yes" : "no";
    const double lp = -1.0 + 0.8 * x1 +
                      (x2[0] == 'b'   ? 0.7
                       : x2[0] == 'c' ? 1.2
                                      : 0.0) +
                      0.5 * x3 + (x4[0] == 'y' ? -0.6 : 0.0);
    const int y = uniform(generator) < 1.0 / (1.0 + std::exp(-lp)) ? 1 : 0;
    char x1Text[32], x3Text[32];
    std::snprintf(x1Text, sizeof x1Text, "%.6f", x1);
    std::snprintf(x3Text, sizeof x3Text, "%.6f", x3);
    full << y << "," << x1Text << "," << x2 << "," << x3Text << "," << x4 << "\n";
    // Missing at random given the outcome: far more often for events.
    const bool missing1 = uniform(generator) < (y == 1 ? 0.5 : 0.1);
    const bool missing2 = uniform(generator) < (y == 1 ? 0.4 : 0.1);
    const bool missing4 = uniform(generator) < (y == 1 ? 0.3 : 0.05);
    incomplete << y << "," << (missing1 ? "" : x1Text) << "," << (missing2 ? "" : x2) << ","
               << x3Text << "," << (missing4 ? "" : x4) << "\n";
  }
  return {full.str(), incomplete.str()};
}

void write(const std::string& path, const std::string& text) {
  std::ofstream(path, std::ios::binary) << text;
}

ValidationRequest request(const std::string& data, const std::string& model) {
  ValidationRequest r;
  r.dataPath = data;
  r.outcome.column = "y";
  r.modelPath = model;
  r.options.thresholds = {0.1, 0.2, 0.3};
  return r;
}

const PooledImputedMeasure& pooled(const ValidationRun& run, const std::string& key) {
  for (const PooledImputedMeasure& m : run.imputed->pooled) {
    if (m.key == key) return m;
  }
  throw std::logic_error("no pooled " + key);
}

TEST(ChainedEquations, RemoveTheCompleteCaseBiasWhenValuesAreMissingGivenTheOutcome) {
  const testing::TempDir dir("chained_mar");
  const SimulatedCohort cohort = simulate(4000, 20261205);
  write(dir.file("full.csv"), cohort.full);
  write(dir.file("incomplete.csv"), cohort.incomplete);
  write(dir.file("model.json"), kModel);
  const ValidationRun full = runValidation(request(dir.file("full.csv"), dir.file("model.json")));
  ValidationRequest imputed = request(dir.file("incomplete.csv"), dir.file("model.json"));
  imputed.impute = ChainedEquationsOptions{.copies = 20, .iterations = 10, .seed = 3};
  const ValidationRun run = runValidation(imputed);
  ASSERT_TRUE(run.imputed);
  EXPECT_EQ(run.imputed->n, 4000u);
  const double truth = full.result.calibration.intercept;
  const double completeCase = run.result.calibration.intercept;  // the complete cases
  const double afterImputation = pooled(run, "calibration_intercept").estimate;
  // The complete cases lose most events: their calibration-in-the-large is far off.
  EXPECT_GT(std::abs(completeCase - truth), 0.5) << completeCase << " vs " << truth;
  EXPECT_LT(std::abs(afterImputation - truth), 0.1 * std::abs(completeCase - truth))
      << afterImputation << " vs " << truth;
  const double oeTruth = full.result.calibration.oeRatio;
  EXPECT_LT(std::abs(std::log(pooled(run, "oe_ratio").estimate / oeTruth)),
            0.1 * std::abs(std::log(run.result.calibration.oeRatio / oeTruth)));
  // Discrimination after imputation stays close to the full data's, and its interval covers it.
  const PooledImputedMeasure& c = pooled(run, "c_statistic");
  EXPECT_LT(std::abs(c.estimate - full.result.discrimination.auc), 0.02);
  EXPECT_GT(pooled(run, "calibration_slope").rubin.fractionMissingInformation, 0.0);
  // Every imputation method was used and recorded.
  std::map<std::string, std::string> methods;
  for (const ImputedColumnRecord& r : run.imputed->imputedColumns) methods[r.column] = r.method;
  EXPECT_EQ(methods,
            (std::map<std::string, std::string>{
                {"x1", "predictive_mean_matching"}, {"x2", "multinomial"}, {"x4", "logistic"}}));
}

// Within each outcome class, a level's share among the imputed values of x2 matches its share
// among the observed ones (missingness depends on the outcome only), within 4 binomial standard
// errors; imputed numbers are values observed in the column (predictive mean matching).
TEST(ChainedEquations, ImputedCategoriesFollowTheObservedOnesGivenTheOutcome) {
  const SimulatedCohort cohort = simulate(6000, 77);
  const Table table = parseCsv(cohort.incomplete, "incomplete.csv", {}).table;
  const ChainedEquationsData data =
      prepareChainedEquations(table, {"x1", "x2", "x3", "x4"}, OutcomeSpec{"y", std::nullopt});
  ASSERT_EQ(data.incomplete.size(), 3u);  // x3 is complete
  const ChainedEquationsOptions options{.copies = 2, .iterations = 10, .seed = 9};
  const Table copy = imputedCopy(table, data, options, 0);
  const Column& x2 = *copy.find("x2");
  const Column& x2Before = *table.find("x2");
  const Column& y = *table.find("y");
  EXPECT_EQ(x2.missingCount, 0u);
  for (const double event : {0.0, 1.0}) {
    std::map<int, double> observed, imputed;
    double observedTotal = 0, imputedTotal = 0;
    for (std::size_t r = 0; r < table.rowCount; ++r) {
      if (y.numbers[r] != event) continue;
      if (x2Before.isMissing(r)) {
        imputed[x2.codes[r]] += 1;
        ++imputedTotal;
      } else {
        observed[x2.codes[r]] += 1;
        ++observedTotal;
      }
    }
    ASSERT_GT(imputedTotal, 100);
    for (const auto& [level, count] : observed) {
      const double share = count / observedTotal;
      const double se = std::sqrt(share * (1 - share) / imputedTotal);
      EXPECT_NEAR(imputed[level] / imputedTotal, share, 4 * se)
          << "level " << x2.levels[static_cast<std::size_t>(level)] << ", y = " << event;
    }
  }
  const Column& x1 = *copy.find("x1");
  const Column& x1Before = *table.find("x1");
  std::set<double> seen;
  for (std::size_t r = 0; r < table.rowCount; ++r) {
    if (!x1Before.isMissing(r)) seen.insert(x1Before.numbers[r]);
  }
  for (std::size_t r = 0; r < table.rowCount; ++r) {
    if (x1Before.isMissing(r)) {
      EXPECT_TRUE(seen.count(x1.numbers[r])) << r;
    } else {
      EXPECT_EQ(x1.numbers[r], x1Before.numbers[r]);
    }
  }
  // The same seed and copy give the same values; another copy differs.
  const Table again = imputedCopy(table, data, options, 0);
  EXPECT_EQ(again.find("x1")->numbers, x1.numbers);
  EXPECT_NE(imputedCopy(table, data, options, 1).find("x1")->numbers, x1.numbers);
}

std::string prepareError(const std::string& csv, const std::vector<std::string>& columns) {
  try {
    prepareChainedEquations(parseCsv(csv, "c.csv", {}).table, columns,
                            OutcomeSpec{"y", std::nullopt});
  } catch (const InputError& error) {
    return error.what();
  }
  return "(accepted)";
}

TEST(ChainedEquations, PatientsWithoutAnOutcomeAreLeftAsTheyAre) {
  const Table table = parseCsv("y,x,z\n1,1,4\n0,,5\n,,6\n1,3,\n0,2,7\n", "c.csv", {}).table;
  const ChainedEquationsData data =
      prepareChainedEquations(table, {"x", "z"}, OutcomeSpec{"y", std::nullopt});
  EXPECT_EQ(data.rows, (std::vector<std::uint32_t>{0, 1, 3, 4}));
  const Table copy = imputedCopy(table, data, {.copies = 2, .iterations = 3, .seed = 1}, 0);
  EXPECT_TRUE(std::isnan(copy.find("x")->numbers[2]));  // outcome unknown: not imputed
  EXPECT_FALSE(std::isnan(copy.find("x")->numbers[1]));
  EXPECT_FALSE(std::isnan(copy.find("z")->numbers[3]));
  EXPECT_EQ(copy.find("x")->missingCount, 1u);
}

TEST(ChainedEquations, RefuseWhatCannotBeImputed) {
  EXPECT_NE(prepareError("y,x\n1,1\n0,2\n", {"x"}).find("nothing to impute"), std::string::npos);
  EXPECT_NE(prepareError("y,x,z\n1,,1\n0,,2\n", {"x", "z"})
                .find("c.csv: column 'x' has no value for any patient with a known outcome"),
            std::string::npos);
  EXPECT_NE(prepareError("y,g,z\n1,a,1\n0,,2\n1,a,3\n", {"g", "z"})
                .find("column 'g' holds a single level"),
            std::string::npos);
  std::string many = "y,g\n";
  for (int i = 0; i < 30; ++i) many += std::to_string(i % 2) + ",L" + std::to_string(i) + "\n";
  many += "1,\n";
  EXPECT_NE(prepareError(many, {"g"}).find("column 'g' has 30 levels; at most 20"),
            std::string::npos);
}

TEST(ChainedEquations, OptionsAreValidOnlyWithinTheirBounds) {
  EXPECT_FALSE(ChainedEquationsOptions{}.isValid());  // the number of copies has no default
  EXPECT_TRUE(ChainedEquationsOptions{.copies = 2}.isValid());
  EXPECT_FALSE(ChainedEquationsOptions{.copies = 1001}.isValid());
  EXPECT_FALSE((ChainedEquationsOptions{.copies = 5, .iterations = 0}.isValid()));
  EXPECT_FALSE((ChainedEquationsOptions{.copies = 5, .donors = 0}.isValid()));
}

}  // namespace
}  // namespace calivera
