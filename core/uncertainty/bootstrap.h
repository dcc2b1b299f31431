#pragma once
// Seeded, multi-threaded nonparametric bootstrap (Efron, Ann Stat 1979; Efron & Tibshirani, An
// Introduction to the Bootstrap, 1993): B resamples of n patients drawn with replacement, one
// statistic vector per resample, percentile intervals.
//
// Reproducibility: replicate r draws from its own std::mt19937_64 seeded with
// replicateSeed(seed, r), a SplitMix64 hash of (seed, r) (Steele, Lea & Flood, OOPSLA 2014). No
// generator is shared, and results are stored by replicate index, so the same seed gives
// bit-identical results whatever the number of threads or their scheduling.
//
// Edge cases: a replicate whose statistic cannot be computed (e.g. a resample with one outcome
// class; the statistic throws AnalysisError) is kept as NaN and counted in `failed`, never
// silently replaced; intervals use the replicates that succeeded and report how many. Any other
// exception stops the run and propagates. Cancellation through the progress callback throws
// Cancelled after the workers have stopped.

#include <cstddef>
#include <cstdint>
#include <functional>
#include <random>
#include <string>
#include <vector>

#include "core/util/indexed_tasks.h"  // resolveThreadCount
#include "core/util/progress.h"

namespace calivera {

struct BootstrapOptions {
  int replicates = 200;
  std::uint64_t seed = 1;
  unsigned threads = 0;  // 0: all hardware threads
  // Called from the calling thread only (never from a worker), with the completed fraction.
  ProgressCallback progress;
};

// SplitMix64 of the seed combined with the replicate index.
std::uint64_t replicateSeed(std::uint64_t seed, std::uint64_t replicate);

// Uniform integer in [0, n) by rejection (no modulo bias, no dependence on the standard
// library's distribution implementation, so results agree across compilers).
std::uint32_t uniformIndex(std::mt19937_64& generator, std::uint32_t n);

// n indices drawn with replacement from [0, n), for replicate r of `seed`.
std::vector<std::uint32_t> drawResample(std::size_t n, std::uint64_t seed, std::uint64_t replicate);

// Statistic of one resample (indices into the original patients). Must be safe to call from
// several threads at once. Throw AnalysisError to mark the replicate as failed.
using ReplicateStatistic =
    std::function<std::vector<double>(const std::vector<std::uint32_t>& resample)>;

struct BootstrapRun {
  std::vector<std::vector<double>> values;  // [replicate][statistic]; NaN row where failed
  std::size_t failed = 0;
  std::string firstFailure;  // message of the first failed replicate (lowest index)
  unsigned threadsUsed = 0;
};

// Throws std::invalid_argument for replicates < 1 or n == 0 (a programming error: callers
// validate user options first).
BootstrapRun runBootstrap(std::size_t n, std::size_t statisticCount,
                          const ReplicateStatistic& statistic, const BootstrapOptions& options);

// Sample quantile, type 7 of Hyndman & Fan (Am Stat 1996), ignoring NaN. NaN when no value.
double quantileIgnoringNan(std::vector<double> values, double probability);

// What a result records about the bootstrap behind it.
struct BootstrapSummary {
  int replicates = 0;  // requested; 0: no bootstrap was run
  std::uint64_t seed = 0;
  unsigned threads = 0;    // threads actually used
  std::size_t failed = 0;  // replicates left out
  std::string firstFailure;
};

BootstrapSummary summarize(const BootstrapRun& run, const BootstrapOptions& options);

struct PercentileInterval {
  double lo = 0.0;
  double hi = 0.0;
  std::size_t replicatesUsed = 0;  // finite values the interval rests on
};

// Percentile interval (Efron 1979) at `level` (0.95: 2.5% and 97.5% quantiles) of one column.
PercentileInterval percentileInterval(const BootstrapRun& run, std::size_t statistic,
                                      double level = 0.95);

}  // namespace calivera
