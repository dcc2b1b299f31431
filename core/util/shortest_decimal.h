#pragma once
// Appends the shortest decimal text that reads back to the same double, exactly as
// std::to_chars(first, last, value) writes it (the canonical number form of the analysed-data
// fingerprint), but several times faster for the values cohorts hold: a number of magnitude in
// [0.01, 1e5) with at most 9 decimals is written from its scaled integer; anything else goes to
// std::to_chars. tests/unit/shortest_decimal_test.cpp checks the two agree on millions of values.

#include <cstddef>
#include <string>

namespace calivera {

void appendShortest(std::string& out, double value);

// The same text; decimalsHint carries the number of decimals of the previous value of a column
// between calls (start it at 0), which makes a column of like values faster. Any hint gives the
// same text.
void appendShortest(std::string& out, double value, int& decimalsHint);

// The same text written at `out`, which must have room for kMaxShortestLength characters;
// returns the end of what was written. For callers that fill a buffer of many values.
inline constexpr std::size_t kMaxShortestLength = 32;
char* writeShortest(char* out, double value, int& decimalsHint);

}  // namespace calivera
