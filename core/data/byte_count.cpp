#include "core/data/byte_count.h"

#include <cstdint>

#if defined(__SSE2__)
#include <emmintrin.h>
#endif

namespace calivera::csv {

#if defined(__SSE2__)
namespace {

// Sums the per-byte counters (each at most 255) of `counters` into one number.
std::size_t sumCounters(__m128i counters) {
  const __m128i sums = _mm_sad_epu8(counters, _mm_setzero_si128());
  return static_cast<std::size_t>(_mm_cvtsi128_si32(sums)) +
         static_cast<std::size_t>(_mm_cvtsi128_si32(_mm_srli_si128(sums, 8)));
}

// Counts the bytes equal to `wanted` in whole 16-byte blocks from p; returns where it stopped.
// A match compares as 0xFF (-1), so subtracting it adds one to a per-byte counter, flushed
// before any counter could pass 255.
const char* countBlocks(const char* p, const char* end, __m128i wanted, std::size_t& count,
                        __m128i quote, __m128i* quotes) {
  while (end - p >= 16) {
    __m128i counters = _mm_setzero_si128();
    for (int i = 0; i < 255 && end - p >= 16; ++i, p += 16) {
      const __m128i block = _mm_loadu_si128(reinterpret_cast<const __m128i*>(p));
      counters = _mm_sub_epi8(counters, _mm_cmpeq_epi8(block, wanted));
      if (quotes != nullptr) *quotes = _mm_or_si128(*quotes, _mm_cmpeq_epi8(block, quote));
    }
    count += sumCounters(counters);
  }
  return p;
}

}  // namespace
#endif

std::size_t countByte(const char* begin, const char* end, char value) {
  std::size_t count = 0;
  const char* p = begin;
#if defined(__SSE2__)
  p = countBlocks(p, end, _mm_set1_epi8(value), count, _mm_setzero_si128(), nullptr);
#endif
  for (; p < end; ++p) count += *p == value ? 1 : 0;
  return count;
}

LineTally tallyLines(const char* begin, const char* end) {
  LineTally tally;
  const char* p = begin;
#if defined(__SSE2__)
  __m128i quotes = _mm_setzero_si128();
  p = countBlocks(p, end, _mm_set1_epi8('\n'), tally.lineBreaks, _mm_set1_epi8('"'), &quotes);
  tally.quote = _mm_movemask_epi8(quotes) != 0;
#endif
  for (; p < end; ++p) {
    tally.lineBreaks += *p == '\n' ? 1 : 0;
    tally.quote = tally.quote || *p == '"';
  }
  return tally;
}

}  // namespace calivera::csv
