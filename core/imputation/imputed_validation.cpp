#include "core/imputation/imputed_validation.h"

#include <algorithm>
#include <cmath>
#include <map>

#include "core/metrics/validation_run.h"
#include "core/sites/pooling_scale.h"
#include "core/sites/site_measures.h"
#include "core/util/errors.h"

namespace calivera {
namespace {

// One copy's estimate and within-imputation variance of `key` on its pooling scale; false with
// `problem` when it has none (an AUC of 0 or 1, no events).
bool estimateOf(const ValidationRun& run, const std::string& key, double& estimate,
                double& variance, std::string& problem) {
  const ValidationResult& r = run.result;
  const double n = static_cast<double>(r.cohort.n);
  if (key == "c_statistic") {
    const double auc = r.discrimination.auc;
    if (!(auc > 0.0 && auc < 1.0)) {
      problem = "a copy's c-statistic is 0 or 1: its logit and variance are not finite";
      return false;
    }
    estimate = std::log(auc / (1.0 - auc));
    const double se = r.discrimination.aucSe / (auc * (1.0 - auc));  // delta method
    variance = se * se;
  } else if (key == "oe_ratio") {
    const double observed = static_cast<double>(r.cohort.events);
    estimate = std::log(r.calibration.oeRatio);
    variance = 1.0 / observed - 1.0 / n;  // O binomial, E fixed
  } else if (key == "calibration_intercept") {
    estimate = r.calibration.intercept;
    variance = r.calibration.interceptSe * r.calibration.interceptSe;
  } else if (key == "calibration_slope") {
    estimate = r.calibration.slope;
    variance = r.calibration.slopeSe * r.calibration.slopeSe;
  } else {  // brier: mean squared error, variance of the squared errors over n
    const std::vector<double>& p = run.cohort.input.risk;
    const std::vector<double>& y = run.cohort.input.outcome;
    double sum = 0.0;
    for (std::size_t i = 0; i < p.size(); ++i) sum += (p[i] - y[i]) * (p[i] - y[i]);
    const double mean = sum / n;
    double squares = 0.0;
    for (std::size_t i = 0; i < p.size(); ++i) {
      const double e = (p[i] - y[i]) * (p[i] - y[i]) - mean;
      squares += e * e;
    }
    estimate = mean;
    variance = squares / (n - 1.0) / n;
  }
  if (!std::isfinite(estimate) || !std::isfinite(variance) || variance < 0.0) {
    problem = "a copy gives no finite estimate and variance";
    return false;
  }
  return true;
}

// Parameters of each measure's complete-data model, for nu_com = n - k.
double parametersOf(const std::string& key) {
  return key == "calibration_slope" ? 2.0 : 1.0;
}

PoolingScale scaleOf(const std::string& key) {
  if (key == "c_statistic") return PoolingScale::Logit;
  if (key == "oe_ratio") return PoolingScale::Log;
  return PoolingScale::Identity;
}

SpreadOverCopies spread(std::vector<double> values) {
  std::sort(values.begin(), values.end());
  const std::size_t m = values.size();
  const double median = m % 2 == 1 ? values[m / 2] : 0.5 * (values[m / 2 - 1] + values[m / 2]);
  return {values.front(), median, values.back()};
}

}  // namespace

ImputedValidation poolImputedRuns(const std::vector<ValidationRun>& runs, const std::string& column,
                                  const std::vector<long long>& indices) {
  if (runs.size() < 2) throw InputError("pooling imputations needs at least two copies");
  ImputedValidation out;
  out.column = column;
  out.indices = indices;
  const ValidationRun& first = runs.front();
  out.n = first.result.cohort.n;
  out.events = first.result.cohort.events;
  for (std::size_t i = 1; i < runs.size(); ++i) {
    if (runs[i].cohort.rows != first.cohort.rows) {
      throw InputError(runs[i].table->sourceName + ": imputation " + std::to_string(indices[i]) +
                       " analyses " + std::to_string(runs[i].result.cohort.n) +
                       " patients, imputation " + std::to_string(indices[0]) + " " +
                       std::to_string(out.n) +
                       ": a column the analysis needs is still missing in a copy (each copy "
                       "must be complete)");
    }
  }
  const double n = static_cast<double>(out.n);
  for (const char* keyText : kImputedMeasureKeys) {
    PooledImputedMeasure measure;
    measure.key = keyText;
    const PoolingScale scale = scaleOf(measure.key);
    measure.scale = poolingScaleName(scale);
    for (const ValidationRun& run : runs) {
      double estimate = 0.0, variance = 0.0;
      if (!estimateOf(run, measure.key, estimate, variance, measure.problem)) break;
      measure.perImputation.push_back(estimate);
      measure.perImputationVariance.push_back(variance);
    }
    if (measure.problem.empty()) {
      measure.rubin = poolByRubin(measure.perImputation, measure.perImputationVariance,
                                  n - parametersOf(measure.key));
      measure.estimate = toNaturalScale(scale, measure.rubin.estimate);
      measure.ci = toNaturalScale(scale, measure.rubin.ci);
    }
    out.pooled.push_back(std::move(measure));
  }

  std::vector<double> hl, hlP;
  for (const ValidationRun& run : runs) {
    hl.push_back(run.result.hosmerLemeshow.statistic);
    hlP.push_back(run.result.hosmerLemeshow.pValue);
  }
  out.hosmerLemeshowStatistic = spread(hl);
  out.hosmerLemeshowP = spread(hlP);
  out.hosmerLemeshowDf = first.result.hosmerLemeshow.df;

  // The calibration curve: the mean of the copies' curves at each grid risk they all reach.
  std::map<long long, std::pair<double, std::size_t>> curve;  // risk * 100 -> (sum, copies)
  for (const ValidationRun& run : runs) {
    for (const CalibrationCurvePoint& point :
         calibrationCurveOnGrid(run.result.calibration.curve)) {
      auto& entry = curve[std::llround(point.risk * 100.0)];
      entry.first += point.observed;
      ++entry.second;
    }
  }
  for (const auto& [percent, entry] : curve) {
    if (entry.second != runs.size()) continue;
    out.calibrationCurve.push_back(
        {static_cast<double>(percent) / 100.0, entry.first / static_cast<double>(runs.size())});
  }
  // The decision curve: every copy has the same thresholds (one request).
  out.decisionCurve = first.result.decisionCurve;
  for (std::size_t k = 0; k < out.decisionCurve.size(); ++k) {
    DecisionCurvePoint& mean = out.decisionCurve[k];
    mean.netBenefit = mean.standardizedNetBenefit = mean.interventionsAvoidedPer100 = 0.0;
    mean.netBenefitTreatAll = 0.0;
    for (const ValidationRun& run : runs) {
      const DecisionCurvePoint& p = run.result.decisionCurve.at(k);
      mean.netBenefit += p.netBenefit;
      mean.netBenefitTreatAll += p.netBenefitTreatAll;
      mean.standardizedNetBenefit += p.standardizedNetBenefit;
      mean.interventionsAvoidedPer100 += p.interventionsAvoidedPer100;
    }
    const double m = static_cast<double>(runs.size());
    mean.netBenefit /= m;
    mean.netBenefitTreatAll /= m;
    mean.standardizedNetBenefit /= m;
    mean.interventionsAvoidedPer100 /= m;
  }
  return out;
}

}  // namespace calivera
