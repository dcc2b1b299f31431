#include "app/cli/arguments.h"

#include <charconv>
#include <cmath>

#include "core/util/errors.h"

namespace calivera::cli {

Arguments::Arguments(const std::vector<std::string>& words, const OptionSpec& spec) {
  for (std::size_t i = 0; i < words.size(); ++i) {
    const std::string& word = words[i];
    if (word.rfind("--", 0) != 0) {
      positional_.push_back(word);
      continue;
    }
    std::string name = word;
    std::optional<std::string> inlineValue;
    if (const auto eq = word.find('='); eq != std::string::npos) {
      name = word.substr(0, eq);
      inlineValue = word.substr(eq + 1);
    }
    if (spec.flags.count(name)) {
      if (inlineValue) throw InputError(name + " takes no value");
      flags_.insert(name);
    } else if (spec.valued.count(name)) {
      if (inlineValue) {
        valued_.emplace_back(name, *inlineValue);
      } else {
        if (i + 1 >= words.size()) throw InputError(name + " needs a value");
        valued_.emplace_back(name, words[++i]);
      }
    } else {
      throw InputError("unknown option " + name);
    }
  }
}

bool Arguments::has(const std::string& name) const {
  if (flags_.count(name)) return true;
  for (const auto& [key, value] : valued_) {
    if (key == name) return true;
  }
  return false;
}

std::optional<std::string> Arguments::value(const std::string& name) const {
  std::optional<std::string> found;
  for (const auto& [key, value] : valued_) {
    if (key == name) found = value;
  }
  return found;
}

std::vector<std::string> Arguments::values(const std::string& name) const {
  std::vector<std::string> found;
  for (const auto& [key, value] : valued_) {
    if (key == name) found.push_back(value);
  }
  return found;
}

std::string Arguments::required(const std::string& name) const {
  if (auto found = value(name)) return *found;
  throw InputError("missing required option " + name);
}

std::vector<std::string> splitList(const std::string& text, const std::string& option) {
  std::vector<std::string> items;
  std::size_t start = 0;
  while (true) {
    const std::size_t comma = text.find(',', start);
    const std::string item =
        text.substr(start, comma == std::string::npos ? std::string::npos : comma - start);
    if (item.empty()) throw InputError(option + ": empty item in list '" + text + "'");
    items.push_back(item);
    if (comma == std::string::npos) break;
    start = comma + 1;
  }
  return items;
}

double parseNumber(const std::string& text, const std::string& option) {
  double value = 0.0;
  const char* end = text.data() + text.size();
  const auto [ptr, ec] = std::from_chars(text.data(), end, value);
  if (text.empty() || ec != std::errc() || ptr != end || !std::isfinite(value)) {
    throw InputError(option + ": '" + text + "' is not a number");
  }
  return value;
}

long long parseInteger(const std::string& text, const std::string& option) {
  long long value = 0;
  const char* end = text.data() + text.size();
  const auto [ptr, ec] = std::from_chars(text.data(), end, value);
  if (text.empty() || ec != std::errc() || ptr != end) {
    throw InputError(option + ": '" + text + "' is not a whole number");
  }
  return value;
}

}  // namespace calivera::cli
