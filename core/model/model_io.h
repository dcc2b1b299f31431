#pragma once
// Reading and writing the Calivera model file (JSON, format id kModelFormatId). Numbers are
// written with 17 significant digits so a written model reads back bit for bit.

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
