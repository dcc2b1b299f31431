// validate() against base R on the Wisconsin diagnostic breast-cancer data (Debian python3-sklearn
// CSV): a glm fitted in R on half the patients, applied to the other half. Reference values come
// from tests/reference/scripts/breast_cancer_validation.R (R 4.2.2: glm, loess, quantile type 7,
// cut, prop.test, and the DeLong 1988 placement values written out by definition), stored in
// tests/reference/data/.
#include <gtest/gtest.h>

#include <cmath>
#include <map>
#include <string>

#include "core/data/csv_reader.h"
#include "core/metrics/loess_calibration.h"
#include "core/metrics/sorted_cohort.h"
#include "core/metrics/validation.h"

namespace calivera {
namespace {

// Named tolerances. Rank and closed-form statistics agree to rounding; glm stops at R's default
// relative deviance change 1e-8, so its estimates differ from a fully converged fit at ~1e-7;
// loess: R's QR/pseudo-inverse local solve versus our scaled normal equations.
constexpr double kClosedForm = 1e-12;
constexpr double kGlm = 1e-6;
constexpr double kLoess = 1e-9;
constexpr double kChiSquare = 1e-9;

const std::string kData = std::string(CALIVERA_SOURCE_DIR) + "/tests/reference/data/";

std::map<std::string, double> readReference() {
  const Table t = readCsvFile(kData + "breast_cancer_validation_r.csv", {}).table;
  std::map<std::string, double> values;
  const Column& names = t.require("name");
  const Column& numbers = t.requireNumeric("value");
  for (std::size_t i = 0; i < t.rowCount; ++i) {
    values[names.levels[static_cast<std::size_t>(names.codes[i])]] = numbers.numbers[i];
  }
  return values;
}

ValidationInput readPredictions() {
  const Table t = readCsvFile(kData + "breast_cancer_validation_predictions.csv", {}).table;
  ValidationInput input;
  input.outcome = t.requireNumeric("outcome").numbers;
  input.risk = t.requireNumeric("risk").numbers;
  input.linearPredictor = t.requireNumeric("lp").numbers;
  return input;
}

class BreastCancerValidation : public ::testing::Test {
 protected:
  static void SetUpTestSuite() {
    reference_ = new std::map<std::string, double>(readReference());
    ValidationOptions options;
    options.thresholds = {0.1, 0.2, 0.3, 0.5};
    result_ = new ValidationResult(validate(readPredictions(), options));
  }
  static void TearDownTestSuite() {
    delete reference_;
    delete result_;
  }
  static double ref(const std::string& name) {
    const auto it = reference_->find(name);
    EXPECT_NE(it, reference_->end()) << name;
    return it == reference_->end() ? std::nan("") : it->second;
  }
  static std::map<std::string, double>* reference_;
  static ValidationResult* result_;
};
std::map<std::string, double>* BreastCancerValidation::reference_ = nullptr;
ValidationResult* BreastCancerValidation::result_ = nullptr;

TEST_F(BreastCancerValidation, CohortAndDiscrimination) {
  const ValidationResult& r = *result_;
  EXPECT_EQ(r.cohort.n, static_cast<std::size_t>(ref("n")));
  EXPECT_EQ(r.cohort.events, static_cast<std::size_t>(ref("events")));
  EXPECT_NEAR(r.discrimination.auc, ref("auc"), kClosedForm);       // R: Mann-Whitney from rank()
  EXPECT_NEAR(r.discrimination.aucSe, ref("auc_se"), kClosedForm);  // R: DeLong 1988 by definition
  EXPECT_NEAR(r.discrimination.aucCi.lo, ref("auc_ci_lo"), kClosedForm);
  EXPECT_NEAR(r.discrimination.aucCi.hi, ref("auc_ci_hi"), kClosedForm);
  EXPECT_NEAR(r.discrimination.discriminationSlope, ref("discrimination_slope"), kClosedForm);
}

TEST_F(BreastCancerValidation, BrierOeSpiegelhalter) {
  const ValidationResult& r = *result_;
  EXPECT_NEAR(r.overall.brier, ref("brier"), kClosedForm);
  EXPECT_NEAR(r.overall.brierScaled, ref("brier_scaled"), kClosedForm);
  EXPECT_NEAR(r.calibration.oeRatio, ref("oe_ratio"), kClosedForm);
  EXPECT_NEAR(r.calibration.spiegelhalterZ, ref("spiegelhalter_z"), kClosedForm);
  EXPECT_NEAR(r.calibration.spiegelhalterP, ref("spiegelhalter_p"), kClosedForm);  // R pnorm
}

TEST_F(BreastCancerValidation, CalibrationInterceptAndSlopeMatchGlm) {
  const Calibration& c = result_->calibration;
  EXPECT_NEAR(c.intercept, ref("intercept"), kGlm);  // glm(y ~ offset(lp), binomial)
  EXPECT_NEAR(c.interceptSe, ref("intercept_se"), kGlm);
  EXPECT_NEAR(c.slope, ref("slope"), kGlm);  // glm(y ~ lp, binomial)
  EXPECT_NEAR(c.slopeSe, ref("slope_se"), kGlm);
  EXPECT_NEAR(c.slopeModelIntercept, ref("slope_model_intercept"), kGlm);
}

TEST_F(BreastCancerValidation, LoessCalibrationErrorsMatchR) {
  const Calibration& c = result_->calibration;
  EXPECT_FALSE(c.curveInterpolated);
  EXPECT_NEAR(c.ici, ref("ici"), kLoess);  // loess(degree 2, span 0.75, surface "direct")
  EXPECT_NEAR(c.e50, ref("e50"), kLoess);
  EXPECT_NEAR(c.e90, ref("e90"), kLoess);
  EXPECT_NEAR(c.emax, ref("emax"), kLoess);
}

TEST_F(BreastCancerValidation, HosmerLemeshowGroupsAndWilsonIntervals) {
  const HosmerLemeshow& hl = result_->hosmerLemeshow;
  ASSERT_EQ(hl.groups.size(), static_cast<std::size_t>(ref("hl_groups")));
  EXPECT_NEAR(hl.statistic, ref("hl_statistic"), kChiSquare);
  EXPECT_EQ(hl.df, static_cast<int>(ref("hl_groups")));      // new data: df = groups
  EXPECT_NEAR(hl.pValue, ref("hl_p_new_data"), kChiSquare);  // R pchisq
  for (std::size_t k = 0; k < hl.groups.size(); ++k) {
    const std::string g = "group" + std::to_string(k + 1) + "_";
    EXPECT_EQ(hl.groups[k].n, static_cast<std::size_t>(ref(g + "n")));
    EXPECT_EQ(hl.groups[k].observed, static_cast<std::size_t>(ref(g + "observed")));
    EXPECT_NEAR(hl.groups[k].expected, ref(g + "expected"), kClosedForm * 100);
    // R prop.test(correct = FALSE): the Wilson score interval.
    EXPECT_NEAR(hl.groups[k].observedCi.lo, ref(g + "ci_lo"), kClosedForm * 100);
    EXPECT_NEAR(hl.groups[k].observedCi.hi, ref(g + "ci_hi"), kClosedForm * 100);
  }
}

TEST_F(BreastCancerValidation, ApparentHosmerLemeshowUsesGroupsMinusTwo) {
  ValidationOptions options;
  options.apparent = true;
  const ValidationResult r = validate(readPredictions(), options);
  EXPECT_EQ(r.hosmerLemeshow.df, static_cast<int>(ref("hl_groups")) - 2);
  EXPECT_NEAR(r.hosmerLemeshow.pValue, ref("hl_p_apparent"), kChiSquare);
}

TEST_F(BreastCancerValidation, NetBenefitAndThresholdTable) {
  const char* labels[] = {"0.10", "0.20", "0.30", "0.50"};
  for (int i = 0; i < 4; ++i) {
    const std::string t = labels[i];
    EXPECT_NEAR(result_->decisionCurve[i].netBenefit, ref("nb_" + t), kClosedForm) << t;
    EXPECT_NEAR(result_->decisionCurve[i].netBenefitTreatAll, ref("nb_all_" + t), kClosedForm);
    EXPECT_NEAR(result_->decisionCurve[i].interventionsAvoidedPer100, ref("avoided_" + t),
                kClosedForm * 1000);
    EXPECT_NEAR(result_->thresholds[i].sensitivity, ref("sensitivity_" + t), kClosedForm);
    EXPECT_NEAR(result_->thresholds[i].specificity, ref("specificity_" + t), kClosedForm);
  }
}

// R's loess with risks rounded to 2 decimals: many ties, including ties at the q-th nearest
// distance, and fit points at both boundaries.
TEST(BreastCancerLoess, FittedValuesWithHeavyTiesMatchR) {
  const Table t = readCsvFile(kData + "breast_cancer_loess_ties_r.csv", {}).table;
  const std::vector<double>& risk = t.requireNumeric("risk").numbers;
  const std::vector<double>& y = t.requireNumeric("outcome").numbers;
  const std::vector<double>& fitted = t.requireNumeric("fitted").numbers;
  const SortedCohort sorted = sortCohort(risk, y);
  const LoessCalibration loess = loessCalibration(sorted, LoessOptions{});
  ASSERT_TRUE(loess.available);
  for (std::size_t i = 0; i < sorted.size(); ++i) {
    EXPECT_NEAR(loess.smoothed[i], fitted[sorted.order[i]], kLoess) << "risk " << sorted.risk[i];
  }
}

}  // namespace
}  // namespace calivera
