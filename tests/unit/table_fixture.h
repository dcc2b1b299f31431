#pragma once
// In-memory cohort tables for unit tests (no CSV reader involved).

#include <algorithm>
#include <cmath>
#include <limits>
#include <string>
#include <vector>

#include "core/data/table.h"

namespace calivera::testing {

inline Column numericColumn(const std::string& name, const std::vector<double>& values) {
  Column column;
  column.name = name;
  column.kind = ColumnKind::Numeric;
  column.numbers = values;
  column.missingCount = static_cast<std::size_t>(
      std::count_if(values.begin(), values.end(), [](double v) { return std::isnan(v); }));
  return column;
}

// Text column from its fields; "" is missing. Levels in sorted byte order, as the reader does.
inline Column textColumn(const std::string& name, const std::vector<std::string>& fields) {
  Column column;
  column.name = name;
  column.kind = ColumnKind::Text;
  for (const std::string& field : fields) {
    if (!field.empty()) column.levels.push_back(field);
  }
  std::sort(column.levels.begin(), column.levels.end());
  column.levels.erase(std::unique(column.levels.begin(), column.levels.end()), column.levels.end());
  for (std::size_t i = 0; i < fields.size(); ++i) {
    if (fields[i].empty()) {
      column.codes.push_back(-1);
      ++column.missingCount;
      continue;
    }
    const auto at = std::find(column.levels.begin(), column.levels.end(), fields[i]);
    column.codes.push_back(static_cast<std::int32_t>(at - column.levels.begin()));
    if (!column.firstNonNumeric) column.firstNonNumeric = FieldLocation{i + 2, fields[i]};
  }
  return column;
}

inline Table makeTable(std::vector<Column> columns, const std::string& source = "cohort.csv") {
  Table table;
  table.sourceName = source;
  table.rowCount = columns.empty()                          ? 0
                   : columns[0].kind == ColumnKind::Numeric ? columns[0].numbers.size()
                                                            : columns[0].codes.size();
  table.columns = std::move(columns);
  return table;
}

inline std::vector<std::uint32_t> allRows(const Table& table) {
  std::vector<std::uint32_t> rows(table.rowCount);
  for (std::size_t i = 0; i < rows.size(); ++i) rows[i] = static_cast<std::uint32_t>(i);
  return rows;
}

}  // namespace calivera::testing
