#pragma once
// `calivera predictor-space`: the model's predicted risk against one predictor (or over two) with
// the others held fixed, on the analysed patients of a cohort, as the workstation's Predictor
// space tab draws it (core/study/predictor_space.h, core/report/predictor_space_output.h).

#include <string>
#include <vector>

namespace calivera::cli {

int runPredictorSpaceCommand(const std::vector<std::string>& words);

}  // namespace calivera::cli
