#include "core/report/csv_text.h"

#include <charconv>

namespace calivera {

bool csvLooksLikeFormula(const std::string& text) {
  if (text.empty()) return false;
  const char first = text.front();
  if (first != '=' && first != '+' && first != '-' && first != '@' && first != '\t' &&
      first != '\r') {
    return false;
  }
  if (first == '+' || first == '-') {
    // A signed number is data, not a formula.
    double value = 0.0;
    const char* begin = text.data() + (first == '+' ? 1 : 0);
    const char* end = text.data() + text.size();
    const auto [ptr, error] = std::from_chars(begin, end, value);
    if (error == std::errc() && ptr == end && begin != end) return false;
  }
  return true;
}

std::string csvCell(const std::string& text, bool quote) {
  const bool formula = csvLooksLikeFormula(text);
  const std::string body = formula ? "'" + text : text;
  if (!quote) return body;
  if (!formula && body.find_first_of(",\"\n\r") == std::string::npos) return body;
  std::string out = "\"";
  for (const char c : body) {
    if (c == '"') {
      out += "\"\"";
    } else {
      out += c;
    }
  }
  return out + "\"";
}

}  // namespace calivera
