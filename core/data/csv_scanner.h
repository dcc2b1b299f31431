#pragma once
// Sequential RFC 4180 record scanner: splits CSV text into records and fields, undoing quoting.
// A field that starts (after optional spaces) with '"' is quoted: it ends at the next lone '"',
// may hold delimiters and line breaks, and '""' stands for one '"'. After the closing quote only
// spaces may follow before the delimiter or line end (anything else is an InputError, so broken
// quoting is never guessed at). A '"' inside an unquoted field is kept as written. Records end at
// LF or CRLF or the end of the text.

#include <cstddef>
#include <cstring>
#include <string>
#include <string_view>
#include <vector>

namespace calivera::csv {

// One line of quote-free text (where records are lines): [begin, contentEnd) without the LF or
// CR LF; the next line starts at `next`.
struct Line {
  const char* begin;
  const char* contentEnd;
  const char* next;
};

inline Line lineAt(const char* begin, const char* end) {
  const char* lineEnd =
      static_cast<const char*>(std::memchr(begin, '\n', static_cast<std::size_t>(end - begin)));
  if (lineEnd == nullptr) lineEnd = end;
  const char* contentEnd = lineEnd;
  if (contentEnd > begin && contentEnd[-1] == '\r') --contentEnd;
  return Line{begin, contentEnd, lineEnd + 1};
}

// Where the field starting at `field` ends: at the next delimiter or at `contentEnd`. A plain
// loop: fields are a few bytes long, where a memchr call costs more than it saves (issue 13).
inline const char* fieldEndAt(const char* field, const char* contentEnd, char delimiter) {
  while (field != contentEnd && *field != delimiter) ++field;
  return field;
}

class RecordScanner {
 public:
  // `line` is the physical line number at `position` (1 at the start of a file).
  RecordScanner(std::string_view text, char delimiter, const std::string& sourceName,
                std::size_t position, std::size_t line);

  // Reads the next record; false at the end of the text. Throws InputError naming the line
  // where an unterminated quoted field starts or where text follows a closing quote.
  bool next();

  // Valid until the next call of next().
  const std::vector<std::string_view>& fields() const { return fields_; }
  std::size_t fieldLine(std::size_t field) const { return fieldLines_[field]; }
  std::size_t recordLine() const { return recordLine_; }
  std::size_t position() const { return position_; }
  std::size_t line() const { return line_; }

 private:
  struct Span {
    bool inScratch = false;
    std::size_t offset = 0;
    std::size_t length = 0;
  };

  // Both return the position just after the field's content (at a delimiter, line end or end).
  std::size_t readQuoted(std::size_t position, Span& span);  // at the opening quote
  std::size_t readUnquoted(std::size_t position, Span& span) const;

  std::string_view text_;
  char delimiter_;
  const std::string& sourceName_;
  std::size_t position_;
  std::size_t line_;
  std::size_t recordLine_ = 0;
  std::vector<Span> spans_;
  std::vector<std::size_t> fieldLines_;
  std::vector<std::string_view> fields_;
  std::string scratch_;  // unescaped content of quoted fields holding '""'
};

}  // namespace calivera::csv
