#include "core/uncertainty/optimism.h"

#include <cmath>
#include <limits>
#include <sstream>

#include "core/metrics/loess_calibration.h"
#include "core/metrics/sorted_cohort.h"
#include "core/metrics/validation.h"
#include "core/model/linear_predictor.h"
#include "core/uncertainty/weighted_metrics.h"
#include "core/util/errors.h"

namespace calivera {
namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
const char* const kMeasureNames[] = {"AUC", "calibration slope", "calibration intercept", "Brier",
                                     "ICI"};

std::string fitFailure(const FitResult& fit) {
  switch (fit.problem) {
    case FitProblem::CompleteSeparation:
      return "complete separation";
    case FitProblem::QuasiSeparation:
      return "quasi-complete separation";
    case FitProblem::RankDeficient:
      return "rank-deficient design (constant or collinear columns)";
    case FitProblem::NotConverged:
      return "the fit did not converge";
    case FitProblem::None:
      break;
  }
  return fit.converged ? "" : "the fit did not converge";
}

bool fitUsable(const FitResult& fit) {
  return fit.converged && fit.problem == FitProblem::None;
}

std::vector<double> toStd(const Eigen::VectorXd& v) {
  return {v.data(), v.data() + v.size()};
}

// ICI of risks expit(lp) under weights (expanded into copies): the loess calibration curve
// exactly as validate() computes it (the same sorted cohort and options), without the rest of a
// validation (issue 13: AUC with DeLong, ROC, calibration fits, Hosmer-Lemeshow and the decision
// curve were computed twice per replicate only to be discarded).
double iciOf(const std::vector<double>& lp, const std::vector<double>& y,
             const std::vector<double>& weights) {
  std::vector<double> risk;
  std::vector<double> outcome;
  risk.reserve(lp.size());
  outcome.reserve(lp.size());
  for (std::size_t i = 0; i < lp.size(); ++i) {
    const int copies = weights.empty() ? 1 : static_cast<int>(weights[i]);
    const double p = logisticRisk(lp[i]);
    for (int c = 0; c < copies; ++c) {
      outcome.push_back(y[i]);
      risk.push_back(p);
    }
  }
  const ValidationOptions defaults;
  LoessOptions loessOptions;
  loessOptions.exactMaxN = defaults.loessExactMaxN;
  loessOptions.gridPoints = defaults.loessGridPoints;
  const LoessCalibration loess = loessCalibration(sortCohort(risk, outcome), loessOptions);
  return loess.available ? loess.ici : kNaN;
}

// Measures in kMeasureNames order for the LP on the data under weights.
std::vector<double> measuresOf(const std::vector<double>& lp, const std::vector<double>& y,
                               const std::vector<std::uint32_t>& order,
                               const std::vector<double>& weights, bool includeIci) {
  const WeightedMeasures m = weightedMeasures(lp, y, order, weights);
  std::vector<double> values{m.auc, m.calibrationSlope, m.calibrationIntercept, m.brier};
  if (includeIci) values.push_back(iciOf(lp, y, weights));
  return values;
}

}  // namespace

OptimismResult bootstrapOptimism(const Eigen::MatrixXd& X, const Eigen::VectorXd& y,
                                 const OptimismOptions& options) {
  const auto n = static_cast<std::size_t>(X.rows());
  OptimismResult result;
  result.firth = options.fit.firth;
  result.n = n;
  for (Eigen::Index i = 0; i < y.size(); ++i) result.events += y[i] > 0.5 ? 1 : 0;
  if (result.events == 0 || result.events == n) {
    throw AnalysisError("internal validation needs both events and non-events");
  }
  FitOptions fitOptions = options.fit;
  fitOptions.progress = nullptr;
  fitOptions.threads = 1;  // the replicates run in parallel; each fit stays on its thread

  const std::vector<double> yStd = toStd(y);
  const FitResult apparentFit = fitLogistic(X, y, nullptr, fitOptions);
  if (!fitUsable(apparentFit)) {
    throw AnalysisError("the model cannot be fitted on the full data: " + fitFailure(apparentFit));
  }
  const std::vector<double> apparentLp = toStd(X * apparentFit.beta);
  const std::vector<double> apparent =
      measuresOf(apparentLp, yStd, ascendingOrder(apparentLp), {}, options.includeIci);
  const std::size_t k = apparent.size();

  const auto statistic = [&](const std::vector<std::uint32_t>& sample) {
    const Eigen::VectorXi index =
        Eigen::Map<const Eigen::VectorX<std::uint32_t>>(sample.data(), sample.size()).cast<int>();
    const Eigen::MatrixXd Xb = X(index, Eigen::all);
    const Eigen::VectorXd yb = y(index);
    double events = yb.sum();
    if (events == 0.0 || events == static_cast<double>(n)) {
      throw AnalysisError("a resample has one outcome class only");
    }
    const FitResult fit = fitLogistic(Xb, yb, nullptr, fitOptions);
    if (!fitUsable(fit)) throw AnalysisError("refit failed on a resample: " + fitFailure(fit));
    // The refit's LP on every original patient; the resample is those patients
    // with weights.
    const std::vector<double> lp = toStd(X * fit.beta);
    std::vector<double> weights(n, 0.0);
    for (const std::uint32_t i : sample) weights[i] += 1.0;
    const std::vector<std::uint32_t> order = ascendingOrder(lp);
    const std::vector<double> onResample = measuresOf(lp, yStd, order, weights, options.includeIci);
    const std::vector<double> onOriginal = measuresOf(lp, yStd, order, {}, options.includeIci);
    std::vector<double> optimism(k);
    for (std::size_t m = 0; m < k; ++m) optimism[m] = onResample[m] - onOriginal[m];
    return optimism;
  };
  const BootstrapRun run = runBootstrap(n, k, statistic, options.bootstrap);
  result.run = summarize(run, options.bootstrap);

  for (std::size_t m = 0; m < k; ++m) {
    OptimismMeasure measure;
    measure.measure = kMeasureNames[m];
    measure.apparent = apparent[m];
    double sum = 0.0, sumSquares = 0.0;
    for (const auto& row : run.values) {
      if (!std::isfinite(row[m])) continue;
      sum += row[m];
      sumSquares += row[m] * row[m];
      ++measure.replicatesUsed;
    }
    const auto used = static_cast<double>(measure.replicatesUsed);
    measure.meanOptimism = measure.replicatesUsed > 0 ? sum / used : kNaN;
    measure.optimismSd =
        measure.replicatesUsed > 1
            ? std::sqrt(std::max(0.0, (sumSquares - sum * sum / used) / (used - 1)))
            : kNaN;
    measure.corrected = measure.apparent - measure.meanOptimism;
    result.measures.push_back(measure);
  }
  result.shrinkageFactor = result.measures[1].corrected;
  if (run.failed > 0) {
    std::ostringstream message;
    message << run.failed << " of " << options.bootstrap.replicates
            << " replicates could not be used (first: " << run.firstFailure << ")";
    result.warnings.push_back(message.str());
  }
  if (!(result.shrinkageFactor > 0.0)) {
    result.warnings.push_back(
        "the corrected calibration slope is not positive: the model does "
        "not generalize; do not use a shrunk model");
  }
  return result;
}

const OptimismMeasure* findMeasure(const OptimismResult& result, const std::string& measure) {
  for (const auto& m : result.measures) {
    if (m.measure == measure) return &m;
  }
  return nullptr;
}

Model shrinkModel(const Model& fitted, double shrinkage, const Table& table,
                  const std::vector<std::uint32_t>& rows, const std::vector<double>& y) {
  Model shrunk = fitted;
  for (Term& term : shrunk.terms) {
    term.estimate.coefficient *= shrinkage;
    term.estimate.se.reset();
  }
  shrunk.intercept.coefficient = 0.0;
  shrunk.intercept.se.reset();
  const std::vector<double> offset = linearPredictor(shrunk, table, rows);
  const double intercept = weightedOffsetIntercept(offset, y, {});
  if (!std::isfinite(intercept)) {
    throw AnalysisError("the intercept of the shrunk model could not be re-estimated");
  }
  shrunk.intercept.coefficient = intercept;
  std::ostringstream provenance;
  provenance.precision(17);
  provenance << "uniform shrinkage of '" << fitted.name << "': coefficients times " << shrinkage
             << " (bootstrap-corrected calibration slope), intercept "
                "re-estimated with the shrunk"
                " linear predictor as offset so that mean predicted risk "
                "equals the observed"
                " proportion";
  if (fitted.provenance) provenance << "; before: " << *fitted.provenance;
  shrunk.provenance = provenance.str();
  if (!shrunk.name.empty()) shrunk.name += " (shrunk)";
  return shrunk;
}

}  // namespace calivera
