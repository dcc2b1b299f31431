#include "core/data/csv_scanner.h"

#include <algorithm>
#include <cstddef>

#include "core/util/errors.h"

namespace calivera::csv {

RecordScanner::RecordScanner(std::string_view text, char delimiter, const std::string& sourceName,
                             std::size_t position, std::size_t line)
    : text_(text),
      delimiter_(delimiter),
      sourceName_(sourceName),
      position_(position),
      line_(line) {}

bool RecordScanner::next() {
  if (position_ >= text_.size()) return false;
  recordLine_ = line_;
  spans_.clear();
  fieldLines_.clear();
  scratch_.clear();
  std::size_t position = position_;
  while (true) {
    Span span;
    fieldLines_.push_back(line_);
    std::size_t start = position;
    while (start < text_.size() &&
           (text_[start] == ' ' || (text_[start] == '\t' && delimiter_ != '\t'))) {
      ++start;
    }
    if (start < text_.size() && text_[start] == '"') {
      position = readQuoted(start, span);
    } else {
      position = readUnquoted(position, span);
    }
    spans_.push_back(span);
    if (position >= text_.size()) break;
    const char c = text_[position];
    if (c == delimiter_) {
      ++position;
      continue;
    }
    // At a line end: LF, or CR LF (readUnquoted leaves a CR before LF out of the field).
    if (c == '\r') ++position;
    ++position;  // the LF
    ++line_;
    break;
  }
  position_ = position;
  fields_.clear();
  for (const Span& span : spans_) {
    const std::string_view base = span.inScratch ? std::string_view(scratch_) : text_;
    fields_.push_back(base.substr(span.offset, span.length));
  }
  return true;
}

std::size_t RecordScanner::readUnquoted(std::size_t position, Span& span) const {
  const std::size_t begin = position;
  while (position < text_.size()) {
    const char c = text_[position];
    if (c == delimiter_ || c == '\n') break;
    if (c == '\r' && position + 1 < text_.size() && text_[position + 1] == '\n') break;
    ++position;
  }
  span = Span{false, begin, position - begin};
  return position;
}

std::size_t RecordScanner::readQuoted(std::size_t position, Span& span) {
  const std::size_t startLine = line_;
  const std::size_t contentBegin = position + 1;
  std::size_t segment = contentBegin;
  std::size_t scratchOffset = 0;
  bool escaped = false;
  std::size_t cursor = contentBegin;
  while (true) {
    const std::size_t quote = text_.find('"', cursor);
    if (quote == std::string_view::npos) {
      throw InputError(sourceName_ + ":" + std::to_string(startLine) +
                       ": quoted field is never closed (missing '\"')");
    }
    line_ += static_cast<std::size_t>(
        std::count(text_.begin() + static_cast<std::ptrdiff_t>(cursor),
                   text_.begin() + static_cast<std::ptrdiff_t>(quote), '\n'));
    if (quote + 1 < text_.size() && text_[quote + 1] == '"') {
      if (!escaped) {
        escaped = true;
        scratchOffset = scratch_.size();
      }
      scratch_.append(text_.substr(segment, quote + 1 - segment));  // keeps one of the two
      cursor = quote + 2;
      segment = cursor;
      continue;
    }
    if (escaped) {
      scratch_.append(text_.substr(segment, quote - segment));
      span = Span{true, scratchOffset, scratch_.size() - scratchOffset};
    } else {
      span = Span{false, contentBegin, quote - contentBegin};
    }
    std::size_t after = quote + 1;
    while (after < text_.size() &&
           (text_[after] == ' ' || (text_[after] == '\t' && delimiter_ != '\t'))) {
      ++after;
    }
    const bool atEnd =
        after >= text_.size() || text_[after] == delimiter_ || text_[after] == '\n' ||
        (text_[after] == '\r' && after + 1 < text_.size() && text_[after + 1] == '\n');
    if (!atEnd) {
      throw InputError(sourceName_ + ":" + std::to_string(line_) + ": field " +
                       std::to_string(spans_.size() + 1) +
                       ": unexpected text after the closing quote (a '\"' inside a quoted "
                       "field must be doubled)");
    }
    return after;
  }
}

}  // namespace calivera::csv
