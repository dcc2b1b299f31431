#include "core/metrics/sorted_cohort.h"

#include <algorithm>
#include <cmath>
#include <cstring>
#include <stdexcept>
#include <utility>

namespace calivera {

std::size_t SortedCohort::firstAtOrAbove(double threshold) const {
  return static_cast<std::size_t>(std::lower_bound(risk.begin(), risk.end(), threshold) -
                                  risk.begin());
}

ConfusionCounts SortedCohort::countsAt(double threshold) const {
  const std::size_t first = firstAtOrAbove(threshold);
  ConfusionCounts c;
  c.tp = eventsAtOrAbove[first];
  c.fp = (size() - first) - c.tp;
  c.fn = events - c.tp;
  c.tn = first - c.fn;
  return c;
}

namespace {

// Stable LSD radix sort of non-negative doubles by their bit patterns (which order like the
// values for +0.0 and positive finite numbers), carrying the input index: 11-bit digits, passes
// whose digit is the same for every key skipped. At 10^6 rows it is several times faster than a
// comparison sort, and stability keeps tied risks in input order.
void radixSortByRisk(std::vector<std::uint64_t>& keys, std::vector<std::uint32_t>& index) {
  constexpr int kBits = 11;
  constexpr std::size_t kBuckets = std::size_t{1} << kBits;
  constexpr int kPasses = (64 + kBits - 1) / kBits;
  const std::size_t n = keys.size();
  std::vector<std::size_t> counts(kPasses * kBuckets, 0);
  for (const std::uint64_t key : keys) {
    for (int pass = 0; pass < kPasses; ++pass) {
      ++counts[pass * kBuckets + ((key >> (pass * kBits)) & (kBuckets - 1))];
    }
  }
  std::vector<std::uint64_t> keysOut(n);
  std::vector<std::uint32_t> indexOut(n);
  for (int pass = 0; pass < kPasses; ++pass) {
    std::size_t* count = counts.data() + pass * kBuckets;
    if (std::any_of(count, count + kBuckets, [n](std::size_t c) { return c == n; })) continue;
    std::size_t offset = 0;
    for (std::size_t b = 0; b < kBuckets; ++b) {
      const std::size_t c = count[b];
      count[b] = offset;
      offset += c;
    }
    const int shift = pass * kBits;
    for (std::size_t i = 0; i < n; ++i) {
      const std::size_t destination = count[(keys[i] >> shift) & (kBuckets - 1)]++;
      keysOut[destination] = keys[i];
      indexOut[destination] = index[i];
    }
    keys.swap(keysOut);
    index.swap(indexOut);
  }
}

}  // namespace

SortedCohort sortCohort(const std::vector<double>& risk, const std::vector<double>& outcome) {
  if (risk.size() != outcome.size()) throw std::invalid_argument("risk and outcome sizes differ");
  const std::size_t n = risk.size();
  std::vector<std::uint64_t> keys(n);
  std::vector<std::uint32_t> index(n);
  bool radixable = true;
  for (std::size_t i = 0; i < n; ++i) {
    const double r = risk[i] + 0.0;  // -0.0 becomes +0.0
    radixable = radixable && r >= 0.0 && std::isfinite(r);
    std::memcpy(&keys[i], &r, sizeof r);
    index[i] = static_cast<std::uint32_t>(i);
  }
  if (radixable) {
    radixSortByRisk(keys, index);
  } else {
    std::stable_sort(index.begin(), index.end(),
                     [&risk](std::uint32_t a, std::uint32_t b) { return risk[a] < risk[b]; });
  }
  SortedCohort sorted;
  sorted.risk.resize(n);
  sorted.event.resize(n);
  sorted.order = std::move(index);
  for (std::size_t i = 0; i < n; ++i) {
    sorted.risk[i] = risk[sorted.order[i]] + 0.0;
    sorted.event[i] = outcome[sorted.order[i]] > 0.5 ? 1 : 0;
  }
  sorted.eventsAtOrAbove.assign(n + 1, 0);
  for (std::size_t i = n; i-- > 0;) {
    sorted.eventsAtOrAbove[i] = sorted.eventsAtOrAbove[i + 1] + sorted.event[i];
  }
  sorted.events = sorted.eventsAtOrAbove[0];
  return sorted;
}

double quantileType7(const std::vector<double>& sortedValues, double probability) {
  if (sortedValues.empty()) throw std::invalid_argument("quantile of no values");
  // Written the way R's quantile(type = 7) evaluates it (1-based index, (1 - h) x_lo + h x_hi),
  // so cut points agree bit for bit and ties at a cut point fall on the same side.
  const double index = 1.0 + static_cast<double>(sortedValues.size() - 1) * probability;
  const double lo = std::floor(index);
  const double hi = std::ceil(index);
  const double xLo = sortedValues[static_cast<std::size_t>(lo) - 1];
  const double xHi = sortedValues[std::min(static_cast<std::size_t>(hi), sortedValues.size()) - 1];
  if (!(index > lo) || xHi == xLo) return xLo;
  const double h = index - lo;
  return (1.0 - h) * xLo + h * xHi;
}

}  // namespace calivera
