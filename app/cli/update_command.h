#pragma once
// `calivera update`: updates a model on local data (intercept, recalibration or refit), writes
// the updated model file with its provenance and reports the closed testing procedure.

#include <string>
#include <vector>

namespace calivera::cli {

int runUpdateCommand(const std::vector<std::string>& words);

}  // namespace calivera::cli
