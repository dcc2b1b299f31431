#pragma once
// A cohort holding m imputed copies stacked one under the other, numbered by an imputation
// column (the "long" layout general-purpose imputation software writes, for example mice's
// complete(imp, "long", include = TRUE) with its .imp column): index 0 is the original data
// with its missing values, 1..m the completed copies, each with the patients in the same order.
//
// Decisions (tested in tests/unit/imputation_test.cpp):
// - The index must be a whole number >= 0 on every row. The original data (index 0) is required:
//   it gives the complete-case results and the missingness report, and it is what checks that no
//   outcome was imputed. At least two imputed copies are required.
// - Every copy has as many rows as the original data.
// - The outcome is never imputed: every copy must hold it on every row, equal to the original's
//   where the original has it; a patient whose original outcome is missing makes it an error
//   (the copies would carry an imputed outcome).

#include <cstddef>
#include <cstdint>
#include <string>
#include <vector>

#include "core/data/table.h"

namespace calivera {

// Rows of the stacked table, so each copy can be made a table of its own (tableRows) only while
// it is validated: memory stays near the stacked table's, whatever m is.
struct StackedImputations {
  std::string column;
  std::vector<std::uint32_t> originalRows;           // index 0
  std::vector<std::vector<std::uint32_t>> copyRows;  // by increasing index
  std::vector<long long> indices;                    // the index of each copy
};

// Throws InputError naming the file, the column, the copy and the row.
StackedImputations splitStackedImputations(const Table& table, const std::string& column,
                                           const std::string& outcomeColumn);

}  // namespace calivera
