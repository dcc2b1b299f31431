#pragma once
// Updating an existing logistic model on local data (Steyerberg et al., Stat Med 2004;23:2567-86;
// Janssen et al., J Clin Epidemiol 2008;61:76-86):
//   intercept update ("recalibration in the large"): logit p = a + LP, only a estimated
//     (LP as offset); the new intercept is old + a;
//   logistic recalibration: logit p = a + b LP; the new model keeps its terms with
//     intercept a + b * old intercept and every coefficient times b, so the file stays a plain
//     model;
//   refit ("model revision"): every coefficient re-estimated on the local data, same terms.
// Each updated model records its provenance: the model it updates, the data (SHA-256), the
// method and the estimates.
//
// Closed testing (Vergouwe et al., Stat Med 2017;36:4529-39; sequence from memory — the
// abstract (read) says the extent of updating increases progressively from the original model to
// a fully revised one while keeping the chosen type I error): likelihood-ratio tests at level alpha
//   1. original vs refit (df = p + 1); not rejected -> keep the original;
//   2. intercept update vs refit (df = p); not rejected -> intercept update;
//   3. recalibration vs refit (df = p - 1); not rejected -> recalibration;
//   4. otherwise -> refit.
// Every test is against the refit model (the closed set containing it), so the family-wise
// error stays at alpha. p counts the model's terms; with p = 1 recalibration and refit coincide
// and step 3 is skipped.
//
// Edge cases: separation or non-convergence of a fit is reported in warnings (Firth optional
// for the refit); one outcome class -> AnalysisError.

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/data/table.h"
#include "core/fit/logistic_fit.h"
#include "core/model/model.h"

namespace calivera {

enum class UpdateMethod { None, Intercept, Recalibrate, Refit };

const char* updateMethodName(UpdateMethod method);  // "none", "intercept", "recalibrate", "refit"
std::optional<UpdateMethod> parseUpdateMethod(const std::string& text);

struct UpdateData {
  const Table* table = nullptr;
  std::vector<std::uint32_t> rows;  // complete cases over requiredColumns(model) and the outcome
  std::vector<double> outcome;      // 0/1 per row
  std::string dataSha256;           // of the data file, recorded in the provenance
  std::string analysedSha256;       // analysed-data fingerprint (core/model/analysed_fingerprint.h)
  std::string dataName;             // file name as the user gave it
};

struct UpdateOptions {
  bool firth = false;  // for the refit only
  FitOptions fit;
};

struct UpdatedModel {
  UpdateMethod method = UpdateMethod::None;
  Model model;
  double deviance = 0.0;  // -2 log L of the updated model on the local data
  int estimatedParameters = 0;
  double recalibrationIntercept = 0.0;  // a
  double recalibrationSlope = 1.0;      // b (1 for the intercept update)
  std::vector<std::string> warnings;
};

UpdatedModel updateModel(const Model& model, const UpdateData& data, UpdateMethod method,
                         const UpdateOptions& options);

struct ClosedTestStep {
  std::string hypothesis;  // e.g. "original vs refit"
  double lrStatistic = 0.0;
  int df = 0;
  double pValue = 1.0;
  bool rejected = false;
};

struct ClosedTestResult {
  double alpha = 0.05;
  double devianceOriginal = 0.0, devianceIntercept = 0.0, devianceRecalibrated = 0.0,
         devianceRefit = 0.0;
  std::vector<ClosedTestStep> steps;  // in the order performed
  UpdateMethod suggested = UpdateMethod::None;
  std::vector<std::string> warnings;
};

ClosedTestResult closedTest(const Model& model, const UpdateData& data, double alpha,
                            const UpdateOptions& options);

}  // namespace calivera
