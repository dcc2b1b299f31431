#include "core/util/utf8.h"

namespace calivera {

bool validUtf8(std::string_view text) {
  const auto* p = reinterpret_cast<const unsigned char*>(text.data());
  const auto* end = p + text.size();
  while (p < end) {
    const unsigned char c = *p;
    if (c < 0x80) {
      ++p;
      continue;
    }
    int length = 0;
    unsigned char lo = 0x80, hi = 0xBF;  // allowed range of the second byte
    if (c >= 0xC2 && c <= 0xDF) {
      length = 2;
    } else if (c == 0xE0) {
      length = 3, lo = 0xA0;  // no overlong 3-byte forms
    } else if ((c >= 0xE1 && c <= 0xEC) || c == 0xEE || c == 0xEF) {
      length = 3;
    } else if (c == 0xED) {
      length = 3, hi = 0x9F;  // no surrogates
    } else if (c == 0xF0) {
      length = 4, lo = 0x90;  // no overlong 4-byte forms
    } else if (c >= 0xF1 && c <= 0xF3) {
      length = 4;
    } else if (c == 0xF4) {
      length = 4, hi = 0x8F;  // nothing above U+10FFFF
    } else {
      return false;
    }
    if (end - p < length || p[1] < lo || p[1] > hi) return false;
    for (int k = 2; k < length; ++k) {
      if (p[k] < 0x80 || p[k] > 0xBF) return false;
    }
    p += length;
  }
  return true;
}

}  // namespace calivera
