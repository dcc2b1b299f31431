#pragma once
// From how many patients an O(n) step is worth splitting across threads (issue 13). Below it, a
// validation takes a few milliseconds and starting threads would cost more than it saves; it
// also keeps the many small validations of a bootstrap (already one per core) single-threaded.

#include <cstddef>

namespace calivera {

inline constexpr std::size_t kParallelFromPatients = 200000;

}  // namespace calivera
