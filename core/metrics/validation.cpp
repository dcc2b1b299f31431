// validate(): checks the input once, sorts the cohort once and hands the shared sorted order to
// every rank- and threshold-based metric. Each metric's method and source is in its own header.
#include "core/metrics/validation.h"

#include <algorithm>
#include <cmath>
#include <future>
#include <limits>
#include <sstream>

#include "core/metrics/auc_delong.h"
#include "core/metrics/calibration_regression.h"
#include "core/metrics/calibration_statistics.h"
#include "core/metrics/decision_curve.h"
#include "core/metrics/hosmer_lemeshow.h"
#include "core/metrics/loess_calibration.h"
#include "core/metrics/overall_metrics.h"
#include "core/metrics/risk_histogram.h"
#include "core/metrics/roc_curve.h"
#include "core/metrics/size_warnings.h"
#include "core/metrics/sorted_cohort.h"
#include "core/metrics/threshold_table.h"
#include "core/util/errors.h"
#include "core/util/parallel_size.h"

namespace calivera {
namespace {

// Risks of exactly 0 or 1 have an infinite logit; they enter the calibration fits clamped here.
constexpr double kRiskClamp = 1e-12;

std::string formatNumber(double value) {
  std::ostringstream out;
  out.precision(3);
  out << value;
  return out.str();
}

void checkInput(const ValidationInput& input, const ValidationOptions& options) {
  if (input.risk.size() != input.outcome.size()) {
    throw InputError("validation: " + std::to_string(input.risk.size()) + " risks but " +
                     std::to_string(input.outcome.size()) + " outcomes");
  }
  if (input.linearPredictor && input.linearPredictor->size() != input.risk.size()) {
    throw InputError("validation: linear predictor and risk sizes differ");
  }
  if (input.risk.empty()) throw AnalysisError("validation: no patients to analyse");
  for (std::size_t i = 0; i < input.risk.size(); ++i) {
    const double p = input.risk[i];
    if (!(p >= 0.0 && p <= 1.0)) {
      throw InputError("validation: risk of patient " + std::to_string(i + 1) + " (" +
                       formatNumber(p) + ") lies outside [0, 1]");
    }
    const double y = input.outcome[i];
    if (y != 0.0 && y != 1.0) {
      throw InputError("validation: outcome of patient " + std::to_string(i + 1) +
                       " is neither 0 nor 1");
    }
  }
  if (options.groups < 2) throw InputError("validation: at least 2 risk groups are needed");
  for (const double t : options.thresholds) {
    if (!(t > 0.0 && t < 1.0)) {
      throw InputError("validation: threshold " + formatNumber(t) +
                       " must lie strictly between 0 and 1");
    }
  }
}

void addSampleSizeWarnings(const CohortSummary& cohort, std::vector<std::string>& warnings) {
  for (std::string& w : sizeWarningTexts(cohort.events, cohort.n - cohort.events)) {
    warnings.push_back(std::move(w));
  }
}

std::vector<double> linearPredictorFor(const ValidationInput& input,
                                       std::vector<std::string>& warnings) {
  std::size_t atBounds = 0;
  for (const double p : input.risk) atBounds += (p == 0.0 || p == 1.0) ? 1 : 0;
  if (atBounds > 0) {
    warnings.push_back(std::to_string(atBounds) +
                       " predicted risks are exactly 0 or 1; such certainty is implausible for a "
                       "clinical model" +
                       std::string(input.linearPredictor
                                       ? ""
                                       : " (their logit is clamped at +/-" +
                                             formatNumber(std::log(1.0 / kRiskClamp)) +
                                             " for the calibration fits)"));
  }
  if (input.linearPredictor) return *input.linearPredictor;
  std::vector<double> lp(input.risk.size());
  for (std::size_t i = 0; i < lp.size(); ++i) {
    const double p = std::clamp(input.risk[i], kRiskClamp, 1.0 - kRiskClamp);
    lp[i] = std::log(p / (1.0 - p));
  }
  return lp;
}

// Van Calster et al. 2016's hierarchy, read from the intervals: mean calibration (intercept
// compatible with 0), weak (and slope compatible with 1); moderate is judged from the curve.
std::string hierarchyReading(const Calibration& c) {
  const bool mean = c.interceptCi.lo <= 0.0 && c.interceptCi.hi >= 0.0;
  const bool weak = c.slopeCi.lo <= 1.0 && c.slopeCi.hi >= 1.0;
  std::string text;
  if (!mean) {
    text = std::string("mean calibration not reached: predicted risks are on average too ") +
           (c.intercept > 0.0 ? "low" : "high");
  } else if (!weak) {
    text = std::string("mean calibration reached; weak calibration not reached: risks are too ") +
           (c.slope < 1.0 ? "extreme (slope < 1)" : "moderate (slope > 1)");
  } else {
    text = "mean and weak calibration reached (intercept compatible with 0, slope with 1)";
  }
  return text + "; judge moderate calibration from the curve (ICI " + formatNumber(c.ici) + ")";
}

}  // namespace

std::vector<double> thresholdRange(double from, double to, double step) {
  if (!(step > 0.0) || !std::isfinite(from) || !std::isfinite(to) || !std::isfinite(step)) {
    throw InputError("threshold range needs finite FROM, TO and a positive STEP");
  }
  if (to < from) throw InputError("threshold range: TO is below FROM");
  // The count comes from one division (with a small allowance for FROM/TO/STEP written in
  // decimal); each value is FROM + k STEP from k, never a running sum, and is snapped to the
  // nearest 12-decimal number so 0.01 + 6 * 0.01 is the same double as the literal 0.07.
  const double steps = std::floor((to - from) / step + 1e-9);
  if (steps + 1.0 > static_cast<double>(kMaxThresholdCount)) {
    throw InputError("threshold range: " + formatNumber(steps + 1.0) + " thresholds; at most " +
                     std::to_string(kMaxThresholdCount) + " are computed (use a larger STEP)");
  }
  const auto count = static_cast<long long>(steps);
  std::vector<double> values;
  values.reserve(static_cast<std::size_t>(count + 1));
  for (long long k = 0; k <= count; ++k) {
    const double value = from + static_cast<double>(k) * step;
    const double snapped = std::round(value * 1e12) / 1e12;
    values.push_back(std::abs(snapped - value) <= 1e-9 * step ? snapped : value);
  }
  return values;
}

ValidationResult validate(const ValidationInput& input, const ValidationOptions& givenOptions) {
  ValidationOptions options = givenOptions;
  if (options.thresholds.empty()) options.thresholds = thresholdRange(0.01, 0.99, 0.01);
  checkInput(input, options);
  ValidationResult r;
  const std::vector<double>& risk = input.risk;
  const std::vector<double>& y = input.outcome;

  r.cohort.n = risk.size();
  r.cohort.apparent = options.apparent;
  for (const double v : y) r.cohort.events += v > 0.5 ? 1 : 0;
  r.cohort.prevalence = static_cast<double>(r.cohort.events) / static_cast<double>(r.cohort.n);
  if (r.cohort.events == 0 || r.cohort.events == r.cohort.n) {
    throw AnalysisError(std::string("validation: only one outcome class present (all ") +
                        (r.cohort.events == 0 ? "non-events" : "events") +
                        "); discrimination and calibration are undefined");
  }
  addSampleSizeWarnings(r.cohort, r.warnings);
  const std::vector<double> lp = linearPredictorFor(input, r.warnings);
  reportProgress(options.progress, 0.05);

  const SortedCohort sorted = sortCohort(risk, y);
  // On a large cohort the loess curve is computed on its own thread while discrimination and the
  // calibration fits run on this one (issue 13); nothing is shared but the const sorted cohort,
  // so the numbers are the same either way.
  LoessOptions loessOptions;
  loessOptions.exactMaxN = options.loessExactMaxN;
  loessOptions.gridPoints = options.loessGridPoints;
  std::future<LoessCalibration> loessJob;
  if (risk.size() >= kParallelFromPatients) {
    loessJob = std::async(std::launch::async, [&sorted, &loessOptions] {
      return loessCalibration(sorted, loessOptions);
    });
  }
  reportProgress(options.progress, 0.25);

  const AucEstimate auc = aucWithDelong(sorted);
  r.discrimination.auc = auc.auc;
  r.discrimination.aucSe = auc.se;
  r.discrimination.aucCi = auc.ciLogit;
  r.discrimination.aucCiPlain = auc.ciPlain;
  if (auc.varianceIncomplete) {
    // With one event (or non-event) the DeLong variance lacks a term it cannot estimate: the
    // interval would look like evidence it is not, so there is none ("not defined").
    constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
    r.discrimination.aucSe = kNaN;
    r.discrimination.aucCi = Interval{kNaN, kNaN};
    r.discrimination.aucCiPlain = Interval{kNaN, kNaN};
    r.warnings.push_back(
        "AUC interval not estimable: with a single event or a single non-event the DeLong "
        "variance cannot be estimated, so no standard error or 95% CI is given");
  }
  r.discrimination.discriminationSlope = discriminationSlope(risk, y);
  r.discrimination.roc = thinRocCurve(rocCurve(sorted), options.rocMaxPoints);
  r.overall = brierScores(risk, y);
  reportProgress(options.progress, 0.35);

  Calibration& c = r.calibration;
  const CalibrationFit fit = calibrationRegression(lp, y);
  c.intercept = fit.intercept;
  c.interceptSe = fit.interceptSe;
  c.interceptCi = fit.interceptCi;
  c.slope = fit.slope;
  c.slopeSe = fit.slopeSe;
  c.slopeCi = fit.slopeCi;
  c.slopeModelIntercept = fit.slopeModelIntercept;
  r.warnings.insert(r.warnings.end(), fit.warnings.begin(), fit.warnings.end());
  const ObservedExpected oe = observedExpected(risk, y);
  c.oeRatio = oe.ratio;
  c.oeCi = oe.ci;
  const SpiegelhalterTest spiegel = spiegelhalter(risk, y);
  c.spiegelhalterZ = spiegel.z;
  c.spiegelhalterP = spiegel.pValue;
  if (std::isnan(spiegel.z)) r.warnings.push_back("Spiegelhalter z undefined: zero variance");
  reportProgress(options.progress, 0.55);

  const LoessCalibration loess =
      loessJob.valid() ? loessJob.get() : loessCalibration(sorted, loessOptions);
  if (loess.available) {
    c.ici = loess.ici;
    c.e50 = loess.e50;
    c.e90 = loess.e90;
    c.emax = loess.emax;
    c.curveInterpolated = loess.interpolated;
    c.curve = loess.curve;
    if (loess.interpolated) {
      r.warnings.push_back("calibration curve: exact loess fits at " +
                           std::to_string(options.loessGridPoints) +
                           " risk quantiles, linearly interpolated between them (n > " +
                           std::to_string(options.loessExactMaxN) + ")");
    }
    if (loess.pseudoInverseUsed) {
      r.warnings.push_back("calibration curve: some local fits were singular (pseudo-inverse)");
    }
  } else {
    const double nan = std::numeric_limits<double>::quiet_NaN();
    c.ici = c.e50 = c.e90 = c.emax = nan;
    r.warnings.push_back("calibration curve unavailable: " + loess.problem);
  }
  c.hierarchyLevel = hierarchyReading(c);
  reportProgress(options.progress, 0.8);

  r.hosmerLemeshow = hosmerLemeshow(sorted, options.groups, options.apparent, r.warnings);
  c.groups = r.hosmerLemeshow.groups;
  r.decisionCurve = decisionCurve(sorted, options.thresholds);
  r.thresholds = thresholdTable(sorted, options.thresholds);
  r.distribution = riskHistogram(risk, y, options.histogramBins);
  reportProgress(options.progress, 1.0);
  return r;
}

}  // namespace calivera
