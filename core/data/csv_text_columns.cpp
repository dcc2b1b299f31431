#include "core/data/csv_text_columns.h"

#include <algorithm>
#include <cstdint>
#include <cstring>
#include <functional>
#include <numeric>
#include <string>
#include <vector>

#include "core/data/csv_scanner.h"

namespace calivera::csv {
namespace {

// Distinct values of one text column in order of first appearance. Open addressing over codes
// with stored hashes, and the values' bytes copied into one buffer: a column of a million
// distinct identifiers costs no allocation per value, and the file text is not needed afterwards
// (so its pages can go back to the kernel during the scan).
class LevelIndex {
 public:
  LevelIndex() : slots_(16, -1), starts_{0} {}

  // The code of `value`; an unseen value gets the next code.
  std::int32_t codeOf(std::string_view value) {
    const std::uint64_t hash = std::hash<std::string_view>{}(value);
    std::size_t slot = hash & (slots_.size() - 1);
    while (slots_[slot] >= 0) {
      const auto code = static_cast<std::size_t>(slots_[slot]);
      if (hashes_[code] == hash && level(code) == value) return slots_[slot];
      slot = (slot + 1) & (slots_.size() - 1);
    }
    const auto code = static_cast<std::int32_t>(hashes_.size());
    bytes_.append(value);
    starts_.push_back(bytes_.size());
    hashes_.push_back(hash);
    slots_[slot] = code;
    if (2 * hashes_.size() > slots_.size()) grow();
    return code;
  }

  std::size_t size() const { return hashes_.size(); }
  std::string_view level(std::size_t code) const {
    return std::string_view(bytes_).substr(starts_[code], starts_[code + 1] - starts_[code]);
  }

 private:
  void grow() {
    std::vector<std::int32_t> slots(2 * slots_.size(), -1);
    for (std::size_t code = 0; code < hashes_.size(); ++code) {
      std::size_t slot = hashes_[code] & (slots.size() - 1);
      while (slots[slot] >= 0) slot = (slot + 1) & (slots.size() - 1);
      slots[slot] = static_cast<std::int32_t>(code);
    }
    slots_ = std::move(slots);
  }

  std::vector<std::int32_t> slots_;  // a code, or -1 when free; the size is a power of two
  std::vector<std::uint64_t> hashes_;
  std::string bytes_;                // the levels one after another
  std::vector<std::size_t> starts_;  // level i is bytes_[starts_[i], starts_[i + 1])
};

// Codes were handed out in order of first appearance; levels are published sorted.
void sortLevels(const LevelIndex& index, Column& column) {
  const std::size_t count = index.size();
  std::vector<std::int32_t> order(count);
  std::iota(order.begin(), order.end(), 0);
  const auto before = [&](std::int32_t a, std::int32_t b) {
    return index.level(static_cast<std::size_t>(a)) < index.level(static_cast<std::size_t>(b));
  };
  // Identifiers often arrive sorted already; then the codes stand as they are.
  if (!std::is_sorted(order.begin(), order.end(), before)) {
    std::sort(order.begin(), order.end(), before);
  }
  std::vector<std::int32_t> rank(count);
  column.levels.clear();
  column.levels.reserve(count);
  for (std::size_t i = 0; i < count; ++i) {
    rank[static_cast<std::size_t>(order[i])] = static_cast<std::int32_t>(i);
    column.levels.emplace_back(index.level(static_cast<std::size_t>(order[i])));
  }
  for (std::int32_t& code : column.codes) {
    if (code >= 0) code = rank[static_cast<std::size_t>(code)];
  }
}

}  // namespace

void fillTextColumns(std::string_view text, std::size_t dataBegin, std::size_t firstLine,
                     char delimiter, const MissingTokens& missing, bool quoteFree,
                     const MappedFile* file, Table& table) {
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
  const auto add = [&](std::size_t k, std::string_view field) {
    Column& column = table.columns[textColumns[k]];
    const std::string_view value = trimField(field, delimiter);
    column.codes.push_back(missing.contains(value) ? -1 : indexes[k].codeOf(value));
  };
  ReleaseBehind release(file, text.data() + dataBegin);
  if (quoteFree) {
    // Records are lines; only the fields up to the last text column need finding.
    const char* p = text.data() + dataBegin;
    const char* const end = text.data() + text.size();
    while (p < end) {
      const Line line = lineAt(p, end);
      const char* field = p;
      std::size_t k = 0;
      for (std::size_t c = 0; k < textColumns.size(); ++c) {
        const char* fieldEnd = fieldEndAt(field, line.contentEnd, delimiter);
        if (c == textColumns[k]) {
          add(k, std::string_view(field, static_cast<std::size_t>(fieldEnd - field)));
          ++k;
        }
        field = fieldEnd + 1;
      }
      p = line.next;
      release.passed(p);
    }
  } else {
    RecordScanner scanner(text, delimiter, table.sourceName, dataBegin, firstLine);
    while (scanner.next()) {
      for (std::size_t k = 0; k < textColumns.size(); ++k) add(k, scanner.fields()[textColumns[k]]);
      release.passed(text.data() + scanner.position());
    }
  }
  release.finish(text.data() + text.size());
  for (std::size_t k = 0; k < textColumns.size(); ++k) {
    Column& column = table.columns[textColumns[k]];
    sortLevels(indexes[k], column);
    column.numbers.clear();
    column.numbers.shrink_to_fit();
  }
}

}  // namespace calivera::csv
