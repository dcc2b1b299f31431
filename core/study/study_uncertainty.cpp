#include "core/study/study_uncertainty.h"

#include <nlohmann/json.hpp>

#include "core/model/model_io.h"

namespace calivera {

UncertaintyRequest uncertaintyRequest(const UncertaintySettings& settings,
                                      const ProgressCallback& progress) {
  UncertaintyRequest request;
  request.bootstrapReplicates = settings.bootstrapReplicates;
  request.seed = settings.seed;
  request.threads = settings.threads;
  for (const InputFileRecord& m : settings.compareModels)
    request.compareModelPaths.push_back(m.path);
  request.subgroupColumns = settings.subgroupColumns;
  if (!settings.clusterColumn.empty()) request.clusterColumn = settings.clusterColumn;
  request.sampleSize.netBenefitThresholds = settings.sizeThresholds;
  request.progress = progress;
  return request;
}

UncertaintyResults computeUncertainty(const CohortData& cohort, const ValidationResult& result,
                                      const UncertaintySettings& settings,
                                      const ProgressCallback& progress) {
  const std::optional<std::string> noRiskColumn;
  const UncertaintySubject subject{*cohort.table(), cohort.outcomeSpec(), &cohort.model(),
                                   noRiskColumn,    cohort.model().name,  cohort.rows(),
                                   cohort.input(),  cohort.options(),     result};
  return runUncertainty(subject, uncertaintyRequest(settings, progress));
}

UncertaintySettings withComparedHashes(UncertaintySettings settings,
                                       const UncertaintyResults& results) {
  for (std::size_t m = 0; m < settings.compareModels.size() && m < results.comparedModels.size();
       ++m) {
    settings.compareModels[m].sha256 = results.comparedModels[m].sha256;
  }
  return settings;
}

std::string validationBasis(const StudyState& study) {
  nlohmann::json j;
  j["data"] = study.data ? study.data->sha256 : std::string();
  j["delimiter"] = static_cast<int>(study.import.delimiter);
  j["missing"] = study.import.missingTokens;
  j["outcome"] = study.import.outcomeColumn;
  j["event"] = study.import.eventValue.value_or("\x01(none)");
  j["model"] = study.model ? modelToJson(*study.model) : std::string();
  j["mapping"] = study.columnMapping;
  j["levels"] = study.levelMapping;
  j["groups"] = study.analysis.groups;
  j["apparent"] = study.analysis.apparent;
  // Stacked copies: the analysed cohort is the original data (index 0), not the whole file.
  j["imputation_column"] = study.missingData.imputationColumn;
  return j.dump();
}

}  // namespace calivera
