// The plain-decimal fast path of the CSV reader must give bit-identical doubles to
// std::from_chars (the reference: the C++17 standard's correctly rounded conversion) wherever it
// accepts a field, and must decline everything else. Property test on generated decimals.

#include "core/data/csv_field.h"

#include <gtest/gtest.h>

#include <bit>
#include <charconv>
#include <cmath>
#include <cstdint>
#include <random>
#include <string>

namespace calivera::csv {
namespace {

// Checks one text; returns true when the fast path accepted it.
bool agreesWithFromChars(const std::string& text) {
  const char* first = text.data();
  const char* last = first + text.size();
  double fast = 0.0;
  const char* stop = parsePlainDecimal(first, last, fast);
  if (stop == nullptr) return false;
  double reference = 0.0;
  const auto [end, error] = std::from_chars(first, last, reference);
  EXPECT_EQ(error, std::errc()) << text;
  EXPECT_EQ(stop, end) << text;
  EXPECT_EQ(std::bit_cast<std::uint64_t>(fast), std::bit_cast<std::uint64_t>(reference)) << text;
  return true;
}

TEST(CsvField, PlainDecimalsMatchFromCharsBitForBit) {
  std::mt19937_64 random(4180);
  std::uniform_int_distribution<int> digit(0, 9);
  std::uniform_int_distribution<int> length(0, 12);
  std::size_t accepted = 0;
  constexpr int kCases = 300000;
  for (int i = 0; i < kCases; ++i) {
    std::string text = random() % 3 == 0 ? "-" : "";
    const int whole = length(random);
    for (int k = 0; k < whole; ++k) text += static_cast<char>('0' + digit(random));
    if (random() % 4 != 0) {
      text += '.';
      const int fraction = length(random);
      for (int k = 0; k < fraction; ++k) text += static_cast<char>('0' + digit(random));
    }
    if (random() % 5 == 0) text += ",next";  // stops at the delimiter
    accepted += agreesWithFromChars(text) ? 1 : 0;
  }
  EXPECT_GT(accepted, kCases / 2U);  // the comparison covered the fast path, not only refusals
}

TEST(CsvField, FormattedDoublesMatchFromChars) {
  std::mt19937_64 random(2026);
  std::uniform_real_distribution<double> uniform(-1e6, 1e6);
  char buffer[64];
  for (int i = 0; i < 100000; ++i) {
    const double value = uniform(random) / static_cast<double>(1 << (i % 20));
    for (const int precision : {0, 1, 2, 3, 6, 9, 15}) {
      const auto end =
          std::to_chars(buffer, buffer + sizeof buffer, value, std::chars_format::fixed, precision);
      agreesWithFromChars(std::string(buffer, end.ptr));
    }
    const auto shortest = std::to_chars(buffer, buffer + sizeof buffer, value);
    agreesWithFromChars(std::string(buffer, shortest.ptr));
  }
}

TEST(CsvField, PlainDecimalDeclinesWhatItCannotDoExactly) {
  double value = 0.0;
  for (const char* text : {"", "-", ".", "1e3", "1E3", "12345678901234567890",  // 20 digits
                           "9007199254740993",                                  // > 2^53
                           "0.00000000000000000000001", "inf", "nan", "+5", "abc"}) {
    const std::string s(text);
    EXPECT_EQ(parsePlainDecimal(s.data(), s.data() + s.size(), value), nullptr) << text;
  }
  const std::string negativeZero = "-0.0";
  ASSERT_NE(parsePlainDecimal(negativeZero.data(), negativeZero.data() + 4, value), nullptr);
  EXPECT_TRUE(std::signbit(value));
}

TEST(CsvField, NumberAndMissingRules) {
  double value = 0.0;
  EXPECT_TRUE(parseNumber("+5", value));
  EXPECT_EQ(value, 5.0);
  EXPECT_FALSE(parseNumber("+-5", value));
  EXPECT_FALSE(parseNumber("+", value));
  EXPECT_EQ(trimField(" \t7 ", ','), "7");
  EXPECT_EQ(trimField("\t7\t", '\t'), "\t7\t");
  const MissingTokens tokens({"", " NA ", "-99", "not recorded"});
  EXPECT_TRUE(tokens.contains(""));
  EXPECT_TRUE(tokens.contains("NA"));
  EXPECT_TRUE(tokens.contains("-99"));
  EXPECT_TRUE(tokens.contains("not recorded"));
  EXPECT_FALSE(tokens.contains("na"));
  EXPECT_TRUE(tokens.hasNumericToken());
  EXPECT_FALSE(MissingTokens({"NA"}).contains(""));
}

}  // namespace
}  // namespace calivera::csv
