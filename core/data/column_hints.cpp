#include "core/data/column_hints.h"

#include <algorithm>
#include <cctype>
#include <vector>

#include "core/util/shown_text.h"

namespace calivera {

namespace {

char lowerAscii(char c) {
  return static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
}

bool equalIgnoringCase(std::string_view a, std::string_view b) {
  return a.size() == b.size() && std::equal(a.begin(), a.end(), b.begin(), [](char x, char y) {
           return lowerAscii(x) == lowerAscii(y);
         });
}

// Levenshtein distance (case-insensitive), stopping early once every entry of a row exceeds
// `limit`: names are short, but a hostile header may not be.
std::size_t editDistance(std::string_view a, std::string_view b, std::size_t limit) {
  if (a.size() > b.size() + limit || b.size() > a.size() + limit) return limit + 1;
  std::vector<std::size_t> previous(b.size() + 1);
  std::vector<std::size_t> current(b.size() + 1);
  for (std::size_t j = 0; j <= b.size(); ++j) previous[j] = j;
  for (std::size_t i = 1; i <= a.size(); ++i) {
    current[0] = i;
    std::size_t rowMin = current[0];
    for (std::size_t j = 1; j <= b.size(); ++j) {
      const std::size_t substitute =
          previous[j - 1] + (lowerAscii(a[i - 1]) == lowerAscii(b[j - 1]) ? 0 : 1);
      current[j] = std::min({previous[j] + 1, current[j - 1] + 1, substitute});
      rowMin = std::min(rowMin, current[j]);
    }
    if (rowMin > limit) return limit + 1;
    std::swap(previous, current);
  }
  return previous[b.size()];
}

bool isDigits(std::string_view text) {
  return !text.empty() &&
         std::all_of(text.begin(), text.end(), [](char c) { return c >= '0' && c <= '9'; });
}

std::string_view trimmed(std::string_view text) {
  while (!text.empty() && (text.front() == ' ' || text.front() == '\t')) text.remove_prefix(1);
  while (!text.empty() && (text.back() == ' ' || text.back() == '\t')) text.remove_suffix(1);
  return text;
}

std::string_view unsigned_(std::string_view text) {
  if (!text.empty() && (text.front() == '-' || text.front() == '+')) text.remove_prefix(1);
  return text;
}

// A plain decimal number: digits with at most one '.'.
bool isPlainNumber(std::string_view text) {
  text = unsigned_(trimmed(text));
  const std::size_t dot = text.find('.');
  if (dot == std::string_view::npos) return isDigits(text);
  return (dot == 0 || isDigits(text.substr(0, dot))) && isDigits(text.substr(dot + 1));
}

std::string delimiterName(char c) {
  switch (c) {
    case '\t':
      return "a tab";
    case ';':
      return "';'";
    case ',':
      return "','";
    default:
      return std::string("'") + c + "'";
  }
}

}  // namespace

std::string closestColumnName(const Table& table, std::string_view wanted) {
  const std::vector<std::string> names = table.fileColumnNames();
  for (const std::string& name : names) {
    if (equalIgnoringCase(name, wanted)) return name;
  }
  const std::size_t limit = wanted.size() <= 6 ? 1 : 2;
  std::size_t best = limit + 1;
  const std::string* found = nullptr;
  bool unique = false;
  for (const std::string& name : names) {
    const std::size_t d = editDistance(name, wanted, limit);
    if (d < best) {
      best = d;
      found = &name;
      unique = true;
    } else if (d == best) {
      unique = false;
    }
  }
  return found != nullptr && unique && best <= limit ? *found : std::string();
}

std::string closestColumnHint(const Table& table, std::string_view wanted) {
  const std::string name = closestColumnName(table, wanted);
  return name.empty() ? std::string() : " Did you mean '" + shownText(name) + "'?";
}

std::string delimiterHint(const Table& table) {
  const std::vector<std::string> names = table.fileColumnNames();
  if (names.size() != 1) return {};
  const std::string& header = names.front();
  for (const char c : {';', ',', '\t', '|'}) {
    if (header.find(c) == std::string::npos) continue;
    return " The whole header was read as one column; its name holds " + delimiterName(c) +
           ", so the file may separate its fields with " + delimiterName(c) +
           ": give that delimiter (--delimiter on the command line, Delimiter in the import "
           "dialog).";
  }
  return {};
}

std::string numberFieldHint(std::string_view field) {
  const std::string_view text = trimmed(field);
  if (text.size() > 40) return {};  // echoed in the hint: only short fields
  const std::string_view digits = unsigned_(text);
  const std::size_t comma = digits.find(',');
  if (comma != std::string_view::npos && digits.find(',', comma + 1) == std::string_view::npos &&
      isDigits(digits.substr(0, comma)) && isDigits(digits.substr(comma + 1))) {
    return " It looks like a decimal comma: Calivera reads only '.' as the decimal mark, so "
           "write the file's numbers with '.' (for example '" +
           std::string(text.substr(0, text.size() - digits.size())) +
           std::string(digits.substr(0, comma)) + "." + std::string(digits.substr(comma + 1)) +
           "').";
  }
  for (const char c : {';', '|', '\t'}) {
    if (text.find(c) == std::string_view::npos) continue;
    bool allNumbers = true;
    std::string_view rest = text;
    while (allNumbers) {
      const std::size_t at = rest.find(c);
      allNumbers = isPlainNumber(rest.substr(0, at));
      if (at == std::string_view::npos) break;
      rest.remove_prefix(at + 1);
    }
    if (allNumbers) {
      return " The field holds numbers joined by " + delimiterName(c) +
             ": the file may separate its fields with " + delimiterName(c) +
             "; give that delimiter (--delimiter on the command line, Delimiter in the import "
             "dialog).";
    }
  }
  return {};
}

}  // namespace calivera
