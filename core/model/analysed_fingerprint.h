#pragma once
// The analysed-data fingerprint: SHA-256 of the values a model is fitted or validated on, in a
// canonical form independent of the file's bytes (delimiter, quoting, column order, unused
// columns, rows excluded as incomplete, column names mapped). Two files holding the same patients
// with the same values in the same row order have the same fingerprint, so a model checked on its
// own development data is recognised (apparent performance) even when the data were saved again
// in another layout. `calivera fit` and the workstation record it in the model file
// (development.analysed_data_sha256); every validation computes it and states it.
//
// Canonical form (version 1): "calivera-analysed-data/1\n", the model variables in byte order
// joined by '\n' and a blank line, then per analysed row in file order the outcome (0 or 1) and
// each variable's value: a number in its shortest round-trip text, a text level (through the level
// mapping) as "<length>:<bytes>"; fields separated by '\x1f', rows ended by '\x1e'.

#include <cstdint>
#include <string>
#include <vector>

#include "core/data/table.h"
#include "core/model/model.h"

namespace calivera {

// `outcome`: 0/1 per row of `rows`.
std::string analysedDataFingerprint(const Model& model, const Table& table,
                                    const std::vector<std::uint32_t>& rows,
                                    const std::vector<double>& outcome);

}  // namespace calivera
