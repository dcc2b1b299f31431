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
//
// A level mapping (Model::levelMapping) states which model level a cohort level stands for; the
// check and the evaluation both read cohort levels through it. Its targets must be levels the
// model knows, and it applies to text columns only.

#include <cstdint>
#include <map>
#include <string>
#include <vector>

#include "core/data/table.h"
#include "core/model/model.h"
#include "core/util/errors.h"
#include "core/util/shown_text.h"

namespace calivera {

// Unknown levels (or a level mapping that cannot apply): an InputError the workstation can tell
// apart, to keep the model loaded and offer the mapping step.
class UnknownLevelError : public InputError {
 public:
  using InputError::InputError;
};

// Throws UnknownLevelError for unknown levels; returns the warnings of an assumed reference level
// and of mapped levels no analysed patient has.
std::vector<std::string> checkCategoryLevels(const Model& model, const Table& table,
                                             const std::vector<std::uint32_t>& rows);

// The model level `cohortLevel` of `variable` stands for: its mapping, else itself.
const std::string& mappedLevel(const Model& model, const std::string& variable,
                               const std::string& cohortLevel);

// Model variable -> the levels its indicator terms name (products included), in first-use order.
std::map<std::string, std::vector<std::string>> indicatorLevels(const Model& model);

}  // namespace calivera
