#pragma once
// `calivera summarize`: one site's validation written as an aggregate-only site summary
// (core/sites/site_summary.h) for `calivera pool`, so sites that may not share patient rows can
// still be validated together.

#include <string>
#include <vector>

namespace calivera::cli {

int runSummarizeCommand(const std::vector<std::string>& words);

}  // namespace calivera::cli
