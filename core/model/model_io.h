#pragma once
// Reading and writing the Calivera model file (JSON, format id kModelFormatId). Numbers are
// written in the shortest decimal form that reads back to the same double (at most 17
// significant digits), so a written model reads back bit for bit. Files may carry // and /* */
// comments, so a published model can be annotated where it is kept. Unknown fields are errors,
// so a misspelt key ("centre") is caught rather than silently ignored.

#include <string>

#include "core/model/model.h"

namespace calivera {

// Throws InputError: malformed JSON (with its byte position), wrong format id, unknown
// transformation, non-finite coefficient, missing field — each naming the file and the term.
Model readModelFile(const std::string& path);
Model parseModelJson(const std::string& text, const std::string& sourceName);

std::string modelToJson(const Model& model);
void writeModelFile(const std::string& path, const Model& model);  // atomic (temp + rename)

}  // namespace calivera
