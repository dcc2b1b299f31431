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

const Column& Table::require(std::string_view name) const {
  if (const Column* column = find(name)) return *column;
  std::string available;
  for (const Column& column : columns) {
    available += available.empty() ? "" : ", ";
    available += column.name;
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
