#include "core/uncertainty/bootstrap.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>

#include "core/metrics/sorted_cohort.h"
#include "core/util/errors.h"
#include "core/util/indexed_tasks.h"

namespace calivera {
namespace {

// SplitMix64 finalizer (Steele, Lea & Flood 2014; constants of Vigna's reference code).
std::uint64_t splitMix64(std::uint64_t x) {
  x += 0x9e3779b97f4a7c15ULL;
  x = (x ^ (x >> 30)) * 0xbf58476d1ce4e5b9ULL;
  x = (x ^ (x >> 27)) * 0x94d049bb133111ebULL;
  return x ^ (x >> 31);
}

}  // namespace

std::uint64_t replicateSeed(std::uint64_t seed, std::uint64_t replicate) {
  // Hash twice so neighbouring seeds and neighbouring replicates give unrelated streams.
  return splitMix64(splitMix64(seed) ^ (replicate * 0xd1b54a32d192ed03ULL + 1));
}

std::uint32_t uniformIndex(std::mt19937_64& generator, std::uint32_t n) {
  const std::uint64_t range = n;
  const std::uint64_t limit =
      std::numeric_limits<std::uint64_t>::max() - std::numeric_limits<std::uint64_t>::max() % range;
  std::uint64_t draw = generator();
  while (draw >= limit) draw = generator();
  return static_cast<std::uint32_t>(draw % range);
}

std::vector<std::uint32_t> drawResample(std::size_t n, std::uint64_t seed,
                                        std::uint64_t replicate) {
  std::mt19937_64 generator(replicateSeed(seed, replicate));
  std::vector<std::uint32_t> indices(n);
  const auto size = static_cast<std::uint32_t>(n);
  for (auto& index : indices) index = uniformIndex(generator, size);
  return indices;
}

BootstrapRun runBootstrap(std::size_t n, std::size_t statisticCount,
                          const ReplicateStatistic& statistic, const BootstrapOptions& options) {
  if (options.replicates < 1) throw std::invalid_argument("bootstrap needs at least 1 replicate");
  if (n == 0 || n > std::numeric_limits<std::uint32_t>::max()) {
    throw std::invalid_argument("bootstrap needs 1 to 2^32-1 patients");
  }
  const auto replicates = static_cast<std::size_t>(options.replicates);
  BootstrapRun run;
  run.values.assign(replicates,
                    std::vector<double>(statisticCount, std::numeric_limits<double>::quiet_NaN()));
  std::vector<std::string> failures(replicates);
  std::vector<char> failedFlag(replicates, 0);

  run.threadsUsed =
      runIndexedTasks(replicates, options.threads, options.progress, [&](std::size_t r) {
        try {
          std::vector<double> values = statistic(drawResample(n, options.seed, r));
          if (values.size() != statisticCount) {
            throw std::logic_error(
                "bootstrap statistic returned the wrong number of "
                "values");
          }
          run.values[r] = std::move(values);
        } catch (const AnalysisError& failure) {
          failedFlag[r] = 1;
          failures[r] = failure.what();
        }
      });

  for (std::size_t r = 0; r < replicates; ++r) {
    if (!failedFlag[r]) continue;
    if (run.failed == 0) run.firstFailure = failures[r];
    ++run.failed;
  }
  return run;
}

BootstrapSummary summarize(const BootstrapRun& run, const BootstrapOptions& options) {
  return {options.replicates, options.seed, run.threadsUsed, run.failed, run.firstFailure};
}

double quantileIgnoringNan(std::vector<double> values, double probability) {
  std::erase_if(values, [](double v) { return std::isnan(v); });
  if (values.empty()) return std::numeric_limits<double>::quiet_NaN();
  std::sort(values.begin(), values.end());
  return quantileType7(values, probability);
}

PercentileInterval percentileInterval(const BootstrapRun& run, std::size_t statistic,
                                      double level) {
  std::vector<double> column;
  column.reserve(run.values.size());
  for (const auto& row : run.values) column.push_back(row[statistic]);
  PercentileInterval interval;
  interval.replicatesUsed = static_cast<std::size_t>(
      std::count_if(column.begin(), column.end(), [](double v) { return std::isfinite(v); }));
  const double tail = (1.0 - level) / 2.0;
  interval.lo = quantileIgnoringNan(column, tail);
  interval.hi = quantileIgnoringNan(std::move(column), 1.0 - tail);
  return interval;
}

}  // namespace calivera
