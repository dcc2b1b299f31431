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

std::vector<std::string> Table::fileColumnNames() const {
  if (!headerNames.empty()) return headerNames;
  std::vector<std::string> names;
  names.reserve(columns.size());
  for (const Column& column : columns) names.push_back(column.name);
  return names;
}

const Column& Table::require(std::string_view name) const {
  if (const Column* column = find(name)) return *column;
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

}  // namespace calivera
