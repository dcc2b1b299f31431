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
