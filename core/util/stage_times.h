#pragma once
// Where a whole-process run spends its wall time: with the environment variable
// CALIVERA_STAGE_TIMES set (to anything), markStage prints the time since the previous mark and
// since the first one to standard error. Unset (the default), a mark costs one cached flag test.
// Used by scripts/bench-whole.sh to explain a command's time; never part of any result.

#include <string_view>

namespace calivera {

void markStage(std::string_view stage);

}  // namespace calivera
