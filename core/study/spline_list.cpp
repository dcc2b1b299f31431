#include "core/study/spline_list.h"

#include <charconv>
#include <sstream>

#include "core/fit/spline_knots.h"
#include "core/util/errors.h"

namespace calivera {
namespace {

std::string trimmed(const std::string& s) {
  const auto first = s.find_first_not_of(" \t");
  if (first == std::string::npos) return {};
  return s.substr(first, s.find_last_not_of(" \t") - first + 1);
}

}  // namespace

std::map<std::string, int> parseSplineList(const std::string& text) {
  std::map<std::string, int> out;
  std::stringstream items(text);
  for (std::string item; std::getline(items, item, ',');) {
    item = trimmed(item);
    if (item.empty()) continue;
    const auto eq = item.find('=');
    const std::string column =
        eq == std::string::npos ? std::string() : trimmed(item.substr(0, eq));
    const std::string count =
        eq == std::string::npos ? std::string() : trimmed(item.substr(eq + 1));
    int knots = 0;
    const auto [end, error] = std::from_chars(count.data(), count.data() + count.size(), knots);
    if (column.empty() || count.empty() || error != std::errc() ||
        end != count.data() + count.size() || knots < kMinSplineKnots || knots > kMaxSplineKnots) {
      throw InputError("splines: '" + item + "' is not COLUMN=KNOTS with 3 to 7 knots");
    }
    if (!out.emplace(column, knots).second) {
      throw InputError("splines: '" + column + "' is given twice");
    }
  }
  return out;
}

std::string formatSplineList(const std::map<std::string, int>& splines) {
  std::string text;
  for (const auto& [column, knots] : splines) {
    text += (text.empty() ? "" : ", ") + column + "=" + std::to_string(knots);
  }
  return text;
}

}  // namespace calivera
