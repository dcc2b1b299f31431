#include "core/uncertainty/internal_validation.h"

#include <Eigen/Dense>

#include "core/model/linear_predictor.h"
#include "core/util/errors.h"

namespace calivera {

bool fittedWithFirth(const Model& model) {
  return model.development.method && model.development.method->find("Firth") != std::string::npos;
}

InternalValidation internalValidation(const Model& model, const UpdateData& data,
                                      OptimismOptions options) {
  if (data.table == nullptr) throw AnalysisError("internal validation: no cohort");
  InternalValidation out;
  options.fit.firth = options.fit.firth || fittedWithFirth(model);
  out.firth = options.fit.firth;
  if (model.development.dataSha256 && !data.dataSha256.empty() &&
      *model.development.dataSha256 != data.dataSha256) {
    out.warnings.push_back("the model file records other development data (sha256 " +
                           *model.development.dataSha256 +
                           "); optimism correction is meant for the data a model was fitted on");
  }
  const Eigen::MatrixXd design = designMatrix(model, *data.table, data.rows);
  Eigen::MatrixXd X(design.rows(), design.cols() + 1);
  X.col(0).setOnes();
  X.rightCols(design.cols()) = design;
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
