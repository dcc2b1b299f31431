// The seeded bootstrap engine: identical results for any thread count, failures counted,
// cancellation honoured, percentile definition.
#include "core/uncertainty/bootstrap.h"

#include <gtest/gtest.h>

#include <atomic>
#include <cmath>
#include <numeric>

#include "core/util/errors.h"

namespace calivera {
namespace {

std::vector<double> meanAndMaxIndex(const std::vector<std::uint32_t>& sample) {
  const double sum = std::accumulate(sample.begin(), sample.end(), 0.0);
  return {sum / static_cast<double>(sample.size()),
          static_cast<double>(*std::max_element(sample.begin(), sample.end()))};
}

TEST(Bootstrap, SameSeedGivesIdenticalResultsForAnyThreadCount) {
  BootstrapOptions options;
  options.replicates = 57;
  options.seed = 12345;
  options.threads = 1;
  const BootstrapRun one = runBootstrap(1000, 2, meanAndMaxIndex, options);
  for (unsigned threads : {2u, 3u, 8u}) {
    options.threads = threads;
    const BootstrapRun many = runBootstrap(1000, 2, meanAndMaxIndex, options);
    ASSERT_EQ(many.values.size(), one.values.size());
    for (std::size_t r = 0; r < one.values.size(); ++r) {
      EXPECT_EQ(many.values[r], one.values[r]) << "replicate " << r << ", threads " << threads;
    }
  }
}

TEST(Bootstrap, DifferentSeedsAndReplicatesDrawDifferentResamples) {
  EXPECT_NE(drawResample(100, 1, 0), drawResample(100, 2, 0));
  EXPECT_NE(drawResample(100, 1, 0), drawResample(100, 1, 1));
  EXPECT_EQ(drawResample(100, 7, 3), drawResample(100, 7, 3));
}

TEST(Bootstrap, ResampleIsUniformWithReplacement) {
  // Property: over many draws each index appears about once per resample (mean count 1), and a
  // resample leaves out about 1/e of the patients (Efron & Tibshirani 1993, 0.368 for large n).
  const std::size_t n = 2000;
  std::vector<double> counts(n, 0.0);
  double leftOut = 0.0;
  const int replicates = 200;
  for (int r = 0; r < replicates; ++r) {
    std::vector<int> seen(n, 0);
    for (const auto i : drawResample(n, 99, static_cast<std::uint64_t>(r))) {
      ASSERT_LT(i, n);
      counts[i] += 1.0;
      seen[i] = 1;
    }
    leftOut += static_cast<double>(std::count(seen.begin(), seen.end(), 0)) / n;
  }
  EXPECT_NEAR(leftOut / replicates, std::exp(-1.0), 0.005);
  const double meanCount = std::accumulate(counts.begin(), counts.end(), 0.0) / n / replicates;
  EXPECT_DOUBLE_EQ(meanCount, 1.0);
}

TEST(Bootstrap, AnalysisErrorsMarkReplicatesAsFailedAndOthersPropagate) {
  BootstrapOptions options;
  options.replicates = 20;
  options.threads = 2;
  const auto failOdd = [](const std::vector<std::uint32_t>& sample) -> std::vector<double> {
    if (sample[0] % 2 == 1) throw AnalysisError("odd first index");
    return {1.0};
  };
  const BootstrapRun run = runBootstrap(50, 1, failOdd, options);
  std::size_t nan = 0;
  for (const auto& row : run.values) nan += std::isnan(row[0]) ? 1 : 0;
  EXPECT_EQ(run.failed, nan);
  EXPECT_GT(run.failed, 0u);
  EXPECT_EQ(run.firstFailure, "odd first index");
  const auto broken = [](const std::vector<std::uint32_t>&) -> std::vector<double> {
    throw std::runtime_error("bug");
  };
  EXPECT_THROW(runBootstrap(50, 1, broken, options), std::runtime_error);
}

TEST(Bootstrap, CancellationThrowsCancelled) {
  BootstrapOptions options;
  options.replicates = 100000;
  options.threads = 2;
  std::atomic<int> calls{0};
  options.progress = [&](double) { return ++calls < 2; };
  EXPECT_THROW(runBootstrap(200, 2, meanAndMaxIndex, options), Cancelled);
}

TEST(Bootstrap, ProgressReachesOneOnTheCallingThread) {
  BootstrapOptions options;
  options.replicates = 10;
  double last = -1.0;
  options.progress = [&](double f) {
    EXPECT_GE(f, last);
    last = f;
    return true;
  };
  runBootstrap(20, 2, meanAndMaxIndex, options);
  EXPECT_DOUBLE_EQ(last, 1.0);
}

TEST(Bootstrap, QuantileIsHyndmanFanType7IgnoringNan) {
  // R: quantile(c(1, 2, 3, 4), c(0.25, 0.975)) gives 1.75 and 3.925 (type 7, computed).
  const double nan = std::nan("");
  EXPECT_DOUBLE_EQ(quantileIgnoringNan({4, nan, 1, 3, 2}, 0.25), 1.75);
  EXPECT_DOUBLE_EQ(quantileIgnoringNan({1, 2, 3, 4}, 0.975), 3.925);
  EXPECT_TRUE(std::isnan(quantileIgnoringNan({nan}, 0.5)));
}

}  // namespace
}  // namespace calivera
