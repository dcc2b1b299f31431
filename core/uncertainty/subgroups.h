#pragma once
// Performance per subgroup (TRIPOD+AI, Collins et al., BMJ 2024: calibration and discrimination
// by sex, age band, site): every measure of validate(), with bootstrap intervals when asked,
// computed on each level's patients alone — exactly what validating that subset by itself gives.
//
// Edge cases: a level with one outcome class gets no metrics and a warning (its counts are still
// reported); fewer than 100 events or non-events, or fewer than 200 events, give the sample-size
// warnings of sample_size.h. Patients with a missing subgroup value form the level "(missing)" so
// none is dropped silently.

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "core/data/table.h"
#include "core/metrics/validation.h"
#include "core/uncertainty/validation_bootstrap.h"

namespace calivera {

inline constexpr const char* kMissingLevel = "(missing)";
// More levels than this and the column is not a grouping (an identifier, a continuous value):
// refused, because every level's label is printed in the outputs and most levels would be too
// small to judge anyway.
inline constexpr std::size_t kMaxSubgroupLevels = 50;

struct SubgroupResult {
  std::string level;
  std::size_t n = 0, events = 0;
  std::optional<ValidationResult> metrics;       // absent when it cannot be computed
  std::optional<ValidationBootstrap> bootstrap;  // when replicates > 0 and metrics present
  bool tooSmall = false;                         // fails a rule of thumb
  std::vector<std::string> warnings;
};

struct SubgroupAnalysis {
  std::string column;
  std::vector<SubgroupResult> levels;  // in level order (text: sorted; numeric: ascending)
};

// The subgroup label of each selected row: text levels as written, numbers in shortest form,
// missing as kMissingLevel. Throws InputError naming the file and column when absent, or when
// the column has more than `maxLevels` distinct values among the rows (`role` names what the
// column is for in that message: "subgroup", "site").
std::vector<std::string> subgroupLabels(const Table& table, const std::string& column,
                                        const std::vector<std::uint32_t>& rows,
                                        std::size_t maxLevels = kMaxSubgroupLevels,
                                        const std::string& role = "subgroup");

// labels[i] belongs to patient i of `input`. bootstrapOptions.bootstrap.replicates 0: no intervals.
SubgroupAnalysis validateSubgroups(const std::string& column,
                                   const std::vector<std::string>& labels,
                                   const ValidationInput& input, const ValidationOptions& options,
                                   const ValidationBootstrapOptions& bootstrapOptions);

}  // namespace calivera
