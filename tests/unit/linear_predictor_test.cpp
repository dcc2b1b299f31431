#include "core/model/linear_predictor.h"

#include <gtest/gtest.h>

#include <cmath>

#include "core/util/errors.h"
#include "tests/unit/table_fixture.h"

namespace calivera {
namespace {

using testing::allRows;
using testing::makeTable;
using testing::numericColumn;
using testing::textColumn;

Term term(const std::string& name, const std::string& variable, TransformKind kind,
          double coefficient) {
  Term t;
  t.name = name;
  t.variable = variable;
  t.kind = kind;
  t.estimate.coefficient = coefficient;
  return t;
}

Table cohort() {
  return makeTable({numericColumn("age", {60, 45, 72}), numericColumn("creat", {1.2, 0.8, 2.5}),
                    textColumn("sex", {"female", "male", "female"}),
                    numericColumn("grade", {1, 2, 3})});
}

std::string messageOf(const std::function<void()>& action) {
  try {
    action();
  } catch (const InputError& error) {
    return error.what();
  }
  return "";
}

TEST(LinearPredictor, EachTransformationMatchesHandComputation) {
  Model model;
  model.intercept.coefficient = -1.5;
  Term age = term("age per 10 y above 50", "age", TransformKind::Linear, 0.3);
  age.center = 50;
  age.scale = 10;
  Term creat = term("log creatinine", "creat", TransformKind::Log, 0.5);
  Term inverseSquare = term("age^-2", "age", TransformKind::Power, 1000.0);
  inverseSquare.power = -2;
  Term powerZero = term("creat^0", "creat", TransformKind::Power, -0.25);
  powerZero.power = 0;
  Term female = term("sex=female", "sex", TransformKind::Indicator, 0.4);
  female.level = "female";
  Term grade2 = term("grade=2", "grade", TransformKind::Indicator, 0.7);
  grade2.level = "2";
  Term spline = term("age spline 1", "age", TransformKind::Spline, 0.02);
  spline.knots = {40, 55, 70};
  spline.basisIndex = 1;
  Term product = term("age x female", "", TransformKind::Product, -0.1);
  product.factors = {age, female};
  model.terms = {age, creat, inverseSquare, powerZero, female, grade2, spline, product};
  // "grade 2 vs the rest" and "female vs male": the levels scored 0 are declared, as a model file
  // must for any level that has no indicator term (core/model/category_levels.h).
  model.referenceLevels = {{"grade", {"1", "3"}}, {"sex", {"male"}}};

  const Table table = cohort();
  const std::vector<double> lp = linearPredictor(model, table, allRows(table));
  // Spline basis 1 with knots 40, 55, 70 by Harrell's formula, divided by (70 - 40)^2.
  const auto rcs = [](double x) {
    const auto c = [](double v) { return v > 0 ? v * v * v : 0.0; };
    return (c(x - 40) - c(x - 55) * (70 - 40) / (70 - 55.0) + c(x - 70) * (55 - 40) / (70 - 55.0)) /
           900.0;
  };
  const double ages[] = {60, 45, 72}, creats[] = {1.2, 0.8, 2.5};
  const double isFemale[] = {1, 0, 1}, isGrade2[] = {0, 1, 0};
  for (int i = 0; i < 3; ++i) {
    const double a = (ages[i] - 50) / 10;
    const double expected = -1.5 + 0.3 * a + 0.5 * std::log(creats[i]) +
                            1000.0 / (ages[i] * ages[i]) - 0.25 * std::log(creats[i]) +
                            0.4 * isFemale[i] + 0.7 * isGrade2[i] + 0.02 * rcs(ages[i]) -
                            0.1 * a * isFemale[i];
    EXPECT_NEAR(lp[static_cast<std::size_t>(i)], expected, 1e-13) << i;
  }
  EXPECT_EQ(requiredColumns(model), (std::vector<std::string>{"age", "creat", "sex", "grade"}));
  const Eigen::MatrixXd design = designMatrix(model, table, {2, 0});
  EXPECT_EQ(design.rows(), 2);
  EXPECT_DOUBLE_EQ(design(0, 0), 2.2);
  EXPECT_DOUBLE_EQ(design(1, 4), 1.0);
}

TEST(LinearPredictor, SplineIsLinearBeyondTheOuterKnots) {
  // Property of a restricted cubic spline: zero second differences left of t_1 and right of t_k.
  Model model;
  Term spline = term("s", "x", TransformKind::Spline, 1.0);
  spline.knots = {1, 2, 4, 7, 9};
  for (int j = 1; j <= 3; ++j) {
    spline.basisIndex = j;
    model.terms = {spline};
    const Table table = makeTable({numericColumn("x", {10, 12, 14, -3, -1, 1})});
    const std::vector<double> v = linearPredictor(model, table, allRows(table));
    EXPECT_NEAR(v[0] - 2 * v[1] + v[2], 0.0, 1e-9) << j;
    EXPECT_NEAR(v[3] - 2 * v[4] + v[5], 0.0, 1e-12) << j;
    EXPECT_EQ(v[3], 0.0);
  }
}

TEST(LinearPredictor, LogOfNonPositiveValueNamesTheLine) {
  Model model;
  model.terms = {term("log creatinine", "creat", TransformKind::Log, 1.0)};
  const Table table = makeTable({numericColumn("creat", {1.0, 2.0, 0.0})});
  const std::string message = messageOf([&] { linearPredictor(model, table, allRows(table)); });
  EXPECT_NE(message.find("cohort.csv:4:"), std::string::npos) << message;
  EXPECT_NE(message.find("log creatinine"), std::string::npos) << message;
  Model power;
  Term t = term("x^0.5", "creat", TransformKind::Power, 1.0);
  t.power = 0.5;
  power.terms = {t};
  EXPECT_NE(messageOf([&] { linearPredictor(power, table, allRows(table)); }).find(":4:"),
            std::string::npos);
}

TEST(LinearPredictor, MissingColumnNamesFileTermAndColumn) {
  Model model;
  model.name = "demo";
  model.terms = {term("body mass", "bmi", TransformKind::Linear, 1.0)};
  const Table table = cohort();
  const std::string message = messageOf([&] { designMatrix(model, table, allRows(table)); });
  EXPECT_NE(message.find("cohort.csv"), std::string::npos) << message;
  EXPECT_NE(message.find("'body mass'"), std::string::npos) << message;
  EXPECT_NE(message.find("'bmi'"), std::string::npos) << message;
  model.sourcePath = "published.json";
  const std::string fromFile = messageOf([&] { designMatrix(model, table, allRows(table)); });
  EXPECT_NE(fromFile.find("model file published.json"), std::string::npos) << fromFile;
}

TEST(LinearPredictor, NumericTransformOfTextColumnNamesLineAndText) {
  Model model;
  model.terms = {term("sex linear", "sex", TransformKind::Linear, 1.0)};
  const Table table = cohort();
  const std::string message = messageOf([&] { designMatrix(model, table, allRows(table)); });
  EXPECT_NE(message.find("cohort.csv:2:"), std::string::npos) << message;
  EXPECT_NE(message.find("'female'"), std::string::npos) << message;
}

TEST(LinearPredictor, ColumnMappingRenamesVariables) {
  Model model;
  model.columnMapping["age_years"] = "age";
  model.terms = {term("age", "age_years", TransformKind::Linear, 2.0)};
  const Table table = cohort();
  EXPECT_EQ(requiredColumns(model), std::vector<std::string>{"age"});
  EXPECT_DOUBLE_EQ(linearPredictor(model, table, {1})[0], 90.0);
}

TEST(LinearPredictor, AbsentLevelGivesZerosAndNonNumericLevelOnNumericColumnFails) {
  Model model;
  Term unknown = term("sex=other", "sex", TransformKind::Indicator, 1.0);
  unknown.level = "other";
  model.terms = {unknown};
  model.referenceLevels = {{"sex", {"female", "male"}}};  // "other" is absent from the cohort
  const Table table = cohort();
  EXPECT_EQ(linearPredictor(model, table, allRows(table)), (std::vector<double>{0, 0, 0}));
  Term bad = term("grade=high", "grade", TransformKind::Indicator, 1.0);
  bad.level = "high";
  model.terms = {bad};
  EXPECT_THROW(linearPredictor(model, table, allRows(table)), InputError);
}

TEST(LinearPredictor, LogisticRiskIsStableAtExtremes) {
  EXPECT_DOUBLE_EQ(logisticRisk(0.0), 0.5);
  EXPECT_EQ(logisticRisk(-800.0), 0.0);
  EXPECT_EQ(logisticRisk(800.0), 1.0);
  EXPECT_GT(logisticRisk(-700.0), 0.0);  // e^-700 is representable
  EXPECT_NEAR(logisticRisk(-30.0) / std::exp(-30.0), 1.0, 1e-12);
  EXPECT_NEAR(logisticRisk(2.0) + logisticRisk(-2.0), 1.0, 4e-16);
}

}  // namespace
}  // namespace calivera
