#pragma once
// Text from files (levels, names, fields) as it may be echoed in a message: at most `maxChars`
// bytes (then "..."), NUL as \0 and other control characters as \xNN, so a 100 MB field or a
// hidden byte never reaches stderr or a dialog whole.

#include <cstddef>
#include <string>

namespace calivera {

std::string shownText(const std::string& text, std::size_t maxChars = 40);

// A file or model name as a window shows it: bidirectional control characters (which can make
// "gnp.exe" display as "exe.png") and other invisible controls written out as [U+202E] and the
// like, and the text cut after `maxCodePoints` characters with "..." (the full, escaped name
// belongs in a tooltip). UTF-8 in, UTF-8 out.
std::string visibleName(const std::string& text, std::size_t maxCodePoints = 60);

}  // namespace calivera
