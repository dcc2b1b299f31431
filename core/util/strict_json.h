#pragma once
// JSON as Calivera's own files (model, study) accept it: a key given twice in one object is an
// error (nlohmann would keep the last silently: a coefficient given twice would be taken from
// whichever came second), and nesting deeper than kMaxJsonDepth is refused before it can exhaust
// the stack of the recursive readers that follow.

#include <nlohmann/json.hpp>
#include <string>

namespace calivera {

inline constexpr int kMaxJsonDepth = 64;

// Throws InputError "SOURCE: not valid JSON (byte N: ...)", "SOURCE: the key 'K' appears twice
// in one object" or "SOURCE: nested deeper than 64 levels". `allowComments`: // and /* */.
nlohmann::json parseStrictJson(const std::string& text, const std::string& source,
                               bool allowComments);

}  // namespace calivera
