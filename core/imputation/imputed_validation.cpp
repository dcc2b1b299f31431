#include "core/imputation/imputed_validation.h"

#include <algorithm>
#include <cmath>
#include <iterator>
#include <map>
#include <sstream>

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

CopyMeasures copyMeasures(const ValidationRun& run, long long index) {
  CopyMeasures copy;
  copy.index = index;
  copy.n = run.result.cohort.n;
  copy.events = run.result.cohort.events;
  for (std::size_t k = 0; k < std::size(kImputedMeasureKeys); ++k) {
    if (!estimateOf(run, kImputedMeasureKeys[k], copy.estimates[k], copy.variances[k],
                    copy.problems[k])) {
      copy.estimates[k] = copy.variances[k] = PooledImputedMeasure::kNaN;
    }
  }
  copy.hosmerLemeshowStatistic = run.result.hosmerLemeshow.statistic;
  copy.hosmerLemeshowP = run.result.hosmerLemeshow.pValue;
  copy.hosmerLemeshowDf = run.result.hosmerLemeshow.df;
  copy.calibrationCurve = calibrationCurveOnGrid(run.result.calibration.curve);
  copy.decisionCurve = run.result.decisionCurve;
  return copy;
}

ImputedValidation poolImputedCopies(const std::vector<CopyMeasures>& copies,
                                    const std::string& column) {
  if (copies.size() < 2) throw InputError("pooling imputations needs at least two copies");
  ImputedValidation out;
  out.column = column;
  const CopyMeasures& first = copies.front();
  for (const CopyMeasures& copy : copies) out.indices.push_back(copy.index);
  out.n = first.n;
  out.events = first.events;
  const double n = static_cast<double>(out.n);
  for (std::size_t k = 0; k < std::size(kImputedMeasureKeys); ++k) {
    PooledImputedMeasure measure;
    measure.key = kImputedMeasureKeys[k];
    const PoolingScale scale = scaleOf(measure.key);
    measure.scale = poolingScaleName(scale);
    for (const CopyMeasures& copy : copies) {
      if (!copy.problems[k].empty()) {
        measure.problem = copy.problems[k] + " (imputation " + std::to_string(copy.index) + ")";
        break;
      }
      measure.perImputation.push_back(copy.estimates[k]);
      measure.perImputationVariance.push_back(copy.variances[k]);
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
  for (const CopyMeasures& copy : copies) {
    hl.push_back(copy.hosmerLemeshowStatistic);
    hlP.push_back(copy.hosmerLemeshowP);
  }
  out.hosmerLemeshowStatistic = spread(hl);
  out.hosmerLemeshowP = spread(hlP);
  out.hosmerLemeshowDf = first.hosmerLemeshowDf;

  // The calibration curve: the mean of the copies' curves at each grid risk they all reach.
  std::map<long long, std::pair<double, std::size_t>> curve;  // risk * 100 -> (sum, copies)
  for (const CopyMeasures& copy : copies) {
    for (const CalibrationCurvePoint& point : copy.calibrationCurve) {
      auto& entry = curve[std::llround(point.risk * 100.0)];
      entry.first += point.observed;
      ++entry.second;
    }
  }
  const double m = static_cast<double>(copies.size());
  for (const auto& [percent, entry] : curve) {
    if (entry.second != copies.size()) continue;
    out.calibrationCurve.push_back({static_cast<double>(percent) / 100.0, entry.first / m});
  }
  // The decision curve: every copy has the same thresholds (one request).
  out.decisionCurve = first.decisionCurve;
  for (std::size_t t = 0; t < out.decisionCurve.size(); ++t) {
    DecisionCurvePoint& mean = out.decisionCurve[t];
    mean.netBenefit = mean.netBenefitTreatAll = 0.0;
    mean.standardizedNetBenefit = mean.interventionsAvoidedPer100 = 0.0;
    for (const CopyMeasures& copy : copies) {
      const DecisionCurvePoint& p = copy.decisionCurve.at(t);
      mean.netBenefit += p.netBenefit;
      mean.netBenefitTreatAll += p.netBenefitTreatAll;
      mean.standardizedNetBenefit += p.standardizedNetBenefit;
      mean.interventionsAvoidedPer100 += p.interventionsAvoidedPer100;
    }
    mean.netBenefit /= m;
    mean.netBenefitTreatAll /= m;
    mean.standardizedNetBenefit /= m;
    mean.interventionsAvoidedPer100 /= m;
  }
  return out;
}

std::string imputationMethodText(const std::string& key) {
  if (key == "predictive_mean_matching") return "predictive mean matching";
  if (key == "logistic") return "logistic regression";
  if (key == "multinomial") return "multinomial regression";
  return key;
}

std::string imputedCopiesSentence(const ImputedValidation& imputed) {
  std::ostringstream out;
  if (imputed.column.empty()) {
    out << "Pooled over " << imputed.indices.size() << " copies imputed by chained equations ("
        << imputed.iterations << " iterations, seed " << imputed.seed << "; ";
    bool first = true;
    for (const ImputedColumnRecord& c : imputed.imputedColumns) {
      out << (first ? "" : ", ") << c.column << ": " << c.missing << " values by "
          << imputationMethodText(c.method);
      first = false;
    }
    out << "), " << imputed.n << " patients each; Rubin's rules, Barnard-Rubin df";
  } else {
    out << "Pooled over " << imputed.indices.size() << " imputed copies (column '" << imputed.column
        << "', " << imputed.n << " patients each; Rubin's rules, "
        << "Barnard-Rubin df)";
  }
  return out.str();
}

}  // namespace calivera
