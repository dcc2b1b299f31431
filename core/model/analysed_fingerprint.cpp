#include "core/model/analysed_fingerprint.h"

#include <algorithm>
#include <cassert>

#include "core/model/category_levels.h"
#include "core/model/linear_predictor.h"
#include "core/util/errors.h"
#include "core/util/number_format.h"
#include "core/util/sha256.h"

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
  std::string row;
  for (std::size_t i = 0; i < rows.size(); ++i) {
    row.assign(outcome[i] > 0.5 ? "1" : "0");
    for (const auto& [variable, column] : columns) {
      row += '\x1f';
      const std::uint32_t r = rows[i];
      if (column->kind == ColumnKind::Numeric) {
        row += formatShortest(column->numbers[r]);
      } else {
        const std::int32_t code = column->codes[r];
        const std::string& level =
            code < 0 ? std::string() : mappedLevel(model, variable, column->levels[code]);
        row += std::to_string(level.size()) + ":" + level;
      }
    }
    row += '\x1e';
    hash.add(row);
  }
  return hash.hex();
}

}  // namespace calivera
