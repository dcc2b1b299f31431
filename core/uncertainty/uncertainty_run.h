#pragma once
// Everything core/uncertainty adds to one validation run, as one entry point shared by the
// command line (calivera validate) and the workstation: sample-size adequacy (always), bootstrap
// intervals and bands, comparison with further models on the same patients, and subgroups.
//
// Comparison rows: the patients complete in the columns of every model compared (and the
// outcome); when that set is smaller than the run's, the comparison says how many fewer.

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/metrics/validation_run.h"
#include "core/sites/site_pooling.h"
#include "core/uncertainty/model_comparison.h"
#include "core/uncertainty/sample_size.h"
#include "core/uncertainty/subgroups.h"
#include "core/uncertainty/validation_bootstrap.h"
#include "core/util/progress.h"

namespace calivera {

struct UncertaintyRequest {
  int bootstrapReplicates = 0;  // 0: no bootstrap intervals
  std::uint64_t seed = 1;
  unsigned threads = 0;                        // 0: all hardware threads
  std::vector<std::string> compareModelPaths;  // further model files compared with the run's
  std::vector<std::string> subgroupColumns;
  // Sites: every level of this column validated alone and pooled (core/sites/site_pooling.h).
  std::optional<std::string> clusterColumn;
  // Net benefit pooled across sites at these thresholds; empty: defaultTableThresholds.
  std::vector<double> clusterThresholds;
  SampleSizeTargets sampleSize;
  ProgressCallback progress;  // over the whole request
};

struct ComparedModelFile {
  std::string path;
  std::string sha256;
  std::string name;
};

struct UncertaintyResults {
  SampleSizeAssessment sampleSize;
  std::optional<ValidationBootstrap> bootstrap;
  std::optional<ModelComparison> comparison;
  std::vector<ComparedModelFile> comparedModels;  // the further models, in request order
  std::size_t comparisonRows = 0;
  // Every compared model (the run's first, then comparedModels) validated on the comparison
  // rows with the run's options: the curves that comparison overlays draw. Empty: no comparison.
  std::vector<ValidationResult> comparedResults;
  std::vector<SubgroupAnalysis> subgroups;
  std::optional<SiteAnalysis> sites;  // when clusterColumn was given
};

// What one uncertainty request works on, borrowed from the caller for the duration of the call:
// the command line takes it from a ValidationRun, the workstation from its own analysis state.
// `rows`, `input` and `result` describe the same patients in the same order.
struct UncertaintySubject {
  const Table& table;
  const OutcomeSpec& outcome;
  const Model* model = nullptr;  // null: risks come from riskColumn
  const std::optional<std::string>& riskColumn;
  const std::string& modelName;
  const std::vector<std::uint32_t>& rows;  // analysed rows of `table`
  const ValidationInput& input;
  const ValidationOptions& options;  // thresholds filled in
  const ValidationResult& result;    // validate(input, options)
};

UncertaintySubject uncertaintySubject(const ValidationRun& run);

// Throws InputError for an unreadable model file or a missing subgroup column, AnalysisError
// when a comparison has one outcome class, Cancelled.
UncertaintyResults runUncertainty(const UncertaintySubject& subject,
                                  const UncertaintyRequest& request);
UncertaintyResults runUncertainty(const ValidationRun& run, const UncertaintyRequest& request);

}  // namespace calivera
