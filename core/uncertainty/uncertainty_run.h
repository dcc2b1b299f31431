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
  std::vector<SubgroupAnalysis> subgroups;
};

// Throws InputError for an unreadable model file or a missing subgroup column, AnalysisError
// when a comparison has one outcome class, Cancelled.
UncertaintyResults runUncertainty(const ValidationRun& run, const UncertaintyRequest& request);

}  // namespace calivera
