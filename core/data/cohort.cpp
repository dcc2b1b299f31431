#include "core/data/cohort.h"

#include <algorithm>
#include <map>

#include "core/data/csv_field.h"
#include "core/util/errors.h"
#include "core/util/number_format.h"
#include "core/util/shown_text.h"

namespace calivera {
namespace {

std::string where(const Table& table, std::size_t row) {
  return table.placeOfRow(row) + ": ";
}

// One distinct outcome value as found in the column, for checks and messages.
struct DistinctValue {
  std::string text;
  std::size_t rows = 0;
  std::size_t firstRow = 0;
};

std::vector<DistinctValue> distinctValues(const Column& column, std::size_t rowCount) {
  std::vector<DistinctValue> values;
  if (column.kind == ColumnKind::Text) {
    values.resize(column.levels.size());
    for (std::size_t i = 0; i < column.levels.size(); ++i) values[i].text = column.levels[i];
    for (std::size_t row = rowCount; row-- > 0;) {
      const std::int32_t code = column.codes[row];
      if (code < 0) continue;
      ++values[static_cast<std::size_t>(code)].rows;
      values[static_cast<std::size_t>(code)].firstRow = row;
    }
    return values;
  }
  std::map<double, DistinctValue> byValue;
  for (std::size_t row = 0; row < rowCount; ++row) {
    const double value = column.numbers[row];
    if (value != value) continue;
    DistinctValue& entry = byValue[value];
    if (entry.rows++ == 0) {
      entry.text = formatShortest(value);
      entry.firstRow = row;
    }
  }
  for (auto& [value, entry] : byValue) values.push_back(std::move(entry));
  return values;
}

std::string listValues(const Table& table, const std::vector<DistinctValue>& values) {
  constexpr std::size_t kShown = 10;
  std::string list;
  for (std::size_t i = 0; i < values.size() && i < kShown; ++i) {
    list += i == 0 ? "" : ", ";
    list += "'" + shownText(values[i].text) + "' (" + std::to_string(values[i].rows) +
            (values[i].rows == 1 ? " row" : " rows") + ", first on " +
            table.rowName(values[i].firstRow) + ")";
  }
  if (values.size() > kShown) list += ", ... (" + std::to_string(values.size()) + " in all)";
  return list;
}

// The per-row event indicator for the whole column (-1 where missing), after checking the coding.
std::vector<std::int8_t> eventIndicator(const Table& table, const Column& column,
                                        const OutcomeSpec& spec) {
  std::vector<std::int8_t> event(table.rowCount, -1);
  const std::string columnText = "column '" + shownText(column.name) + "': ";
  if (!spec.eventValue) {
    if (column.kind == ColumnKind::Text && !column.firstNonNumeric) {
      // A statistical-package file's string or labelled variable: name its categories.
      std::string levels;
      for (std::size_t i = 0; i < column.levels.size() && i < 5; ++i) {
        levels += (i == 0 ? "'" : ", '") + shownText(column.levels[i]) + "'";
        if (!column.levelCodes.empty()) levels += " = " + column.levelCodes[i];
      }
      throw InputError(table.sourceName + ": " + columnText + "the outcome " +
                       column.nonNumericNote + ": " + levels +
                       (column.levels.size() > 5 ? ", ..." : "") +
                       "; give the category that means an event");
    }
    if (column.kind == ColumnKind::Text) {
      const FieldLocation& first = *column.firstNonNumeric;
      throw InputError(table.sourceName + ":" + std::to_string(first.line) + ": " + columnText +
                       "outcome value '" + shownText(first.text, 60) +
                       "' is not 0 or 1 (give the value that means an event)");
    }
    for (std::size_t row = 0; row < table.rowCount; ++row) {
      const double value = column.numbers[row];
      if (value != value) continue;
      if (value != 0.0 && value != 1.0) {
        throw InputError(where(table, row) + columnText + "outcome value '" +
                         formatShortest(value) +
                         "' is not 0 or 1 (give the value that means an event)");
      }
      event[row] = value == 1.0 ? 1 : 0;
    }
    return event;
  }

  const std::string wanted(csv::trimField(*spec.eventValue, 0));
  const std::vector<DistinctValue> values = distinctValues(column, table.rowCount);
  std::size_t eventIndex = values.size();
  double eventNumber = 0.0;
  const bool numericEvent = csv::parseNumber(wanted, eventNumber);
  for (std::size_t i = 0; i < values.size(); ++i) {
    double number = 0.0;
    const bool same =
        column.kind == ColumnKind::Text
            ? values[i].text == wanted
            : numericEvent && csv::parseNumber(values[i].text, number) && number == eventNumber;
    if (same) eventIndex = i;
  }
  // A value-labelled column of a statistical-package file also takes the event as its stored
  // code ("1" for the label "Yes"), when no label is spelled so.
  if (eventIndex == values.size() && numericEvent && !column.levelCodes.empty()) {
    for (std::size_t i = 0; i < values.size(); ++i) {
      const auto level = std::find(column.levels.begin(), column.levels.end(), values[i].text);
      double code = 0.0;
      if (level != column.levels.end() &&
          csv::parseNumber(column.levelCodes[std::size_t(level - column.levels.begin())], code) &&
          code == eventNumber) {
        eventIndex = i;
      }
    }
  }
  if (values.size() != 2 || eventIndex == values.size()) {
    const std::string problem =
        eventIndex == values.size()
            ? "no value equals the event value '" + wanted + "'"
            : "expected exactly two distinct values (event '" + wanted + "' and one other)";
    throw InputError(table.sourceName + ": " + columnText + problem + "; found " +
                     std::to_string(values.size()) + ": " + listValues(table, values));
  }
  for (std::size_t row = 0; row < table.rowCount; ++row) {
    if (column.isMissing(row)) continue;
    const bool isEvent = column.kind == ColumnKind::Text
                             ? static_cast<std::size_t>(column.codes[row]) == eventIndex
                             : column.numbers[row] == eventNumber;
    event[row] = isEvent ? 1 : 0;
  }
  return event;
}

}  // namespace

AnalysisRows selectCompleteCases(const Table& table, const std::vector<std::string>& columns) {
  std::vector<const Column*> used;
  AnalysisRows result;
  for (const std::string& name : columns) {
    used.push_back(&table.require(name));
    result.exclusions.byColumn.push_back(ColumnExclusion{name, 0});
  }
  for (std::size_t row = 0; row < table.rowCount; ++row) {
    bool complete = true;
    for (std::size_t k = 0; k < used.size(); ++k) {
      if (used[k]->isMissing(row)) {
        ++result.exclusions.byColumn[k].rowsMissing;
        complete = false;
      }
    }
    if (complete) result.rows.push_back(static_cast<std::uint32_t>(row));
  }
  result.exclusions.rowsRead = table.rowCount;
  result.exclusions.rowsAnalysed = result.rows.size();
  result.exclusions.rowsExcluded = table.rowCount - result.rows.size();
  return result;
}

std::vector<double> outcomeValues(const Table& table, const OutcomeSpec& spec,
                                  const std::vector<std::uint32_t>& rows) {
  const Column& column = table.require(spec.column);
  const std::vector<std::int8_t> event = eventIndicator(table, column, spec);
  std::vector<double> outcome;
  outcome.reserve(rows.size());
  for (const std::uint32_t row : rows) {
    if (row >= table.rowCount || event[row] < 0) {
      throw InputError(where(table, row) + "column '" + column.name +
                       "': the outcome is missing in a row selected for analysis (select "
                       "complete cases over the outcome column too)");
    }
    outcome.push_back(event[row]);
  }
  return outcome;
}

}  // namespace calivera
