#include "core/imputation/missing_patterns.h"

#include <algorithm>
#include <map>

namespace calivera {

MissingPatternReport missingPatterns(const Table& table, const std::vector<std::string>& columns,
                                     const OutcomeSpec& outcome) {
  std::vector<const Column*> used;
  for (const std::string& name : columns) used.push_back(&table.require(name));
  const Column& outcomeColumn = table.require(outcome.column);
  std::vector<std::uint32_t> known;
  for (std::size_t row = 0; row < table.rowCount; ++row) {
    if (!outcomeColumn.isMissing(row)) known.push_back(static_cast<std::uint32_t>(row));
  }
  const std::vector<double> events = outcomeValues(table, outcome, known);
  std::vector<std::int8_t> eventOf(table.rowCount, -1);
  for (std::size_t i = 0; i < known.size(); ++i) eventOf[known[i]] = events[i] == 1.0 ? 1 : 0;

  // Key: one bit per column, as a string of '0'/'1' (any number of columns).
  std::map<std::string, MissingPattern> byKey;
  std::string key(used.size(), '0');
  for (std::size_t row = 0; row < table.rowCount; ++row) {
    for (std::size_t k = 0; k < used.size(); ++k) key[k] = used[k]->isMissing(row) ? '1' : '0';
    MissingPattern& pattern = byKey[key];
    if (pattern.rows++ == 0) {
      for (std::size_t k = 0; k < used.size(); ++k) {
        if (key[k] == '1') pattern.missingColumns.push_back(columns[k]);
      }
    }
    if (eventOf[row] >= 0) {
      ++pattern.outcomeKnown;
      pattern.events += static_cast<std::size_t>(eventOf[row]);
    }
  }
  std::vector<MissingPattern> all;
  all.reserve(byKey.size());
  for (auto& [k, pattern] : byKey) all.push_back(std::move(pattern));
  std::sort(all.begin(), all.end(), [](const MissingPattern& a, const MissingPattern& b) {
    if (a.rows != b.rows) return a.rows > b.rows;
    if (a.missingColumns.size() != b.missingColumns.size()) {
      return a.missingColumns.size() < b.missingColumns.size();
    }
    return a.missingColumns < b.missingColumns;
  });
  MissingPatternReport report;
  for (std::size_t i = 0; i < all.size(); ++i) {
    if (i < kMaxReportedPatterns) {
      report.patterns.push_back(std::move(all[i]));
    } else {
      report.othersRows += all[i].rows;
      ++report.otherPatterns;
    }
  }
  return report;
}

}  // namespace calivera
