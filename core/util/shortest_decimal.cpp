#include "core/util/shortest_decimal.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <cstdint>
#include <cstring>

namespace calivera {
namespace {

constexpr double kPowers[] = {1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9};

// True when |value| is exactly the nearest double to some decimal with k digits after the point;
// m receives that decimal times 10^k. Monotone in k: a decimal with k digits also has k + 1.
bool fixedDigitsSuffice(double magnitude, int k, double& m) {
  // Rounded to the nearest integer by truncating x + 0.5 (x < 1e14, so exact enough): a
  // library rint is a call on baseline x86-64. Where the sum rounds up at a half, the check
  // fails for both neighbours anyway, since a half-integer is never a whole number.
  m = static_cast<double>(static_cast<std::int64_t>(magnitude * kPowers[k] + 0.5));
  return m / kPowers[k] == magnitude;
}

char* writeFixed(char* out, bool negative, double m, int k) {
  // Digits from the right into a scratch buffer; the point goes in after k of them (no division
  // by a run-time power), then one copy to `out`.
  auto digits = static_cast<std::uint64_t>(static_cast<std::int64_t>(m));
  char buffer[32];
  char* const end = buffer + sizeof buffer;
  char* p = end;
  for (int i = 0; i < k; ++i) {
    *--p = static_cast<char>('0' + digits % 10);
    digits /= 10;
  }
  if (k > 0) *--p = '.';
  do {
    *--p = static_cast<char>('0' + digits % 10);
    digits /= 10;
  } while (digits != 0);
  if (negative) *--p = '-';
  const auto length = static_cast<std::size_t>(end - p);
  std::memcpy(out, p, length);
  return out + length;
}

// Why the fixed-point form is the one std::to_chars writes: to_chars picks the shortest
// round-trip digits (the closest to the value among them) and writes them in fixed notation
// unless scientific is strictly shorter, which for magnitudes in [0.01, 1e5) it never is. The
// smallest k for which fixedDigitsSuffice holds gives the fewest digits after the point that read
// back to v, so the fewest significant digits, and m is the closest such decimal. The search
// starts at `hint` (the previous value's k: a column's values tend to share it) and walks down
// or up from there, which by monotonicity finds the same smallest k as a walk from 0.
char* writeFixedShortest(char* out, double value, int& hint) {
  const double magnitude = std::fabs(value);
  if (!(magnitude >= 0.01 && magnitude < 1e5)) return nullptr;
  constexpr int kMaxDigits = 9;
  int k = std::clamp(hint, 0, kMaxDigits);
  double m = 0.0;
  if (fixedDigitsSuffice(magnitude, k, m)) {
    double fewer = 0.0;
    while (k > 0 && fixedDigitsSuffice(magnitude, k - 1, fewer)) {
      --k;
      m = fewer;
    }
  } else {
    do {
      if (++k > kMaxDigits) return nullptr;
    } while (!fixedDigitsSuffice(magnitude, k, m));
  }
  hint = k;
  return writeFixed(out, value < 0, m, k);
}

}  // namespace

char* writeShortest(char* out, double value, int& decimalsHint) {
  if (char* end = writeFixedShortest(out, value, decimalsHint)) return end;
  const auto [end, error] = std::to_chars(out, out + kMaxShortestLength, value);
  if (error == std::errc()) return end;
  *out = '?';
  return out + 1;
}

void appendShortest(std::string& out, double value) {
  int hint = 0;
  appendShortest(out, value, hint);
}

void appendShortest(std::string& out, double value, int& decimalsHint) {
  char buffer[kMaxShortestLength];
  out.append(buffer, writeShortest(buffer, value, decimalsHint));
}

}  // namespace calivera
