#pragma once
// `calivera internal`: bootstrap optimism correction of a model fitted on this cohort, with an
// optional uniformly shrunk model file.

#include <string>
#include <vector>

namespace calivera::cli {

int runInternalCommand(const std::vector<std::string>& words);

}  // namespace calivera::cli
