#pragma once
// RFC 4180 CSV reader into a columnar Table: header row; comma, semicolon or tab delimiter (given
// or detected from the header); quoted fields with embedded delimiters, doubled quotes and line
// breaks; UTF-8 with or without BOM; LF or CRLF. Numbers are parsed with std::from_chars.

#include <string>
#include <string_view>
#include <vector>

#include "core/data/table.h"

namespace calivera {

struct CsvOptions {
  char delimiter = 0;  // 0: detect among ',', ';' and '\t' from the header line
  std::vector<std::string> missingTokens{"", "NA"};
  unsigned threads = 0;  // 0: all hardware threads
};

struct CsvReadResult {
  Table table;
  char delimiter = ',';
  bool delimiterDetected = false;
  bool hadByteOrderMark = false;
  unsigned threadsUsed = 1;  // > 1 when the quote-free fast path split the text between threads
};

// Throws InputError naming the file and line for a ragged row, an unterminated quote, an empty
// or duplicate header name, or an unreadable file.
CsvReadResult readCsvFile(const std::string& path, const CsvOptions& options);
CsvReadResult parseCsv(std::string_view text, const std::string& sourceName,
                       const CsvOptions& options);

}  // namespace calivera
