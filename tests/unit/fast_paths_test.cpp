// The fast paths of issue 13 against the general code they replace, on many values: the shortest
// decimal text against std::to_chars (C++17's shortest round-trip conversion, the canonical
// number form of the analysed-data fingerprint), and the SSE2 byte counts against std::count.
// Reference: the C++ standard library itself (common practice for a fast path: it must be
// byte-identical to the slow one, not merely close).

#include <gtest/gtest.h>

#include <algorithm>
#include <charconv>
#include <cmath>
#include <cstdint>
#include <cstring>
#include <limits>
#include <random>
#include <string>

#include "core/data/byte_count.h"
#include "core/util/shortest_decimal.h"

namespace calivera {
namespace {

std::string viaToChars(double value) {
  char buffer[32];
  const auto result = std::to_chars(buffer, buffer + sizeof buffer, value);
  return std::string(buffer, result.ptr);
}

std::string viaFastPath(double value) {
  std::string out;
  appendShortest(out, value);
  return out;
}

TEST(ShortestDecimal, AgreesWithToCharsOnEdgeValues) {
  const double edges[] = {0.0,
                          -0.0,
                          0.01,
                          -0.01,
                          0.1,
                          0.3,
                          1.0,
                          -1.0,
                          2.5,
                          99999.0,
                          99999.99,
                          1e5,
                          1e-3,
                          0.009999,
                          1e4,
                          12345.678,
                          0.123456789,
                          1e-7,
                          123456789.0,
                          1e300,
                          5e-324,
                          std::numeric_limits<double>::infinity(),
                          -std::numeric_limits<double>::infinity(),
                          std::nextafter(0.01, 0.0),
                          std::nextafter(0.01, 1.0),
                          std::nextafter(1e5, 0.0),
                          1.0 / 3.0,
                          2.0 / 3.0,
                          0.1 + 0.2};
  for (const double v : edges) EXPECT_EQ(viaFastPath(v), viaToChars(v)) << v;
  EXPECT_EQ(viaFastPath(std::numeric_limits<double>::quiet_NaN()), "nan");
}

TEST(ShortestDecimal, AgreesWithToCharsOnParsedDecimals) {
  // Values as cohort files hold them: a few decimals, read back from text.
  std::mt19937_64 random(13);
  std::uniform_int_distribution<int> decimals(0, 10);
  std::uniform_real_distribution<double> magnitude(-6.0, 6.0);
  for (int i = 0; i < 1000000; ++i) {
    const double raw = std::pow(10.0, magnitude(random)) * (random() % 2 == 0 ? 1.0 : -1.0);
    char text[64];
    const auto written =
        std::to_chars(text, text + sizeof text, raw, std::chars_format::fixed, decimals(random));
    double v = 0.0;
    std::from_chars(text, written.ptr, v);
    ASSERT_EQ(viaFastPath(v), viaToChars(v)) << std::string(text, written.ptr);
  }
}

TEST(ShortestDecimal, AgreesWithToCharsOnArbitraryDoubles) {
  std::mt19937_64 random(17);
  std::uniform_real_distribution<double> uniform(-2e5, 2e5);
  for (int i = 0; i < 1000000; ++i) {
    const double v = i % 2 == 0 ? uniform(random) : uniform(random) * 1e-6;
    ASSERT_EQ(viaFastPath(v), viaToChars(v)) << v;
  }
}

TEST(ShortestDecimal, AnyDecimalsHintGivesTheSameText) {
  std::mt19937_64 random(23);
  std::uniform_int_distribution<int> decimals(0, 9);
  std::uniform_real_distribution<double> uniform(-3e4, 3e4);
  int carried = 0;
  for (int i = 0; i < 300000; ++i) {
    double v = uniform(random);
    if (i % 3 != 0) v = std::round(v * std::pow(10.0, decimals(random))) / std::pow(10.0, 4);
    const std::string expected = viaToChars(v);
    for (int hint = -1; hint <= 11; hint += 3) {
      std::string out;
      int h = hint;
      appendShortest(out, v, h);
      ASSERT_EQ(out, expected) << v << " hint " << hint;
    }
    std::string out;
    appendShortest(out, v, carried);  // the hint as a column carries it
    ASSERT_EQ(out, expected) << v;
  }
}

TEST(ByteCount, AgreesWithStdCountAtEveryAlignmentAndLength) {
  std::mt19937_64 random(5);
  std::string text(1500, ' ');
  for (char& c : text) c = ",\n\"ab1"[random() % 6];
  for (std::size_t begin = 0; begin < 40; ++begin) {
    for (std::size_t length = 0; begin + length <= text.size(); length += 1 + length / 7) {
      const char* first = text.data() + begin;
      const char* last = first + length;
      EXPECT_EQ(csv::countByte(first, last, ','),
                static_cast<std::size_t>(std::count(first, last, ',')));
      const csv::LineTally tally = csv::tallyLines(first, last);
      EXPECT_EQ(tally.lineBreaks, static_cast<std::size_t>(std::count(first, last, '\n')));
      EXPECT_EQ(tally.quote, std::find(first, last, '"') != last);
    }
  }
}

TEST(ByteCount, CountsBeyondTheByteCounterLimit) {
  // More than 255 blocks of 16 matching bytes: the per-byte counters must be flushed in time.
  const std::string text(16 * 1000 + 7, '\n');
  EXPECT_EQ(csv::countByte(text.data(), text.data() + text.size(), '\n'), text.size());
  EXPECT_EQ(csv::tallyLines(text.data(), text.data() + text.size()).lineBreaks, text.size());
  EXPECT_FALSE(csv::tallyLines(text.data(), text.data() + text.size()).quote);
}

}  // namespace
}  // namespace calivera
