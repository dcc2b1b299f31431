#include "core/model/analysed_fingerprint.h"

#include <algorithm>
#include <cassert>
#include <future>
#include <string>

#include "core/model/category_levels.h"
#include "core/model/linear_predictor.h"
#include "core/util/errors.h"
#include "core/util/parallel_size.h"
#include "core/util/sha256.h"
#include "core/util/shortest_decimal.h"

namespace calivera {

std::string analysedDataFingerprint(const Model& model, const Table& table,
                                    const std::vector<std::uint32_t>& rows,
                                    const std::vector<double>& outcome) {
  assert(rows.size() == outcome.size());
  std::vector<std::string> variables = modelVariables(model);
  std::sort(variables.begin(), variables.end());  // byte order
  std::vector<std::pair<std::string, const Column*>> columns;
  for (const std::string& variable : variables) {
    columns.emplace_back(variable, &table.require(mappedColumn(model, variable)));
  }
  Sha256Stream hash;
  hash.add("calivera-analysed-data/1\n");
  for (const auto& [variable, column] : columns) {
    hash.add(variable);
    hash.add("\n");
  }
  hash.add("\n");
  // The canonical text of rows [begin, end).
  const auto canonical = [&](std::size_t begin, std::size_t end) {
    std::string text;
    text.reserve((end - begin) * (2 + 12 * columns.size()) + kMaxShortestLength);
    std::vector<int> decimals(columns.size(), 0);  // per column, see writeShortest
    for (std::size_t i = begin; i < end; ++i) {
      text += outcome[i] > 0.5 ? '1' : '0';
      for (std::size_t c = 0; c < columns.size(); ++c) {
        const auto& [variable, column] = columns[c];
        text += '\x1f';
        const std::uint32_t r = rows[i];
        if (column->kind == ColumnKind::Numeric) {
          const std::size_t at = text.size();  // written in place: no per-value copy
          text.resize(at + kMaxShortestLength);
          const char* written = writeShortest(text.data() + at, column->numbers[r], decimals[c]);
          text.resize(static_cast<std::size_t>(written - text.data()));
        } else {
          const std::int32_t code = column->codes[r];
          const std::string& level =
              code < 0 ? std::string() : mappedLevel(model, variable, column->levels[code]);
          text += std::to_string(level.size()) + ":" + level;
        }
      }
      text += '\x1e';
    }
    return text;
  };
  // Blocks of rows; on a large cohort every other block is written on a second thread while this
  // one writes and hashes the rest in order (issue 13), so the digest is the same either way.
  constexpr std::size_t kBlockRows = std::size_t{1} << 15;
  const bool parallel = rows.size() >= kParallelFromPatients;
  for (std::size_t begin = 0; begin < rows.size(); begin += 2 * kBlockRows) {
    const std::size_t middle = std::min(rows.size(), begin + kBlockRows);
    const std::size_t end = std::min(rows.size(), begin + 2 * kBlockRows);
    std::future<std::string> second;
    if (parallel && middle < end) second = std::async(std::launch::async, canonical, middle, end);
    hash.add(canonical(begin, middle));
    hash.add(second.valid() ? second.get() : canonical(middle, end));
  }
  return hash.hex();
}

}  // namespace calivera
