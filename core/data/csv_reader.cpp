#include "core/data/csv_reader.h"

#include <sys/mman.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <charconv>
#include <cmath>
#include <cstdint>
#include <cstring>
#include <exception>
#include <limits>
#include <optional>
#include <thread>
#include <unordered_map>

#include "core/data/byte_count.h"
#include "core/data/csv_field.h"
#include "core/data/csv_scanner.h"
#include "core/data/csv_text_columns.h"
#include "core/util/errors.h"
#include "core/util/mapped_file.h"
#include "core/util/shown_text.h"
#include "core/util/stage_times.h"
#include "core/util/utf8.h"

namespace calivera {
namespace {

constexpr std::string_view kByteOrderMark = "\xEF\xBB\xBF";
constexpr double kMissing = std::numeric_limits<double>::quiet_NaN();
// Below this many bytes per thread, starting threads costs more than it saves.
constexpr std::size_t kMinBytesPerThread = std::size_t{1} << 16;

std::string at(const std::string& source, std::size_t line) {
  return source + ":" + std::to_string(line) + ": ";
}

// The delimiter that occurs most often outside quotes in the header line. A header without any
// candidate is a one-column file (comma); a tie between candidates is refused because guessing
// would silently misread the file.
char detectDelimiter(std::string_view text, const std::string& source) {
  constexpr char kCandidates[] = {',', ';', '\t'};
  std::size_t counts[3] = {0, 0, 0};
  bool inQuotes = false;
  for (const char c : text) {
    if (c == '"') {
      inQuotes = !inQuotes;
    } else if (!inQuotes) {
      if (c == '\n') break;
      for (int k = 0; k < 3; ++k) counts[k] += c == kCandidates[k] ? 1 : 0;
    }
  }
  int best = 0;
  for (int k = 1; k < 3; ++k) {
    if (counts[k] > counts[best]) best = k;
  }
  for (int k = 0; k < 3; ++k) {
    if (k != best && counts[k] == counts[best] && counts[k] > 0) {
      throw InputError(at(source, 1) +
                       "cannot tell the delimiter from the header (as many ',' as ';' or tabs); "
                       "give the delimiter explicitly");
    }
  }
  return kCandidates[best];
}

std::vector<std::string> readHeader(csv::RecordScanner& scanner, const std::string& source,
                                    char delimiter) {
  if (!scanner.next()) throw InputError(source + ": the file is empty (no header row)");
  std::vector<std::string> names;
  std::unordered_map<std::string_view, std::size_t> seen;
  const std::vector<std::string_view>& fields = scanner.fields();
  names.reserve(fields.size());
  for (std::size_t i = 0; i < fields.size(); ++i) {
    names.emplace_back(csv::trimField(fields[i], delimiter));
  }
  for (std::size_t i = 0; i < names.size(); ++i) {
    if (names[i].empty()) {
      throw InputError(at(source, scanner.fieldLine(i)) + "header column " + std::to_string(i + 1) +
                       " has no name");
    }
    const auto [it, inserted] = seen.emplace(names[i], i);
    if (!inserted) {
      throw InputError(at(source, scanner.fieldLine(i)) + "header columns " +
                       std::to_string(it->second + 1) + " and " + std::to_string(i + 1) +
                       " are both named '" + names[i] + "'");
    }
  }
  return names;
}

std::string raggedMessage(const std::string& source, std::size_t line, std::size_t found,
                          std::size_t expected, bool blank) {
  if (blank) {
    return at(source, line) + "blank line inside the data (expected " + std::to_string(expected) +
           " fields)";
  }
  return at(source, line) + std::to_string(found) + (found == 1 ? " field" : " fields") +
         ", but the header has " + std::to_string(expected) + " columns";
}

// What one parsing pass learns per column besides the values.
struct ColumnTally {
  std::size_t missing = 0;
  std::optional<FieldLocation> firstText;
};

class FieldReader {
 public:
  enum class Kind { Number, Missing, Text };
  FieldReader(const csv::MissingTokens& missing, char delimiter)
      : missing_(missing), delimiter_(delimiter) {}

  Kind read(std::string_view raw, double& value, std::string_view& trimmed) const {
    trimmed = csv::trimField(raw, delimiter_);
    if (missing_.contains(trimmed)) return Kind::Missing;
    if (csv::parseNumber(trimmed, value)) return Kind::Number;
    return Kind::Text;
  }

  // Stores the field of `row` and updates the tally; line is the field's physical line.
  void store(std::string_view raw, double& slot, ColumnTally& tally, std::size_t line) const {
    std::string_view trimmed;
    double value = kMissing;
    switch (read(raw, value, trimmed)) {
      case Kind::Number:
        slot = value;
        return;
      case Kind::Missing:
        ++tally.missing;
        break;
      case Kind::Text:
        if (!tally.firstText) tally.firstText = FieldLocation{line, std::string(trimmed)};
        break;
    }
    slot = kMissing;
  }

  bool numericTokenPossible() const { return missing_.hasNumericToken(); }
  char delimiter() const { return delimiter_; }

 private:
  const csv::MissingTokens& missing_;
  char delimiter_;
};

// General path: one thread, full RFC 4180 quoting, records may span lines.
void parseSequential(std::string_view text, std::size_t dataBegin, std::size_t firstLine,
                     const FieldReader& reader, const std::string& source, Table& table,
                     std::vector<ColumnTally>& tallies, const std::vector<char>& used,
                     const MappedFile* file) {
  const std::size_t width = table.columns.size();
  const std::size_t lineBreaks = static_cast<std::size_t>(
      std::count(text.begin() + static_cast<std::ptrdiff_t>(dataBegin), text.end(), '\n'));
  for (std::size_t c = 0; c < width; ++c) {
    if (used[c]) table.columns[c].numbers.reserve(lineBreaks + 1);
  }
  csv::RecordScanner scanner(text, reader.delimiter(), source, dataBegin, firstLine);
  ReleaseBehind release(file, text.data() + dataBegin);
  std::size_t row = 0;
  while (scanner.next()) {
    release.passed(text.data() + scanner.position());
    const std::vector<std::string_view>& fields = scanner.fields();
    if (fields.size() != width) {
      const bool blank =
          fields.size() == 1 && csv::trimField(fields[0], reader.delimiter()).empty();
      throw InputError(raggedMessage(source, scanner.recordLine(), fields.size(), width, blank));
    }
    for (std::size_t c = 0; c < width; ++c) {
      if (!used[c]) continue;
      double& slot = table.columns[c].numbers.emplace_back(kMissing);
      reader.store(fields[c], slot, tallies[c], scanner.fieldLine(c));
    }
    // Lines are only recorded once some record (or the header) has made them differ from the
    // simple "row + 2" rule.
    if (table.recordLines.empty() && scanner.recordLine() != row + 2) {
      for (std::size_t r = 0; r < row; ++r)
        table.recordLines.push_back(static_cast<std::uint32_t>(r + 2));
    }
    if (!table.recordLines.empty() || scanner.recordLine() != row + 2) {
      table.recordLines.push_back(static_cast<std::uint32_t>(scanner.recordLine()));
    }
    ++row;
  }
  release.finish(text.data() + text.size());
  table.rowCount = row;
}

// Fast path for text without any '"': records are lines, so the text can be split at line breaks
// and each piece parsed on its own thread straight into the preallocated columns.
struct Chunk {
  std::size_t begin = 0;
  std::size_t end = 0;
  std::size_t firstRow = 0;
  std::size_t rows = 0;
  std::vector<ColumnTally> tallies;
  std::optional<std::string> error;
};

void parseChunk(std::string_view text, const FieldReader& reader, const std::string& source,
                Table& table, Chunk& chunk, ReleaseBehind& release) {
  const std::size_t width = table.columns.size();
  const char delimiter = reader.delimiter();
  const bool tokenCheck = reader.numericTokenPossible();
  std::vector<double*> slots(width);  // null: a column that is not stored (only its end is found)
  std::size_t afterStored = 0;        // the columns from here on are all not stored
  for (std::size_t c = 0; c < width; ++c) {
    std::vector<double>& numbers = table.columns[c].numbers;
    slots[c] = numbers.empty() ? nullptr : numbers.data() + chunk.firstRow;
    if (slots[c] != nullptr) afterStored = c + 1;
  }
  // Most fields are plain numbers: one parse both reads the value and finds the field end.
  const auto storeField = [&](const char* field, const char* contentEnd, const char*& fieldEnd,
                              double& slot, ColumnTally& tally, std::size_t line) {
    double value = 0.0;
    const char* stop = csv::parsePlainDecimal(field, contentEnd, value);
    bool parsed = stop != nullptr;
    if (!parsed) {
      const auto fromChars = std::from_chars(field, contentEnd, value);
      stop = fromChars.ptr;
      parsed = fromChars.ec == std::errc() && std::isfinite(value);
    }
    if (!tokenCheck && parsed && (stop == contentEnd || *stop == delimiter)) {
      slot = value;
      fieldEnd = stop;
    } else {
      fieldEnd = csv::fieldEndAt(field, contentEnd, delimiter);
      reader.store(std::string_view(field, static_cast<std::size_t>(fieldEnd - field)), slot, tally,
                   line);
    }
  };
  const char* p = text.data() + chunk.begin;
  const char* const end = text.data() + chunk.end;
  std::size_t row = 0;
  while (p < end) {
    const std::size_t line = chunk.firstRow + row + 2;
    const csv::Line current = csv::lineAt(p, end);
    const char* const contentEnd = current.contentEnd;
    const char* field = p;
    for (std::size_t c = 0; c < width; ++c) {
      // The columns after the last stored one only need their fields counted: one count of the
      // delimiters left on the line. A wrong count falls through to the field-by-field walk,
      // which names what is wrong.
      if (c == afterStored && c > 0 &&
          csv::countByte(field, contentEnd, delimiter) == width - 1 - c) {
        break;
      }
      const char* fieldEnd = nullptr;
      if (slots[c] == nullptr) {
        fieldEnd = csv::fieldEndAt(field, contentEnd, delimiter);
      } else {
        storeField(field, contentEnd, fieldEnd, slots[c][row], chunk.tallies[c], line);
      }
      if (fieldEnd == contentEnd) {
        if (c + 1 != width) {
          const bool blank =
              c == 0 &&
              csv::trimField(std::string_view(p, static_cast<std::size_t>(contentEnd - p)),
                             delimiter)
                  .empty();
          chunk.error = raggedMessage(source, line, c + 1, width, blank);
          return;
        }
      } else if (c + 1 == width) {
        const std::size_t extra =
            static_cast<std::size_t>(std::count(fieldEnd, contentEnd, delimiter));
        chunk.error = raggedMessage(source, line, width + extra, width, false);
        return;
      } else {
        field = fieldEnd + 1;
      }
    }
    ++row;
    p = current.next;
    release.passed(p);
  }
  release.finish(end);
}

// Runs work(0) .. work(count - 1), each on its own thread (work(0) on the calling one).
template <class Work>
void runOnThreads(std::size_t count, const Work& work) {
  std::vector<std::thread> workers;
  workers.reserve(count);
  for (std::size_t i = 1; i < count; ++i) workers.emplace_back(work, i);
  work(0);
  for (std::thread& worker : workers) worker.join();
}

// Asks for transparent huge pages on a large column before its first touch: far fewer page
// faults while millions of values are written. Advice only; ignored where unsupported.
void adviseHugePages(std::vector<double>& numbers) {
  const auto page = static_cast<std::uintptr_t>(::sysconf(_SC_PAGESIZE));
  const auto begin = reinterpret_cast<std::uintptr_t>(numbers.data());
  const std::uintptr_t first = (begin + page - 1) / page * page;
  const std::uintptr_t last = (begin + numbers.capacity() * sizeof(double)) / page * page;
  if (last > first) ::madvise(reinterpret_cast<void*>(first), last - first, MADV_HUGEPAGE);
}

// Splits the data at line breaks into one chunk per thread and counts the records of each (so
// every thread knows the row it starts at). Returns false when the text holds a '"' after all:
// then the sequential path must read it.
bool planChunks(std::string_view text, std::size_t dataBegin, std::size_t count, std::size_t width,
                const MappedFile* file, std::vector<Chunk>& chunks) {
  const std::size_t size = text.size() - dataBegin;
  chunks.assign(count, Chunk{});
  std::size_t begin = dataBegin;
  for (std::size_t i = 0; i < count; ++i) {
    std::size_t end = text.size();
    if (i + 1 < count) {
      end = std::max(begin, dataBegin + size * (i + 1) / count);
      const std::size_t lineBreak = text.find('\n', end);
      end = lineBreak == std::string_view::npos ? text.size() : lineBreak + 1;
    }
    chunks[i].begin = begin;
    chunks[i].end = end;
    chunks[i].tallies.resize(width);
    begin = end;
  }
  std::vector<char> quoted(count, 0);
  runOnThreads(count, [&](std::size_t i) {
    Chunk& chunk = chunks[i];
    const char* p = text.data() + chunk.begin;
    const char* const end = text.data() + chunk.end;
    ReleaseBehind release(file, p);
    constexpr std::size_t kBlock = std::size_t{1} << 20;
    while (p < end && quoted[i] == 0) {
      const std::size_t length = std::min(kBlock, static_cast<std::size_t>(end - p));
      const csv::LineTally tally = csv::tallyLines(p, p + length);
      chunk.rows += tally.lineBreaks;
      if (tally.quote) quoted[i] = 1;
      p += length;
      release.passed(p);
    }
    release.finish(p);
    if (chunk.end > chunk.begin && text[chunk.end - 1] != '\n') ++chunk.rows;
  });
  if (std::find(quoted.begin(), quoted.end(), 1) != quoted.end()) return false;
  std::size_t rows = 0;
  for (Chunk& chunk : chunks) {
    chunk.firstRow = rows;
    rows += chunk.rows;
  }
  return true;
}

// False when the text turns out to need the sequential (quoting) path.
bool parseParallel(std::string_view text, std::size_t dataBegin, unsigned threads,
                   const FieldReader& reader, const std::string& source, Table& table,
                   std::vector<ColumnTally>& tallies, const std::vector<char>& used,
                   const MappedFile* file, unsigned& threadsUsed) {
  const std::size_t useful =
      std::max<std::size_t>(1, (text.size() - dataBegin) / kMinBytesPerThread);
  const std::size_t count = std::min<std::size_t>(threads, useful);
  std::vector<Chunk> chunks;
  if (!planChunks(text, dataBegin, count, table.columns.size(), file, chunks)) return false;
  markStage("  csv rows counted");
  const std::size_t rows = chunks.back().firstRow + chunks.back().rows;
  // Columns are allocated on all threads so the first-touch page faults are shared out too.
  std::vector<std::size_t> stored;
  for (std::size_t c = 0; c < table.columns.size(); ++c) {
    if (used[c]) stored.push_back(c);
  }
  runOnThreads(count, [&](std::size_t i) {
    for (std::size_t k = i; k < stored.size(); k += count) {
      std::vector<double>& numbers = table.columns[stored[k]].numbers;
      numbers.reserve(rows);
      adviseHugePages(numbers);
      numbers.assign(rows, kMissing);
    }
  });
  markStage("  csv columns allocated");
  runOnThreads(count, [&](std::size_t i) {
    ReleaseBehind release(file, text.data() + chunks[i].begin);
    parseChunk(text, reader, source, table, chunks[i], release);
  });
  for (const Chunk& chunk : chunks) {
    // The first failing chunk holds the earliest error line.
    if (chunk.error) throw InputError(*chunk.error);
  }
  for (const Chunk& chunk : chunks) {
    for (std::size_t c = 0; c < tallies.size(); ++c) {
      tallies[c].missing += chunk.tallies[c].missing;
      if (!tallies[c].firstText && chunk.tallies[c].firstText) {
        tallies[c].firstText = chunk.tallies[c].firstText;
      }
    }
  }
  table.rowCount = rows;
  threadsUsed = static_cast<unsigned>(count);
  return true;
}

// Column names and text values must be UTF-8: every output (JSON, CSV, PDF, the workstation)
// carries them, and invalid bytes found only when writing the JSON would fail late, with a
// library message and no location. Each distinct level is checked once; the message names the
// line of its first row and the column.
void requireUtf8Text(const Table& table) {
  for (std::size_t c = 0; c < table.columns.size(); ++c) {
    const Column& column = table.columns[c];
    if (!validUtf8(column.name)) {
      throw InputError(table.sourceName + ":1: column " + std::to_string(c + 1) +
                       ": the column name is not valid UTF-8 (" + shownText(column.name) +
                       "); save the file as UTF-8");
    }
    if (column.kind != ColumnKind::Text) continue;
    for (std::size_t level = 0; level < column.levels.size(); ++level) {
      if (validUtf8(column.levels[level])) continue;
      std::size_t row = 0;
      while (row < column.codes.size() && column.codes[row] != static_cast<std::int32_t>(level)) {
        ++row;
      }
      throw InputError(table.sourceName + ":" + std::to_string(table.lineOfRow(row)) + ": column " +
                       std::to_string(c + 1) + " ('" + shownText(column.name) +
                       "'): the value is not valid UTF-8 (" + shownText(column.levels[level]) +
                       "); save the file as UTF-8");
    }
  }
}

CsvReadResult parseText(std::string_view text, const std::string& sourceName,
                        const CsvOptions& options, const MappedFile* file) {
  CsvReadResult result;
  Table& table = result.table;
  table.sourceName = sourceName;
  if (text.substr(0, kByteOrderMark.size()) == kByteOrderMark) {
    result.hadByteOrderMark = true;
    text.remove_prefix(kByteOrderMark.size());
  }
  // Trailing line breaks (and blank lines at the very end) end the last record; they are not
  // records themselves.
  while (!text.empty() && (text.back() == '\n' || text.back() == '\r')) text.remove_suffix(1);
  if (text.find_first_not_of(" \t") == std::string_view::npos) {
    throw InputError(sourceName + ": the file is empty (no header row)");
  }
  if (text.size() >= 2 &&
      ((text[0] == '\xFF' && text[1] == '\xFE') || (text[0] == '\xFE' && text[1] == '\xFF'))) {
    throw InputError(sourceName + ": the file is UTF-16 text; save it as UTF-8");
  }
  const std::string_view firstLine = text.substr(0, text.find('\n'));
  const std::size_t carriageReturn = firstLine.find('\r');
  if (carriageReturn != std::string_view::npos && carriageReturn + 1 < firstLine.size()) {
    throw InputError(sourceName +
                     ": lines end with a carriage return only (old Mac format); save the file "
                     "with LF or CRLF line ends");
  }
  if (options.delimiter == 0) {
    result.delimiter = detectDelimiter(text, sourceName);
    result.delimiterDetected = true;
  } else {
    if (options.delimiter == '"' || options.delimiter == '\n' || options.delimiter == '\r') {
      throw InputError(sourceName + ": '" + std::string(1, options.delimiter) +
                       "' cannot be a delimiter");
    }
    result.delimiter = options.delimiter;
  }
  const csv::MissingTokens missing(options.missingTokens);
  const FieldReader reader(missing, result.delimiter);

  csv::RecordScanner header(text, result.delimiter, sourceName, 0, 1);
  const std::vector<std::string> names = readHeader(header, sourceName, result.delimiter);
  const std::size_t dataBegin = header.position();
  if (dataBegin >= text.size()) {
    throw InputError(sourceName + ": the file has a header row but no data rows");
  }
  table.columns.resize(names.size());
  for (std::size_t c = 0; c < names.size(); ++c) table.columns[c].name = names[c];
  std::vector<ColumnTally> tallies(names.size());
  std::vector<char> used(names.size(), 1);
  if (!options.onlyColumns.empty()) {
    for (std::size_t c = 0; c < names.size(); ++c) {
      used[c] = std::find(options.onlyColumns.begin(), options.onlyColumns.end(), names[c]) !=
                options.onlyColumns.end();
    }
  }

  const unsigned threads =
      options.threads != 0 ? options.threads : std::max(1U, std::thread::hardware_concurrency());
  // A header holding a quote means quoting is in use; otherwise the chunk planner looks for one.
  const bool quotedHeader = text.substr(0, dataBegin).find('"') != std::string_view::npos;
  const bool quoteFree =
      !quotedHeader && parseParallel(text, dataBegin, threads, reader, sourceName, table, tallies,
                                     used, file, result.threadsUsed);
  if (!quoteFree) {
    parseSequential(text, dataBegin, header.line(), reader, sourceName, table, tallies, used, file);
    result.threadsUsed = 1;
  }

  for (std::size_t c = 0; c < names.size(); ++c) {
    Column& column = table.columns[c];
    column.missingCount = tallies[c].missing;
    if (tallies[c].firstText) {
      column.kind = ColumnKind::Text;
      column.firstNonNumeric = std::move(tallies[c].firstText);
    }
  }
  csv::fillTextColumns(text, dataBegin, header.line(), result.delimiter, missing, quoteFree, file,
                       table);
  requireUtf8Text(table);  // every header name, stored or not
  if (std::find(used.begin(), used.end(), 0) != used.end()) {
    table.headerNames = names;
    std::vector<Column> kept;
    for (std::size_t c = 0; c < names.size(); ++c) {
      if (used[c]) kept.push_back(std::move(table.columns[c]));
    }
    table.columns = std::move(kept);
  }
  return result;
}

}  // namespace

CsvReadResult parseCsv(std::string_view text, const std::string& sourceName,
                       const CsvOptions& options) {
  return parseText(text, sourceName, options, nullptr);
}

CsvReadResult readCsvFile(const std::string& path, const CsvOptions& options) {
  const MappedFile file(path);
  return parseText(file.bytes(), path, options, &file);
}

}  // namespace calivera
