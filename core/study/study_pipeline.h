#pragma once
// One background run from a candidate study to everything the workstation shows: read the cohort
// (unless the caller already has it), read or fit the model, and validate. The result is applied
// to the window only when the whole run succeeds, so a bad file or a failed step leaves the
// previous study untouched.

#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "core/study/study.h"
#include "core/study/study_analysis.h"
#include "core/util/progress.h"

namespace calivera {

struct PipelineRequest {
  StudyState study;                    // inputs and settings to use
  std::shared_ptr<const Table> table;  // reuse when it matches study.data; else read
  bool refit = false;                  // Fitted source: fit again even if study.model is set
  // Also run what study.uncertaintySettings asks for (bootstrap, comparison, subgroups), as on
  // reopening a study. Otherwise uncertainty results are kept when the validation basis is
  // unchanged and replaced by the sample-size assessment alone when it changed.
  bool withUncertainty = false;
  // Compare each input's SHA-256 with the one the study recorded (a reopened study), here on the
  // worker thread: hashing a large cohort must never hold up the interface.
  bool checkRecordedInputs = false;
};

struct PipelineOutput {
  StudyState study;  // as requested, with records, model, exclusions and result filled in
  std::shared_ptr<const Table> table;
  std::shared_ptr<const CohortData> cohort;    // null when no validation could run yet
  std::vector<std::string> unmappedVariables;  // model variables the cohort lacks
  std::vector<std::string> notes;  // why no validation ran, why no uncertainty analysis ran
  // Why the validation could not run although the inputs were read (unknown category levels):
  // the study keeps its cohort and model so the user can map the levels; shown as an error.
  std::vector<std::string> problems;
  // Inputs missing or changed since the study was saved (checkRecordedInputs), one sentence each.
  std::vector<std::string> inputWarnings;
};

PipelineOutput runPipeline(const PipelineRequest& request, const ProgressCallback& progress);

// Model variables (after mapping) that are not columns of the table.
std::vector<std::string> unmappedVariables(const Model& model,
                                           const std::map<std::string, std::string>& mapping,
                                           const Table& table);

}  // namespace calivera
