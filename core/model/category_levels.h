#pragma once
// Category levels of the cohort against those the model knows. An indicator term scores 1 for
// its level and 0 otherwise, so a cohort level the model does not know ("Emergency" where the
// model says "emergency", a trailing space, a NUL byte) would silently be scored as the reference
// level: a wrong risk that looks right. Every path that evaluates a model (designMatrix, hence
// the linear predictor, the validation, updating and internal validation) checks the levels
// first:
//   - the model knows the levels of its indicator terms and, when its file records it
//     (Model::referenceLevels, written by `calivera fit`), the reference level;
//   - with the reference recorded, any other level in the analysed rows is an error;
//   - without it (older or hand-written model files), exactly one unmatched level is taken as the
//     reference and named in a warning; two or more are an error.
// The error names the file, the column, the unknown levels with their row counts (text cut to a
// short prefix, control characters shown escaped) and the model's levels.

#include <cstdint>
#include <string>
#include <vector>

#include "core/data/table.h"
#include "core/model/model.h"
#include "core/util/shown_text.h"

namespace calivera {

// Throws InputError for unknown levels; returns the warnings of an assumed reference level.
std::vector<std::string> checkCategoryLevels(const Model& model, const Table& table,
                                             const std::vector<std::uint32_t>& rows);

}  // namespace calivera
