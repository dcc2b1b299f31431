#pragma once
// RFC 4180 CSV reader into a columnar Table: header row; comma, semicolon or tab delimiter (given
// or detected from the header); quoted fields with embedded delimiters, doubled quotes and line
// breaks; UTF-8 with or without BOM; LF or CRLF. Numbers are parsed with std::from_chars.
// Format: RFC 4180 (Shafranovich, "Common Format and MIME Type for CSV Files", IETF 2005).
//
// Decisions beyond the RFC (tested in tests/unit/csv_reader_test.cpp):
// - Header names and values are trimmed of surrounding spaces (and tabs, unless tab is the
//   delimiter), also inside quotes: ' age ' names the column 'age', ' yes' is the level 'yes'.
//   An empty header name, or two names equal after trimming, is an InputError naming the file,
//   line and column positions. A header without data rows, or an empty file, is an InputError.
// - Delimiter detection counts ',', ';' and tab outside quotes in the header line and takes the
//   most frequent; a tie is an InputError (give the delimiter). No candidate: one column.
// - Numbers (core/data/csv_field.h): what std::from_chars accepts in full plus an optional
//   leading '+', finite only. '1e3', '+5', ' 5 ', '.5' are numbers; 'inf', 'nan', '1e999',
//   '0x1A', decimal commas ('1,5') and units ('5 mg') are not, so their column becomes text and
//   Table::requireNumeric names the first such field (its text trimmed, as in the levels). In a
//   text column every non-missing field is a level as written, so '1' and '1.0' differ.
// - Missing: a field equal (after trimming) to a missing token; by default '' and 'NA'. A
//   token that is a number (e.g. '-99') is honoured before number parsing.
// - A record with fewer or more fields than the header is an InputError naming the line where
//   the record starts; a blank line inside the data is one too. Line breaks (and blank lines)
//   at the very end of the file are not records.
// - A '"' inside an unquoted field is kept as text; text after a closing quote (other than
//   spaces) is an InputError; a quote that is never closed is an InputError naming the line
//   where the quoted field starts.
// - Line ends of CR only (old Mac) and UTF-16 text are refused with an InputError saying so.
//
// Speed: the file is memory-mapped and parsed in place. When it holds no '"' at all, records
// are lines: the text is split at line breaks and parsed on all threads straight into the
// columns, and parsed pages are handed back to the kernel as the parse moves on (peak memory
// about the size of the numeric columns). With quotes, one thread reads it sequentially.
// Columns found to hold text get their levels in a second pass over the text.

#include <string>
#include <string_view>
#include <vector>

#include "core/data/table.h"

namespace calivera {

struct CsvOptions {
  char delimiter = 0;  // 0: detect among ',', ';' and '\t' from the header line
  std::vector<std::string> missingTokens{"", "NA"};
  unsigned threads = 0;  // 0: all hardware threads
  // Empty: every column is parsed and stored. Otherwise only the header's columns named here are
  // (the command line passes the columns its analysis reads); every record's field count is still
  // checked, the other fields are skipped unparsed, and Table::headerNames keeps the whole header
  // for messages. Names the header lacks are ignored here: the analysis reports them.
  std::vector<std::string> onlyColumns;
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
