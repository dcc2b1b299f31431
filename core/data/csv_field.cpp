#include "core/data/csv_field.h"

#include <charconv>
#include <cmath>

namespace calivera::csv {

std::string_view trimField(std::string_view field, char delimiter) {
  const auto isSpace = [delimiter](char c) { return c == ' ' || (c == '\t' && delimiter != '\t'); };
  std::size_t begin = 0;
  std::size_t end = field.size();
  while (begin < end && isSpace(field[begin])) ++begin;
  while (end > begin && isSpace(field[end - 1])) --end;
  return field.substr(begin, end - begin);
}

bool parseNumber(std::string_view text, double& value) {
  const char* first = text.data();
  const char* const last = first + text.size();
  if (first != last && *first == '+') {
    ++first;
    // from_chars takes a '-' itself; "+-5" is not a number.
    if (first != last && *first == '-') return false;
  }
  if (first == last) return false;
  double parsed = 0.0;
  if (parsePlainDecimal(first, last, parsed) == last) {
    value = parsed;
    return true;
  }
  const auto [end, error] = std::from_chars(first, last, parsed);
  // from_chars also accepts "inf" and "nan"; those must not silently become numbers.
  if (error != std::errc() || end != last || !std::isfinite(parsed)) return false;
  value = parsed;
  return true;
}

MissingTokens::MissingTokens(const std::vector<std::string>& tokens) {
  for (const std::string& token : tokens) {
    const std::string_view trimmed = trimField(token, 0);
    if (trimmed.empty()) {
      emptyIsMissing_ = true;
      continue;
    }
    tokens_.emplace_back(trimmed);
    if (trimmed.size() < 64) {
      lengthMask_ |= std::uint64_t{1} << trimmed.size();
    } else {
      lengthMask_ |= std::uint64_t{1} << 63;  // long tokens always take the slow comparison
    }
    double ignored = 0.0;
    if (parseNumber(trimmed, ignored)) hasNumericToken_ = true;
  }
}

bool MissingTokens::containsSlow(std::string_view field) const {
  for (const std::string& token : tokens_) {
    if (token == field) return true;
  }
  return false;
}

}  // namespace calivera::csv
