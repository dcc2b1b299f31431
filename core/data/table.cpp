#include "core/data/table.h"

#include "core/data/column_hints.h"
#include "core/util/errors.h"
#include "core/util/shown_text.h"

namespace calivera {

const Column* Table::find(std::string_view name) const {
  for (const Column& column : columns) {
    if (column.name == name) return &column;
  }
  return nullptr;
}

const RefusedColumn* Table::findRefused(std::string_view name) const {
  for (const RefusedColumn& refused : refusedColumns) {
    if (refused.name == name) return &refused;
  }
  return nullptr;
}

std::vector<std::string> Table::fileColumnNames() const {
  if (!headerNames.empty()) return headerNames;
  std::vector<std::string> names;
  names.reserve(columns.size());
  for (const Column& column : columns) names.push_back(column.name);
  return names;
}

std::string Table::placeOfRow(std::size_t row) const {
  return rowsAreRecords ? sourceName + ", record " + std::to_string(recordOfRow(row))
                        : sourceName + ":" + std::to_string(lineOfRow(row));
}

std::string Table::rowName(std::size_t row) const {
  return rowsAreRecords ? "record " + std::to_string(recordOfRow(row))
                        : "line " + std::to_string(lineOfRow(row));
}

const Column& Table::require(std::string_view name) const {
  if (const Column* column = find(name)) return *column;
  if (const RefusedColumn* refused = findRefused(name)) {
    throw InputError(sourceName + ": column '" + shownText(refused->name) +
                     "' cannot be analysed: " + refused->reason);
  }
  std::string available;
  for (const std::string& header : fileColumnNames()) {
    // A column of the file the reader was told to skip: the analysis asked for a column its own
    // column list left out, a programming error rather than bad input.
    if (header == name) {
      throw AnalysisError(sourceName + ": column '" + header +
                          "' is in the file but was not read (the analysis's column list left it "
                          "out; please report this)");
    }
    available += available.empty() ? "" : ", ";
    available += header;
  }
  throw InputError(sourceName + ": no column named '" + std::string(name) + "' (columns: " +
                   available + ")." + closestColumnHint(*this, name) + delimiterHint(*this));
}

const Column& Table::requireNumeric(std::string_view name) const {
  const Column& column = require(name);
  if (column.kind == ColumnKind::Text && !column.nonNumericNote.empty()) {
    throw InputError(sourceName + ": column '" + shownText(column.name) + "' " +
                     column.nonNumericNote + ", not numbers");
  }
  if (column.kind == ColumnKind::Text) {
    const std::size_t line = column.firstNonNumeric ? column.firstNonNumeric->line : 0;
    const std::string text = column.firstNonNumeric ? column.firstNonNumeric->text : "";
    // Field text is echoed cut and with controls escaped (a 100 MB field, a NUL byte).
    throw InputError(sourceName + ":" + std::to_string(line) + ": column '" +
                     shownText(column.name) + "': '" + shownText(text, 60) + "' is not a number." +
                     numberFieldHint(text));
  }
  return column;
}

Table tableRows(const Table& table, const std::vector<std::uint32_t>& rows) {
  Table part;
  part.sourceName = table.sourceName;
  part.rowsAreRecords = table.rowsAreRecords;
  part.rowCount = rows.size();
  part.headerNames = table.headerNames;
  part.refusedColumns = table.refusedColumns;
  part.database = table.database;
  part.recordLines.reserve(rows.size());
  for (std::uint32_t row : rows) {
    part.recordLines.push_back(static_cast<std::uint32_t>(
        table.rowsAreRecords ? table.recordOfRow(row) : table.lineOfRow(row)));
  }
  part.columns.reserve(table.columns.size());
  for (const Column& column : table.columns) {
    Column copy;
    copy.name = column.name;
    copy.kind = column.kind;
    copy.nonNumericNote = column.nonNumericNote;
    copy.firstNonNumeric = column.firstNonNumeric;
    if (column.kind == ColumnKind::Numeric) {
      copy.numbers.reserve(rows.size());
      for (std::uint32_t row : rows) copy.numbers.push_back(column.numbers[row]);
    } else {
      // Only the levels these rows hold, still in byte order, as a reader would list them.
      std::vector<std::int32_t> newIndex(column.levels.size(), -1);
      for (std::uint32_t row : rows) {
        if (column.codes[row] >= 0) newIndex[static_cast<std::size_t>(column.codes[row])] = 0;
      }
      for (std::size_t level = 0; level < column.levels.size(); ++level) {
        if (newIndex[level] < 0) continue;
        newIndex[level] = static_cast<std::int32_t>(copy.levels.size());
        copy.levels.push_back(column.levels[level]);
        if (!column.levelCodes.empty()) copy.levelCodes.push_back(column.levelCodes[level]);
      }
      copy.codes.reserve(rows.size());
      for (std::uint32_t row : rows) {
        const std::int32_t code = column.codes[row];
        copy.codes.push_back(code < 0 ? -1 : newIndex[static_cast<std::size_t>(code)]);
      }
    }
    for (std::size_t i = 0; i < rows.size(); ++i) copy.missingCount += copy.isMissing(i) ? 1 : 0;
    part.columns.push_back(std::move(copy));
  }
  return part;
}

}  // namespace calivera
