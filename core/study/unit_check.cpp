#include "core/study/unit_check.h"

#include <cctype>

namespace calivera {

namespace {

std::string normalized(const std::string& unit) {
  std::string out;
  for (std::size_t i = 0; i < unit.size(); ++i) {
    const unsigned char c = static_cast<unsigned char>(unit[i]);
    // U+00B5 MICRO SIGN and U+03BC GREEK SMALL LETTER MU (UTF-8) both mean micro.
    if ((c == 0xC2 && i + 1 < unit.size() && static_cast<unsigned char>(unit[i + 1]) == 0xB5) ||
        (c == 0xCE && i + 1 < unit.size() && static_cast<unsigned char>(unit[i + 1]) == 0xBC)) {
      out += 'u';
      ++i;
    } else if (!std::isspace(c)) {
      out += static_cast<char>(std::tolower(c));
    }
  }
  return out;
}

}  // namespace

std::optional<std::string> unitFromHeader(const std::string& header) {
  for (const auto& [open, close] : {std::pair{'[', ']'}, std::pair{'(', ')'}}) {
    const auto end = header.rfind(close);
    if (end == std::string::npos || end + 1 < header.find_last_not_of(" \t") + 1) continue;
    const auto start = header.rfind(open, end);
    if (start == std::string::npos || end <= start + 1) continue;
    return header.substr(start + 1, end - start - 1);
  }
  return std::nullopt;
}

bool sameUnit(const std::string& a, const std::string& b) {
  return normalized(a) == normalized(b);
}

UnitCheck checkUnit(const std::optional<std::string>& modelUnit, const std::string& columnHeader) {
  const std::optional<std::string> columnUnit = unitFromHeader(columnHeader);
  if (!modelUnit) return {UnitVerdict::NotStated, "the model file states no unit"};
  if (!columnUnit) {
    return {UnitVerdict::ColumnSilent, "the model expects " + *modelUnit +
                                           "; the column header states no unit: check the "
                                           "values are in " +
                                           *modelUnit};
  }
  if (sameUnit(*modelUnit, *columnUnit)) {
    return {UnitVerdict::Matches, "units agree (" + *modelUnit + ")"};
  }
  return {UnitVerdict::Differs, "unit mismatch: the model expects " + *modelUnit +
                                    " but the column is in " + *columnUnit +
                                    "; convert the column before validating"};
}

}  // namespace calivera
