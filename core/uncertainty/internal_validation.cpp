#include "core/uncertainty/internal_validation.h"

#include <Eigen/Dense>

#include "core/metrics/validation_run.h"
#include "core/model/linear_predictor.h"
#include "core/util/errors.h"

namespace calivera {

bool fittedWithFirth(const Model& model) {
  return model.development.method && model.development.method->find("Firth") != std::string::npos;
}

std::string internalValidationRefusal(const Model& model, const std::string& dataSha256,
                                      bool statedDevelopmentData,
                                      const std::string& analysedSha256) {
  const bool recorded = model.development.dataSha256.has_value();
  if (statedDevelopmentData || isApparent(&model, dataSha256, analysedSha256)) return {};
  const std::string reason =
      recorded ? "the model was developed on other data (its file records SHA-256 " +
                     *model.development.dataSha256 + ", this cohort's is " + dataSha256 + ")"
               : "the model file records no development data, so it was not fitted here";
  return "internal validation (optimism correction) is for a model fitted on this cohort, and " +
         reason +
         ". For a published model, validate it on this cohort instead (external validation: "
         "calivera validate, or the workstation's views); if this cohort is its development data, "
         "say so (--development-data, or 'Cohort is the "
         "development data' in the workstation)";
}

InternalValidation internalValidation(const Model& model, const UpdateData& data,
                                      OptimismOptions options, bool statedDevelopmentData) {
  if (data.table == nullptr) throw AnalysisError("internal validation: no cohort");
  if (const std::string refusal = internalValidationRefusal(
          model, data.dataSha256, statedDevelopmentData, data.analysedSha256);
      !refusal.empty()) {
    throw InputError(refusal);
  }
  InternalValidation out;
  options.fit.firth = options.fit.firth || fittedWithFirth(model);
  out.firth = options.fit.firth;
  if (statedDevelopmentData && model.development.dataSha256 &&
      !isApparent(&model, data.dataSha256, data.analysedSha256)) {
    out.warnings.push_back("the model file records other development data (SHA-256 " +
                           *model.development.dataSha256 +
                           "); run as stated: this cohort is the model's development data");
  }
  const Eigen::MatrixXd X = designMatrixWithIntercept(model, *data.table, data.rows);
  const Eigen::VectorXd y = Eigen::Map<const Eigen::VectorXd>(
      data.outcome.data(), static_cast<Eigen::Index>(data.outcome.size()));
  out.optimism = bootstrapOptimism(X, y, options);
  out.warnings.insert(out.warnings.end(), out.optimism.warnings.begin(),
                      out.optimism.warnings.end());
  return out;
}

Model shrunkModel(const Model& model, const UpdateData& data, double shrinkage, bool firth) {
  if (!(shrinkage > 0.0)) {
    throw AnalysisError("no shrunk model: the corrected calibration slope is not positive");
  }
  UpdateOptions fitOptions;
  fitOptions.firth = firth;
  const UpdatedModel refitted = updateModel(model, data, UpdateMethod::Refit, fitOptions);
  return shrinkModel(refitted.model, shrinkage, *data.table, data.rows, data.outcome);
}

}  // namespace calivera
