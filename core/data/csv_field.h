#pragma once
// How one CSV field is read as a value, shared by the sequential and the parallel CSV paths so
// both give identical tables.
//
// Rules (decided for Calivera, documented in csv_reader.h):
// - Surrounding spaces are not part of a value: ' 5 ' is the number 5 and ' yes' the level
//   'yes'. Tabs count as spaces unless the tab is the delimiter.
// - A number is what std::from_chars (general format) accepts, optionally preceded by one '+',
//   consuming the whole field and giving a finite value: '1e3', '+5', '-0.25', '.5', '5.' are
//   numbers; 'inf', 'nan', '1e999' (out of range), '0x1A', '1,5' (decimal comma) and '5 mg' are
//   not, so a column holding them is a text column.
// - Missing: the field, trimmed, equals one of the missing tokens (by default '' and 'NA').

#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

namespace calivera::csv {

std::string_view trimField(std::string_view field, char delimiter);

// Strict decimal number as described above; `value` is written only on success.
bool parseNumber(std::string_view text, double& value);

// Fast path for the plain decimals that fill most cohort files ("-12.375", "0.5", "7"): at most
// 19 significant digits, no exponent, the value m x 10^e with m <= 2^53 and |e| <= 22. Then m
// and 10^|e| are exact doubles and one IEEE multiplication or division rounds correctly, so the
// result is bit-identical to std::from_chars (Clinger, "How to read floating point numbers
// accurately", PLDI 1990, the exact fast path). Parses from `first` up to the first character
// that cannot continue the number; returns where it stopped, or nullptr when the text is not such
// a plain decimal (the caller then uses std::from_chars).
inline const char* parsePlainDecimal(const char* first, const char* last, double& value) {
  static constexpr double kPowers[] = {1e0,  1e1,  1e2,  1e3,  1e4,  1e5,  1e6,  1e7,
                                       1e8,  1e9,  1e10, 1e11, 1e12, 1e13, 1e14, 1e15,
                                       1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22};
  const char* p = first;
  const bool negative = p != last && *p == '-';
  if (negative) ++p;
  std::uint64_t mantissa = 0;
  int digits = 0;  // significant digits taken into the mantissa
  int scale = 0;   // digits after the decimal point
  bool anyDigit = false;
  const auto take = [&](char c) {
    if (mantissa == 0 && c == '0') return;  // leading zeros are not significant
    mantissa = mantissa * 10 + static_cast<std::uint64_t>(c - '0');
    ++digits;
  };
  for (; p != last && *p >= '0' && *p <= '9'; ++p) {
    take(*p);
    anyDigit = true;
  }
  if (p != last && *p == '.') {
    for (++p; p != last && *p >= '0' && *p <= '9'; ++p) {
      take(*p);
      ++scale;
      anyDigit = true;
    }
  }
  if (!anyDigit || digits > 19 || scale > 22) return nullptr;
  if (p != last && (*p == 'e' || *p == 'E')) return nullptr;
  if (mantissa > (std::uint64_t{1} << 53)) return nullptr;
  const double magnitude = static_cast<double>(mantissa) / kPowers[scale];
  value = negative ? -magnitude : magnitude;
  return p;
}

class MissingTokens {
 public:
  explicit MissingTokens(const std::vector<std::string>& tokens);
  // `field` must already be trimmed.
  bool contains(std::string_view field) const {
    if (field.empty()) return emptyIsMissing_;
    if (field.size() < 64 && !(lengthMask_ >> field.size() & 1U)) return false;
    return containsSlow(field);
  }
  // True when some token reads as a number (e.g. '-99'): then a parsed number must still be
  // checked against the tokens.
  bool hasNumericToken() const { return hasNumericToken_; }

 private:
  bool containsSlow(std::string_view field) const;

  std::vector<std::string> tokens_;  // trimmed, non-empty
  std::uint64_t lengthMask_ = 0;     // bit n set when a token has length n (n < 64)
  bool emptyIsMissing_ = false;
  bool hasNumericToken_ = false;
};

}  // namespace calivera::csv
