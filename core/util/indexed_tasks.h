#pragma once
// Runs numbered tasks on a few worker threads, for work whose result must not depend on the
// number of threads: each task is named by its index and writes only its own slot, so any
// schedule gives the same results (the bootstrap's replicates, the imputed copies).

#include <cstddef>
#include <functional>

#include "core/util/progress.h"

namespace calivera {

// `requested` threads, or all hardware threads for 0 (at least 1).
unsigned resolveThreadCount(unsigned requested);

// Calls task(i) for every i in [0, count) on min(resolveThreadCount(threads), count) workers and
// returns how many ran. The calling thread only reports progress (the completed fraction), so a
// UI callback never runs on a worker. The first exception a task throws stops the other workers
// (tasks already started finish) and is rethrown; a callback that asks to stop throws Cancelled
// after the workers have stopped.
unsigned runIndexedTasks(std::size_t count, unsigned threads, const ProgressCallback& progress,
                         const std::function<void(std::size_t index)>& task);

}  // namespace calivera
