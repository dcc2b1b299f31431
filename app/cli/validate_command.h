#pragma once
// `calivera validate`: validation of a model (file) or of a risk column on a cohort CSV.

#include <string>
#include <vector>

namespace calivera::cli {

int runValidateCommand(const std::vector<std::string>& words);

}  // namespace calivera::cli
