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

struct ImputedValidation {
  std::string method = "imputed_elsewhere";
  std::string column;              // the imputation column
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

// `runs`: one validation per imputed copy (at least two, each analysing the same patients).
// Throws InputError when a copy analyses other rows than the first (a predictor still missing).
ImputedValidation poolImputedRuns(const std::vector<ValidationRun>& runs, const std::string& column,
                                  const std::vector<long long>& indices);

}  // namespace calivera
