#pragma once
// Second pass of the CSV reader for the columns the first pass found to hold text: codes per row
// and the sorted (byte order) list of levels. Kept apart because the first pass stores numbers
// only, so that all-numeric files never pay for strings.

#include <cstddef>
#include <string_view>

#include "core/data/csv_field.h"
#include "core/data/table.h"
#include "core/util/mapped_file.h"

namespace calivera::csv {

// `text` and `dataBegin`/`firstLine` are those the first pass read the records from; the records
// are known to be well formed. `quoteFree`: the text holds no '"', so records are lines. Fills
// codes and levels of every Text column and frees its numbers. `file` (may be null) is the mapped
// file `text` lies in, whose parsed pages are handed back as the pass moves on.
void fillTextColumns(std::string_view text, std::size_t dataBegin, std::size_t firstLine,
                     char delimiter, const MissingTokens& missing, bool quoteFree,
                     const MappedFile* file, Table& table);

}  // namespace calivera::csv
