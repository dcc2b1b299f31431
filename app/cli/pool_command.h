#pragma once
// `calivera pool SITE.cvsummary...`: site summaries written by `calivera summarize` checked for
// compatibility and pooled across sites (core/sites/summary_pooling.h), with the same JSON keys,
// tables and text as `calivera validate --cluster`.

#include <string>
#include <vector>

namespace calivera::cli {

int runPoolCommand(const std::vector<std::string>& words);

}  // namespace calivera::cli
