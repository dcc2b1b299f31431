// Bootstrap optimism correction (Harrell, Lee & Mark 1996): positive optimism for a model with
// many predictors on the small birthwt data (r-cran-mass, 189 births, 59 events), near zero for a
// few predictors on a large simulated cohort (a property, not a reference number), and identical
// results for any thread count.
#include "core/uncertainty/optimism.h"

#include <gtest/gtest.h>

#include <random>

#include "core/data/cohort.h"
#include "core/data/csv_reader.h"
#include "core/model/linear_predictor.h"
#include "tests/reference/reference_csv.h"

namespace calivera {
namespace {

struct Design {
  Eigen::MatrixXd X;
  Eigen::VectorXd y;
};

// low ~ age + lwt + race (2 indicators) + smoke + ptl + ht + ui + ftv: 9 predictors, 59 events.
Design birthwtDesign() {
  const Table table = readCsvFile(testing::referencePath("birthwt.csv"), {}).table;
  const std::vector<std::string> numeric = {"age", "lwt", "smoke", "ptl", "ht", "ui", "ftv"};
  const auto n = static_cast<Eigen::Index>(table.rowCount);
  Design d{Eigen::MatrixXd(n, 10), Eigen::VectorXd(n)};
  const Column& race = table.require("race");
  for (Eigen::Index i = 0; i < n; ++i) {
    const auto row = static_cast<std::size_t>(i);
    d.y[i] = table.require("low").numbers[row];
    d.X(i, 0) = 1.0;
    for (std::size_t j = 0; j < numeric.size(); ++j) {
      d.X(i, static_cast<Eigen::Index>(j) + 1) = table.require(numeric[j]).numbers[row];
    }
    const std::string& level = race.levels[static_cast<std::size_t>(race.codes[row])];
    d.X(i, 8) = level == "black" ? 1.0 : 0.0;
    d.X(i, 9) = level == "other" ? 1.0 : 0.0;
  }
  return d;
}

OptimismOptions options(int replicates, unsigned threads, bool ici) {
  OptimismOptions o;
  o.bootstrap.replicates = replicates;
  o.bootstrap.seed = 2026;
  o.bootstrap.threads = threads;
  o.includeIci = ici;
  return o;
}

TEST(Optimism, OverfittedModelOnBirthwtIsOptimistic) {
  const Design d = birthwtDesign();
  ASSERT_EQ(d.X.rows(), 189);
  const OptimismResult r = bootstrapOptimism(d.X, d.y, options(200, 0, true));
  // A resample may show separation (rare binary predictors such as ui, ht): left out, counted.
  EXPECT_LE(r.run.failed, 5u) << r.run.firstFailure;
  const OptimismMeasure* auc = findMeasure(r, "AUC");
  const OptimismMeasure* slope = findMeasure(r, "calibration slope");
  const OptimismMeasure* brier = findMeasure(r, "Brier");
  const OptimismMeasure* ici = findMeasure(r, "ICI");
  ASSERT_TRUE(auc && slope && brier && ici);
  EXPECT_GT(auc->meanOptimism, 0.01);
  EXPECT_LT(auc->corrected, auc->apparent);
  EXPECT_NEAR(slope->apparent, 1.0, 1e-8);  // maximum likelihood on its own data
  EXPECT_LT(r.shrinkageFactor, 0.95);
  EXPECT_GT(r.shrinkageFactor, 0.3);
  EXPECT_LT(brier->meanOptimism, 0.0);  // lower Brier on the resample it was fitted to
  EXPECT_GT(ici->meanOptimism, -1.0);   // computed for every replicate
  EXPECT_EQ(ici->replicatesUsed + r.run.failed, 200u);
}

TEST(Optimism, NearZeroForFewPredictorsOnALargeCohort) {
  std::mt19937_64 generator(11);
  std::normal_distribution<double> normal;
  std::uniform_real_distribution<double> uniform;
  const Eigen::Index n = 20000;
  Eigen::MatrixXd X(n, 3);
  Eigen::VectorXd y(n);
  for (Eigen::Index i = 0; i < n; ++i) {
    X(i, 0) = 1.0;
    X(i, 1) = normal(generator);
    X(i, 2) = normal(generator);
    const double lp = -1.0 + 0.8 * X(i, 1) - 0.5 * X(i, 2);
    y[i] = uniform(generator) < 1.0 / (1.0 + std::exp(-lp)) ? 1.0 : 0.0;
  }
  const OptimismResult r = bootstrapOptimism(X, y, options(40, 0, false));
  EXPECT_LT(std::fabs(findMeasure(r, "AUC")->meanOptimism), 0.002);
  EXPECT_NEAR(r.shrinkageFactor, 1.0, 0.01);
}

TEST(Optimism, SameSeedSameResultForAnyThreadCount) {
  const Design d = birthwtDesign();
  const OptimismResult one = bootstrapOptimism(d.X, d.y, options(30, 1, false));
  const OptimismResult two = bootstrapOptimism(d.X, d.y, options(30, 2, false));
  ASSERT_EQ(one.measures.size(), two.measures.size());
  for (std::size_t m = 0; m < one.measures.size(); ++m) {
    EXPECT_EQ(one.measures[m].meanOptimism, two.measures[m].meanOptimism) << m;
  }
}

TEST(Optimism, FirthRefitsEveryReplicate) {
  const Design d = birthwtDesign();
  OptimismOptions o = options(20, 0, false);
  o.fit.firth = true;
  const OptimismResult r = bootstrapOptimism(d.X, d.y, o);
  EXPECT_TRUE(r.firth);
  EXPECT_EQ(r.run.failed, 0u);
  EXPECT_GT(findMeasure(r, "AUC")->meanOptimism, 0.0);
  // Firth shrinks towards zero, so its apparent slope on its own data exceeds 1.
  EXPECT_GT(findMeasure(r, "calibration slope")->apparent, 1.0);
}

TEST(Optimism, ShrunkModelKeepsMeanRiskEqualToObserved) {
  const Table table = readCsvFile(testing::referencePath("birthwt.csv"), {}).table;
  Model m;
  m.name = "lwt only";
  Term t;
  t.name = t.variable = "lwt";
  t.estimate.coefficient = -0.014;
  m.terms = {t};
  m.intercept.coefficient = 1.0;
  const AnalysisRows rows = selectCompleteCases(table, {"low", "lwt"});
  const std::vector<double> y = outcomeValues(table, {"low", std::nullopt}, rows.rows);
  const Model shrunk = shrinkModel(m, 0.8, table, rows.rows, y);
  EXPECT_DOUBLE_EQ(shrunk.terms[0].estimate.coefficient, -0.014 * 0.8);
  double meanRisk = 0.0, observed = 0.0;
  const std::vector<double> lp = linearPredictor(shrunk, table, rows.rows);
  for (std::size_t i = 0; i < lp.size(); ++i) {
    meanRisk += logisticRisk(lp[i]);
    observed += y[i];
  }
  EXPECT_NEAR(meanRisk, observed, 1e-8);
  ASSERT_TRUE(shrunk.provenance);
  EXPECT_NE(shrunk.provenance->find("shrinkage"), std::string::npos);
}

}  // namespace
}  // namespace calivera
