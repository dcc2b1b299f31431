// Model updating and closed testing on birthwt (r-cran-mass) against R's glm
// (tests/reference/scripts/birthwt_update.R -> tests/reference/data/birthwt_update.json), and
// the defining property of each update: re-validated on the same cohort, logistic recalibration
// gives calibration slope 1 and intercept 0, the intercept update calibration-in-the-large 0.
#include "core/uncertainty/model_update.h"

#include <gtest/gtest.h>

#include <fstream>
#include <nlohmann/json.hpp>

#include "core/data/cohort.h"
#include "core/data/csv_reader.h"
#include "core/metrics/validation.h"
#include "core/model/linear_predictor.h"
#include "core/model/model_io.h"
#include "tests/reference/reference_csv.h"

namespace calivera {
namespace {

constexpr double kDevianceTolerance = 1e-8;     // both sides converge to machine precision
constexpr double kCoefficientTolerance = 1e-7;  // relative
constexpr double kCalibrationTolerance = 1e-8;  // the requirement

Term linear(const std::string& column) {
  Term t;
  t.name = column;
  t.variable = column;
  return t;
}

Term indicator(const std::string& column, const std::string& level) {
  Term t;
  t.name = column + " " + level;
  t.variable = column;
  t.kind = TransformKind::Indicator;
  t.level = level;
  return t;
}

// The published model (docs/methods.md, memory), optionally distorted to c + k * LP.
Model publishedModel(double c = 0.0, double k = 1.0) {
  Model m;
  m.name = "birthwt published";
  m.outcome = "low";
  m.intercept.coefficient = c + k * 1.295;
  m.terms = {linear("age"), linear("lwt"), indicator("race", "black"), indicator("race", "other"),
             linear("ftv")};
  const double b[] = {-0.024, -0.014, 1.004, 0.433, -0.049};
  for (std::size_t t = 0; t < m.terms.size(); ++t) m.terms[t].estimate.coefficient = k * b[t];
  return m;
}

struct Birthwt {
  Table table;
  UpdateData data;
};

Birthwt loadBirthwt() {
  Birthwt b;
  b.table = readCsvFile(testing::referencePath("birthwt.csv"), {}).table;
  const AnalysisRows rows = selectCompleteCases(b.table, {"low", "age", "lwt", "race", "ftv"});
  b.data.rows = rows.rows;
  b.data.outcome = outcomeValues(b.table, {"low", std::nullopt}, rows.rows);
  b.data.dataSha256 = "0123abcd";
  b.data.dataName = "birthwt.csv";
  return b;
}

nlohmann::json reference() {
  std::ifstream in(testing::referencePath("birthwt_update.json"));
  return nlohmann::json::parse(in);
}

ValidationResult revalidate(const Model& model, const Birthwt& b) {
  ValidationInput input;
  input.outcome = b.data.outcome;
  input.linearPredictor = linearPredictor(model, b.table, b.data.rows);
  for (double lp : *input.linearPredictor) input.risk.push_back(logisticRisk(lp));
  return validate(input, {});
}

TEST(ModelUpdate, UpdatesMatchRGlmOnBirthwt) {
  Birthwt b = loadBirthwt();
  b.data.table = &b.table;
  ASSERT_EQ(b.data.rows.size(), 189u);
  const auto ref = reference();
  const Model model = publishedModel();
  const UpdatedModel none = updateModel(model, b.data, UpdateMethod::None, {});
  EXPECT_NEAR(none.deviance, ref["deviance_original"].get<double>(), kDevianceTolerance);
  const UpdatedModel intercept = updateModel(model, b.data, UpdateMethod::Intercept, {});
  EXPECT_NEAR(intercept.recalibrationIntercept, ref["intercept_update_a"].get<double>(), 1e-9);
  EXPECT_NEAR(intercept.deviance, ref["deviance_intercept"].get<double>(), kDevianceTolerance);
  const UpdatedModel recalibrated = updateModel(model, b.data, UpdateMethod::Recalibrate, {});
  EXPECT_NEAR(recalibrated.recalibrationIntercept, ref["recalibration_a"].get<double>(), 1e-9);
  EXPECT_NEAR(recalibrated.recalibrationSlope, ref["recalibration_b"].get<double>(), 1e-9);
  EXPECT_NEAR(recalibrated.deviance, ref["deviance_recalibrate"].get<double>(), kDevianceTolerance);
  const UpdatedModel refit = updateModel(model, b.data, UpdateMethod::Refit, {});
  EXPECT_NEAR(refit.deviance, ref["deviance_refit"].get<double>(), kDevianceTolerance);
  const auto coefficients = ref["refit_coefficients"].get<std::vector<double>>();
  EXPECT_LT(testing::relativeDifference(refit.model.intercept.coefficient, coefficients[0]),
            kCoefficientTolerance);
  for (std::size_t t = 0; t < refit.model.terms.size(); ++t) {
    EXPECT_LT(
        testing::relativeDifference(refit.model.terms[t].estimate.coefficient, coefficients[t + 1]),
        kCoefficientTolerance)
        << refit.model.terms[t].name;
  }
  EXPECT_EQ(refit.model.development.n, 189);
  EXPECT_EQ(refit.model.development.dataSha256, "0123abcd");
}

TEST(ModelUpdate, ClosedTestMatchesRAndPicksTheLeastSufficientUpdate) {
  Birthwt b = loadBirthwt();
  b.data.table = &b.table;
  const auto ref = reference();
  const ClosedTestResult published = closedTest(publishedModel(), b.data, 0.05, {});
  EXPECT_EQ(published.suggested, UpdateMethod::None);
  const auto lr = ref["lr_original_vs_refit"].get<std::vector<double>>();
  ASSERT_FALSE(published.steps.empty());
  EXPECT_NEAR(published.steps[0].lrStatistic, lr[0], kDevianceTolerance);
  EXPECT_EQ(published.steps[0].df, 6);
  for (const char* scenario : {"distorted_intercept", "distorted_slope"}) {
    const auto& s = ref[scenario];
    const Model model = publishedModel(s["c"].get<double>(), s["k"].get<double>());
    const ClosedTestResult result = closedTest(model, b.data, 0.05, {});
    EXPECT_NEAR(result.devianceOriginal, s["deviance_original"].get<double>(), kDevianceTolerance);
    EXPECT_NEAR(result.devianceIntercept, s["deviance_intercept"].get<double>(),
                kDevianceTolerance);
    EXPECT_NEAR(result.devianceRecalibrated, s["deviance_recalibrate"].get<double>(),
                kDevianceTolerance);
    const auto p = s["lr_p_values"].get<std::vector<double>>();
    for (std::size_t k = 0; k < result.steps.size(); ++k) {
      EXPECT_NEAR(result.steps[k].pValue, p[k], 1e-9) << scenario << " step " << k;
    }
    EXPECT_STREQ(updateMethodName(result.suggested), s["suggested"].get<std::string>().c_str())
        << scenario;
  }
}

TEST(ModelUpdate, RecalibratedModelRevalidatesWithSlopeOneAndInterceptZero) {
  Birthwt b = loadBirthwt();
  b.data.table = &b.table;
  const Model distorted = publishedModel(0.5, 2.5);
  const ValidationResult before = revalidate(distorted, b);
  EXPECT_GT(std::fabs(before.calibration.slope - 1.0), 0.3);
  const UpdatedModel recalibrated = updateModel(distorted, b.data, UpdateMethod::Recalibrate, {});
  const ValidationResult after = revalidate(recalibrated.model, b);
  EXPECT_NEAR(after.calibration.slope, 1.0, kCalibrationTolerance);
  EXPECT_NEAR(after.calibration.slopeModelIntercept, 0.0, kCalibrationTolerance);
  EXPECT_NEAR(after.calibration.intercept, 0.0, kCalibrationTolerance);

  const UpdatedModel intercept = updateModel(distorted, b.data, UpdateMethod::Intercept, {});
  const ValidationResult shifted = revalidate(intercept.model, b);
  EXPECT_NEAR(shifted.calibration.intercept, 0.0, kCalibrationTolerance);
  EXPECT_NEAR(shifted.calibration.oeRatio, 1.0, kCalibrationTolerance);
}

TEST(ModelUpdate, UpdatedModelIsAPlainModelFileWithProvenance) {
  Birthwt b = loadBirthwt();
  b.data.table = &b.table;
  const UpdatedModel recalibrated =
      updateModel(publishedModel(0.5, 2.5), b.data, UpdateMethod::Recalibrate, {});
  ASSERT_TRUE(recalibrated.model.provenance);
  EXPECT_NE(recalibrated.model.provenance->find("0123abcd"), std::string::npos);
  EXPECT_NE(recalibrated.model.provenance->find("recalibration"), std::string::npos);
  EXPECT_NE(recalibrated.model.provenance->find("birthwt published"), std::string::npos);
  const Model back = parseModelJson(modelToJson(recalibrated.model), "round trip");
  EXPECT_EQ(back.provenance, recalibrated.model.provenance);
  EXPECT_EQ(linearPredictor(back, b.table, b.data.rows),
            linearPredictor(recalibrated.model, b.table, b.data.rows));
}

TEST(ModelUpdate, MethodNamesParse) {
  EXPECT_EQ(parseUpdateMethod("recalibrate"), UpdateMethod::Recalibrate);
  EXPECT_EQ(parseUpdateMethod("intercept"), UpdateMethod::Intercept);
  EXPECT_EQ(parseUpdateMethod("refit"), UpdateMethod::Refit);
  EXPECT_FALSE(parseUpdateMethod("none"));
  EXPECT_FALSE(parseUpdateMethod("Refit"));
}

}  // namespace
}  // namespace calivera
