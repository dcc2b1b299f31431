#pragma once
// Long core computations report progress and poll for cancellation through this callback; they
// know nothing about threads or the UI.

#include <functional>

#include "core/util/errors.h"

namespace calivera {

// Called with the completed fraction in [0, 1]; returns false to request cancellation.
using ProgressCallback = std::function<bool(double fraction)>;

// Reports progress and throws Cancelled when the callback asks to stop. An empty callback never
// cancels.
inline void reportProgress(const ProgressCallback& progress, double fraction) {
  if (progress && !progress(fraction)) throw Cancelled();
}

}  // namespace calivera
