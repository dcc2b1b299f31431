#pragma once
// `calivera run STUDY.cvstudy [--json REPORT.json] [--csv-dir DIR] [--pdf REPORT.pdf]`: a study
// saved by the workstation, run headless with all its settings, as the validate request it
// stands for (so its outputs equal those of the `calivera validate` line its summary prints).

#include <string>
#include <vector>

namespace calivera::cli {

int runRunCommand(const std::vector<std::string>& words);

}  // namespace calivera::cli
