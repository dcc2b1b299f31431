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

std::string visibleName(const std::string& text, std::size_t maxCodePoints) {
  const std::string safe = validUtf8(text) ? text : shownText(text, text.size());
  std::string out;
  std::size_t shown = 0;
  for (std::size_t i = 0; i < safe.size();) {
    const auto c = static_cast<unsigned char>(safe[i]);
    const std::size_t length = c < 0x80 ? 1 : c < 0xE0 ? 2 : c < 0xF0 ? 3 : 4;
    unsigned codePoint = c;
    if (length == 2) codePoint = ((c & 0x1Fu) << 6) | (safe[i + 1] & 0x3F);
    if (length == 3) {
      codePoint = ((c & 0x0Fu) << 12) | ((safe[i + 1] & 0x3Fu) << 6) | (safe[i + 2] & 0x3F);
    }
    if (shown == maxCodePoints) return out + "...";
    const bool invisible = codePoint < 0x20 || codePoint == 0x7F ||
                           (codePoint >= 0x200B && codePoint <= 0x200F) ||
                           (codePoint >= 0x202A && codePoint <= 0x202E) ||
                           (codePoint >= 0x2066 && codePoint <= 0x2069) || codePoint == 0xFEFF;
    if (invisible) {
      char buffer[16];
      std::snprintf(buffer, sizeof buffer, "[U+%04X]", codePoint);
      out += buffer;
    } else {
      out.append(safe, i, length);
    }
    ++shown;
    i += length;
  }
  return out;
}

}  // namespace calivera
