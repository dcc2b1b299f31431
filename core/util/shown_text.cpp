#include "core/util/shown_text.h"

#include <cstdio>

#include "core/util/utf8.h"

namespace calivera {

std::string shownText(const std::string& text, std::size_t maxChars) {
  // Text that is not UTF-8 shows its high bytes escaped too, so no invalid byte is echoed.
  const bool escapeHigh = !validUtf8(text);
  std::string out;
  for (std::size_t i = 0; i < text.size(); ++i) {
    if (out.size() >= maxChars) return out + "...";
    const auto c = static_cast<unsigned char>(text[i]);
    if (c == 0) {
      out += "\\0";
    } else if (c < 0x20 || c == 0x7f || (escapeHigh && c >= 0x80)) {
      char buffer[8];
      std::snprintf(buffer, sizeof buffer, "\\x%02x", c);
      out += buffer;
    } else {
      out += static_cast<char>(c);
    }
  }
  return out;
}

}  // namespace calivera
