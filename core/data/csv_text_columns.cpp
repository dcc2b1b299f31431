#include "core/data/csv_text_columns.h"

#include <algorithm>
#include <cstdint>
#include <deque>
#include <numeric>
#include <string>
#include <unordered_map>
#include <vector>

#include "core/data/csv_scanner.h"

namespace calivera::csv {
namespace {

struct LevelIndex {
  std::unordered_map<std::string_view, std::int32_t> codeOf;
  std::vector<std::string_view> inOrderSeen;
};

// Codes were handed out in order of first appearance; levels are published sorted.
void sortLevels(const LevelIndex& index, Column& column) {
  const std::size_t count = index.inOrderSeen.size();
  std::vector<std::int32_t> order(count);
  std::iota(order.begin(), order.end(), 0);
  std::sort(order.begin(), order.end(), [&](std::int32_t a, std::int32_t b) {
    return index.inOrderSeen[static_cast<std::size_t>(a)] <
           index.inOrderSeen[static_cast<std::size_t>(b)];
  });
  std::vector<std::int32_t> rank(count);
  column.levels.clear();
  column.levels.reserve(count);
  for (std::size_t i = 0; i < count; ++i) {
    rank[static_cast<std::size_t>(order[i])] = static_cast<std::int32_t>(i);
    column.levels.emplace_back(index.inOrderSeen[static_cast<std::size_t>(order[i])]);
  }
  for (std::int32_t& code : column.codes) {
    if (code >= 0) code = rank[static_cast<std::size_t>(code)];
  }
}

}  // namespace

void fillTextColumns(std::string_view text, std::size_t dataBegin, std::size_t firstLine,
                     char delimiter, const MissingTokens& missing, Table& table) {
  std::vector<std::size_t> textColumns;
  for (std::size_t c = 0; c < table.columns.size(); ++c) {
    if (table.columns[c].kind == ColumnKind::Text) textColumns.push_back(c);
  }
  if (textColumns.empty()) return;
  std::vector<LevelIndex> indexes(textColumns.size());
  for (const std::size_t c : textColumns) {
    table.columns[c].codes.clear();
    table.columns[c].codes.reserve(table.rowCount);
  }
  // Unquoted fields are views into `text`; unescaped quoted fields live in the scanner's scratch
  // buffer only until the next record, so new levels among those are copied here.
  std::deque<std::string> copies;
  const auto inText = [&](std::string_view field) {
    return field.data() >= text.data() && field.data() + field.size() <= text.data() + text.size();
  };
  RecordScanner scanner(text, delimiter, table.sourceName, dataBegin, firstLine);
  while (scanner.next()) {
    const std::vector<std::string_view>& fields = scanner.fields();
    for (std::size_t k = 0; k < textColumns.size(); ++k) {
      Column& column = table.columns[textColumns[k]];
      const std::string_view value = trimField(fields[textColumns[k]], delimiter);
      if (missing.contains(value)) {
        column.codes.push_back(-1);
        continue;
      }
      LevelIndex& index = indexes[k];
      const auto found = index.codeOf.find(value);
      if (found != index.codeOf.end()) {
        column.codes.push_back(found->second);
        continue;
      }
      const std::string_view key =
          inText(value) ? value : std::string_view(copies.emplace_back(value));
      const auto code = static_cast<std::int32_t>(index.inOrderSeen.size());
      index.codeOf.emplace(key, code);
      index.inOrderSeen.push_back(key);
      column.codes.push_back(code);
    }
  }
  for (std::size_t k = 0; k < textColumns.size(); ++k) {
    Column& column = table.columns[textColumns[k]];
    sortLevels(indexes[k], column);
    column.numbers.clear();
    column.numbers.shrink_to_fit();
  }
}

}  // namespace calivera::csv
