#pragma once
// `calivera fit`: fits a logistic model to a cohort CSV and writes a Calivera model file.

#include <string>
#include <vector>

namespace calivera::cli {

int runFitCommand(const std::vector<std::string>& words);

}  // namespace calivera::cli
