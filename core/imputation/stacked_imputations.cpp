#include "core/imputation/stacked_imputations.h"

#include <cmath>
#include <map>

#include "core/util/errors.h"
#include "core/util/number_format.h"
#include "core/util/shown_text.h"

namespace calivera {
namespace {

// The outcome of one row as text, for comparing copies whatever the column's kind; empty when
// missing.
std::string outcomeText(const Column& column, std::size_t row) {
  if (column.isMissing(row)) return {};
  if (column.kind == ColumnKind::Text) {
    return column.levels[static_cast<std::size_t>(column.codes[row])];
  }
  return formatShortest(column.numbers[row]);
}

}  // namespace

StackedImputations splitStackedImputations(const Table& table, const std::string& column,
                                           const std::string& outcomeColumn) {
  const std::string where = table.sourceName + ": imputation column '" + shownText(column) + "'";
  if (column == outcomeColumn) throw InputError(where + " is the outcome column");
  const Column& index = table.requireNumeric(column);
  std::map<long long, std::vector<std::uint32_t>> rowsOf;
  for (std::size_t row = 0; row < table.rowCount; ++row) {
    const double value = index.numbers[row];
    if (std::isnan(value)) {
      throw InputError(table.placeOfRow(row) + ": imputation column '" + shownText(column) +
                       "' is missing; every row must say which copy it belongs to");
    }
    if (value < 0 || value != std::floor(value) || value > 1e9) {
      throw InputError(table.placeOfRow(row) + ": imputation column '" + shownText(column) +
                       "' holds " + outcomeText(index, row) +
                       ", not a whole number from 0 (the original data) upwards");
    }
    rowsOf[static_cast<long long>(value)].push_back(static_cast<std::uint32_t>(row));
  }
  if (rowsOf.size() == 1) {
    throw InputError(where + " holds the single value " + std::to_string(rowsOf.begin()->first) +
                     ": there are no imputed copies to pool");
  }
  const auto original = rowsOf.find(0);
  if (original == rowsOf.end()) {
    throw InputError(where +
                     " has no rows with index 0 (the original data with its missing "
                     "values), which give the complete-case results and the missingness "
                     "report; stack the original data with the copies (in R's mice: "
                     "complete(imp, \"long\", include = TRUE))");
  }
  if (rowsOf.size() < 3) {
    throw InputError(where + " numbers one imputed copy only; pooling needs at least two");
  }
  const std::size_t n = original->second.size();
  const Column& outcome = table.require(outcomeColumn);
  StackedImputations split;
  split.column = column;
  split.originalRows = original->second;
  for (const auto& [number, rows] : rowsOf) {
    if (number == 0) continue;
    if (rows.size() != n) {
      throw InputError(where + ": imputation " + std::to_string(number) + " has " +
                       std::to_string(rows.size()) + " rows, the original data (index 0) " +
                       std::to_string(n) + "; every copy must hold the same patients");
    }
    for (std::size_t i = 0; i < n; ++i) {
      const std::string copied = outcomeText(outcome, rows[i]);
      const std::string observed = outcomeText(outcome, original->second[i]);
      if (copied.empty()) {
        throw InputError(table.placeOfRow(rows[i]) + ": outcome '" + shownText(outcomeColumn) +
                         "' is missing in imputation " + std::to_string(number) +
                         "; every copy must hold every patient's observed outcome");
      }
      if (observed.empty()) {
        throw InputError(table.placeOfRow(original->second[i]) + ": outcome '" +
                         shownText(outcomeColumn) +
                         "' is missing in the original data but present in imputation " +
                         std::to_string(number) +
                         ": the outcome was imputed, and a validation must not use imputed "
                         "outcomes (leave such patients out, or keep them out of the imputation)");
      }
      if (copied != observed) {
        throw InputError(table.placeOfRow(rows[i]) + ": outcome '" + shownText(outcomeColumn) +
                         "' is '" + shownText(copied) + "' in imputation " +
                         std::to_string(number) + " but '" + shownText(observed) +
                         "' for the same patient in the original data (" +
                         table.rowName(original->second[i]) +
                         "); the copies must list the patients in the same order");
      }
    }
    split.indices.push_back(number);
    split.copyRows.push_back(rows);
  }
  return split;
}

}  // namespace calivera
