#pragma once
// Internal validation of a locally fitted logistic model by bootstrap optimism correction
// (Efron, JASA 1983;78:316-31; Harrell, Lee & Mark, Stat Med 1996;15:361-87):
//   apparent  = performance of the model fitted on the data, on the same data;
//   replicate b: refit on resample b with every modelling step (Firth when chosen), then
//     optimism_b = performance on resample b - performance of that refit on the original data;
//   corrected = apparent - mean(optimism_b).
// Measures: AUC, calibration slope and calibration-in-the-large intercept (Cox 1958; LP of the
// refit as covariate / offset), Brier score and, when asked, ICI (Austin & Steyerberg, Stat Med
// 2019, via validate()'s smoothed calibration curve). The corrected slope is the uniform shrinkage
// factor (Van Houwelingen & Le Cessie, Stat Med 1990).
//
// Edge cases: a replicate whose refit fails (separation without Firth, non-convergence, one
// outcome class in the resample) is left out and counted; the counts and the first reason are
// reported. Same seed -> identical results for any thread count.

#include <Eigen/Dense>
#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "core/data/table.h"
#include "core/fit/logistic_fit.h"
#include "core/model/model.h"
#include "core/uncertainty/bootstrap.h"

namespace calivera {

struct OptimismOptions {
  FitOptions fit;  // its progress member is ignored inside replicates
  BootstrapOptions bootstrap;
  bool includeIci = true;  // ICI needs a smoothed calibration curve per replicate (slower)
};

struct OptimismMeasure {
  std::string measure;  // "AUC", "calibration slope", "calibration intercept", "Brier", "ICI"
  double apparent = 0.0;
  double meanOptimism = 0.0;
  double corrected = 0.0;
  double optimismSd = 0.0;  // over the replicates used
  std::size_t replicatesUsed = 0;
};

struct OptimismResult {
  BootstrapSummary run;
  bool firth = false;
  std::size_t n = 0, events = 0;
  std::vector<OptimismMeasure> measures;  // AUC, slope, intercept, Brier[, ICI]
  double shrinkageFactor = 1.0;           // the corrected calibration slope
  std::vector<std::string> warnings;
};

// X: one column per coefficient, the intercept column (all ones) first; y: 0/1. Throws
// AnalysisError when the apparent fit itself fails.
OptimismResult bootstrapOptimism(const Eigen::MatrixXd& X, const Eigen::VectorXd& y,
                                 const OptimismOptions& options);

const OptimismMeasure* findMeasure(const OptimismResult& result, const std::string& measure);

// The fitted model with every coefficient multiplied by `shrinkage` and the intercept
// re-estimated on (table, rows, y) with the shrunk LP as offset, so that the mean predicted risk
// equals the observed proportion (the maximum-likelihood intercept with an offset makes
// sum(p) = sum(y) exactly). Provenance records the factor and the method.
Model shrinkModel(const Model& fitted, double shrinkage, const Table& table,
                  const std::vector<std::uint32_t>& rows, const std::vector<double>& y);

}  // namespace calivera
