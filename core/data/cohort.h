#pragma once
// From a Table to the rows an analysis uses: complete-case selection over the columns the analysis
// needs (with the exclusion count per column, so no row is dropped silently) and the 0/1 outcome.

#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "core/data/table.h"

namespace calivera {

struct ColumnExclusion {
  std::string column;
  std::size_t rowsMissing = 0;  // rows missing in this column (a row can count in several)
};

struct ExclusionReport {
  std::size_t rowsRead = 0;
  std::size_t rowsExcluded = 0;  // rows with a missing value in at least one used column
  std::size_t rowsAnalysed = 0;
  std::vector<ColumnExclusion> byColumn;  // in the order the columns were requested
};

struct AnalysisRows {
  std::vector<std::uint32_t> rows;  // indices of complete rows, ascending
  ExclusionReport exclusions;
};

AnalysisRows selectCompleteCases(const Table& table, const std::vector<std::string>& columns);

struct OutcomeSpec {
  std::string column;
  std::optional<std::string> eventValue;  // text (or number) that means event; others are 0
};

// Outcome per selected row as 0.0 / 1.0. Without eventValue the column must hold exactly 0 and 1;
// anything else is an InputError naming file, line, column and value.
std::vector<double> outcomeValues(const Table& table, const OutcomeSpec& spec,
                                  const std::vector<std::uint32_t>& rows);

}  // namespace calivera
