#include "core/imputation/missing_patterns.h"

#include <algorithm>
#include <cstdint>
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

  // Key: one bit per column, in 64-bit words (any number of columns). Most rows are complete,
  // so the all-zero key is counted without a map lookup.
  const std::size_t words = (used.size() + 63) / 64;
  std::map<std::vector<std::uint64_t>, MissingPattern> byKey;
  MissingPattern complete;
  std::vector<std::uint64_t> key(words);
  for (std::size_t row = 0; row < table.rowCount; ++row) {
    std::fill(key.begin(), key.end(), 0);
    bool any = false;
    for (std::size_t k = 0; k < used.size(); ++k) {
      if (used[k]->isMissing(row)) {
        key[k / 64] |= std::uint64_t{1} << (k % 64);
        any = true;
      }
    }
    MissingPattern& pattern = any ? byKey[key] : complete;
    if (pattern.rows++ == 0) {
      for (std::size_t k = 0; k < used.size(); ++k) {
        if ((key[k / 64] >> (k % 64)) & 1u) pattern.missingColumns.push_back(columns[k]);
      }
    }
    if (eventOf[row] >= 0) {
      ++pattern.outcomeKnown;
      pattern.events += static_cast<std::size_t>(eventOf[row]);
    }
  }
  if (complete.rows > 0) byKey[std::vector<std::uint64_t>(words)] = std::move(complete);
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
