#pragma once
// One table of limits for every setting a user can type, shared by the command line's options,
// the workstation's dialogs and the study file reader, so a value accepted in one place is never
// refused (or silently accepted) in another. Integers are checked as numbers before any
// conversion: a study file's "groups": 3e69 is refused, never cast.

#include <cstddef>
#include <cstdint>

namespace calivera {

struct IntegerLimit {
  const char* what;  // as named in messages
  long long min;
  long long max;
};

inline constexpr IntegerLimit kGroupsLimit{"risk groups", 2, 1000};
inline constexpr IntegerLimit kBootstrapLimit{"bootstrap resamples", 0, 100000};  // 0: none
inline constexpr IntegerLimit kThreadsLimit{"threads", 0, 1024};                  // 0: all cores
inline constexpr IntegerLimit kSeedLimit{"seed", 0, (1LL << 53)};  // exact in a JSON number
inline constexpr IntegerLimit kImputeCopiesLimit{"imputed copies", 2, 1000};
inline constexpr IntegerLimit kImputeIterationsLimit{"imputation iterations", 1, 1000};
inline constexpr IntegerLimit kSuppressBelowLimit{"suppression threshold", 2, 1000};
// A report title in bytes (the report itself shows at most 80 characters of it).
inline constexpr std::size_t kMaxReportTitleBytes = 1000;
// The analyst's or reviewer's name on the report's sign-off lines, in bytes.
inline constexpr std::size_t kMaxSignOffNameBytes = 200;
// The threshold grid's size limit is core/metrics/validation.h's kMaxThresholdCount (thresholdRange
// refuses a longer grid), kept there because the metrics layer checks it.

// Empty when `value` is a whole number within `limit`, else the reason ("must be a whole number
// from 2 to 1000").
const char* integerProblem(double value, const IntegerLimit& limit);

}  // namespace calivera
