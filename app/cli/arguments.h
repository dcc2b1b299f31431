#pragma once
// Command-line options of one command: `--name value` pairs (repeatable), bare `--flag`s and
// positional words. Each command declares what it accepts; anything else is a usage error.

#include <optional>
#include <set>
#include <string>
#include <vector>

namespace calivera::cli {

struct OptionSpec {
  std::set<std::string> valued;  // take a value: "--data"
  std::set<std::string> flags;   // take none: "--firth"
};

class Arguments {
 public:
  // Throws InputError ("unknown option --x", "--data needs a value").
  Arguments(const std::vector<std::string>& words, const OptionSpec& spec);

  bool has(const std::string& name) const;
  std::optional<std::string> value(const std::string& name) const;  // last occurrence
  std::vector<std::string> values(const std::string& name) const;   // every occurrence
  // Throws InputError "missing required option --name".
  std::string required(const std::string& name) const;
  const std::vector<std::string>& positional() const { return positional_; }

 private:
  std::vector<std::pair<std::string, std::string>> valued_;
  std::set<std::string> flags_;
  std::vector<std::string> positional_;
};

// "a,b,c" -> {"a","b","c"}; empty items are an InputError naming the option.
std::vector<std::string> splitList(const std::string& text, const std::string& option);
// Strict number parsing for option values: the whole text must be a finite number.
double parseNumber(const std::string& text, const std::string& option);
long long parseInteger(const std::string& text, const std::string& option);

}  // namespace calivera::cli
