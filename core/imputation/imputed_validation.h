#pragma once
// Validation over m imputed copies of a cohort, pooled by Rubin's rules (core/imputation/
// rubin_rules.h) on the scale where each measure is closest to normal (Marshall et al., BMC Med
// Res Methodol 2009; Wood, Royston & White, Biom J 2015): the c-statistic on the logit scale
// (DeLong variance by the delta method), O/E on the log scale (variance 1/O - 1/n), calibration
// intercept and slope as they are (their model-based variances) and the Brier score as it is
// (variance: the sample variance of the squared errors over n, common practice). The calibration
// curve and the decision curve are averaged over the copies; Hosmer-Lemeshow is not an estimate
// and is reported per copy (smallest, median, largest), never pooled.

#include <cstddef>
#include <cstdint>
#include <iterator>
#include <limits>
#include <string>
#include <vector>

#include "core/imputation/rubin_rules.h"
#include "core/metrics/validation.h"

namespace calivera {

struct ValidationRun;

// The pooled measures, in the order they are reported (JSON pooled.<key>).
inline constexpr const char* kImputedMeasureKeys[] = {
    "c_statistic", "oe_ratio", "calibration_intercept", "calibration_slope", "brier"};

struct PooledImputedMeasure {
  static constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
  std::string key;
  std::string scale;                          // "logit", "log" or "identity"
  std::string problem;                        // why it is not pooled; empty when it is
  RubinPooled rubin;                          // on `scale`
  double estimate = kNaN;                     // back on the measure's own scale
  Interval ci{kNaN, kNaN};                    // 95%, back on the measure's own scale
  std::vector<double> perImputation;          // on `scale`
  std::vector<double> perImputationVariance;  // within-imputation, on `scale`
};

struct SpreadOverCopies {
  double smallest = 0.0, median = 0.0, largest = 0.0;
};

// A column imputed by chained equations, and how.
struct ImputedColumnRecord {
  std::string column;
  std::string method;       // imputationMethodKey (core/imputation/chained_equations.h)
  std::size_t missing = 0;  // patients with a known outcome whose value was imputed
};

struct ImputedValidation {
  std::string method = "imputed_elsewhere";  // or "chained_equations"
  std::string column;                        // the imputation column; empty for chained equations
  // Chained equations only: the settings and the columns imputed.
  int iterations = 0;
  std::uint64_t seed = 0;
  int donors = 0;
  std::vector<ImputedColumnRecord> imputedColumns;
  std::vector<long long> indices;  // the copies' numbers
  std::size_t n = 0;               // patients analysed in every copy
  std::size_t events = 0;
  std::vector<PooledImputedMeasure> pooled;  // kImputedMeasureKeys order
  SpreadOverCopies hosmerLemeshowStatistic, hosmerLemeshowP;
  int hosmerLemeshowDf = 0;
  // Averages over the copies: the calibration curve at risks 0.01..0.99 where every copy's curve
  // reaches, and the decision curve at the run's thresholds.
  std::vector<CalibrationCurvePoint> calibrationCurve;
  std::vector<DecisionCurvePoint> decisionCurve;
};

// What pooling needs from one copy's validation (kept instead of the whole run, so memory does
// not grow with m): each measure and its within-imputation variance on its pooling scale (or why
// there is none), Hosmer-Lemeshow, the calibration curve on the 0.01 grid, the decision curve.
struct CopyMeasures {
  long long index = 0;
  std::size_t n = 0, events = 0;
  double estimates[std::size(kImputedMeasureKeys)] = {};
  double variances[std::size(kImputedMeasureKeys)] = {};
  std::string problems[std::size(kImputedMeasureKeys)];
  double hosmerLemeshowStatistic = 0.0, hosmerLemeshowP = 0.0;
  int hosmerLemeshowDf = 0;
  std::vector<CalibrationCurvePoint> calibrationCurve;
  std::vector<DecisionCurvePoint> decisionCurve;
};

// How the copies were made and pooled, one sentence without a final full stop ("Pooled over 20
// copies imputed by chained equations (10 iterations, seed 1; glu: 5 by predictive mean
// matching), 300 patients each; Rubin's rules, Barnard-Rubin df").
std::string imputedCopiesSentence(const ImputedValidation& imputed);

// "predictive mean matching", "logistic regression" or "multinomial regression".
std::string imputationMethodText(const std::string& methodKey);

CopyMeasures copyMeasures(const ValidationRun& run, long long index);

// At least two copies, each analysing the same patients (the caller checks).
ImputedValidation poolImputedCopies(const std::vector<CopyMeasures>& copies,
                                    const std::string& column);

}  // namespace calivera
