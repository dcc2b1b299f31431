#pragma once
// UTF-8 validity (RFC 3629): well-formed sequences only, no overlong forms, no surrogates
// (U+D800..U+DFFF), nothing above U+10FFFF.

#include <string_view>

namespace calivera {

bool validUtf8(std::string_view text);

}  // namespace calivera
