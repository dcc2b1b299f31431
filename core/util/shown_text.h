#pragma once
// Text from files (levels, names, fields) as it may be echoed in a message: at most `maxChars`
// bytes (then "..."), NUL as \0 and other control characters as \xNN, so a 100 MB field or a
// hidden byte never reaches stderr or a dialog whole.

#include <cstddef>
#include <string>

namespace calivera {

std::string shownText(const std::string& text, std::size_t maxChars = 40);

}  // namespace calivera
