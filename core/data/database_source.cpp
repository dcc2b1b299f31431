#include "core/data/database_source.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <condition_variable>
#include <cstdint>
#include <deque>
#include <exception>
#include <limits>
#include <map>
#include <memory>
#include <mutex>
#include <pqxx/pqxx>
#include <set>
#include <thread>
#include <unordered_map>

#include "core/data/csv_field.h"
#include "core/data/postgres_binary.h"
#include "core/util/errors.h"
#include "core/util/sha256.h"
#include "core/util/shown_text.h"

namespace calivera {
namespace {

constexpr std::size_t kMaxUriBytes = 4096;
constexpr std::size_t kMaxTableNameBytes = 1024;
constexpr const char* kCursorName = "calivera_rows";

// PostgreSQL's built-in type OIDs (src/include/catalog/pg_type.dat), fixed across versions.
enum class ColumnRead { Number, Boolean, Text, DateTime, Other };

ColumnRead readOfType(unsigned oid) {
  switch (oid) {
    case 20:    // bigint
    case 21:    // smallint
    case 23:    // integer
    case 700:   // real
    case 701:   // double precision
    case 1700:  // numeric
      return ColumnRead::Number;
    case 16:  // boolean
      return ColumnRead::Boolean;
    case 18:    // "char"
    case 19:    // name
    case 25:    // text
    case 1042:  // character(n)
    case 1043:  // character varying(n)
      return ColumnRead::Text;
    case 1082:  // date
    case 1083:  // time
    case 1114:  // timestamp
    case 1184:  // timestamp with time zone
    case 1186:  // interval
    case 1266:  // time with time zone
      return ColumnRead::DateTime;
    default:
      return ColumnRead::Other;
  }
}

std::string trimmedText(std::string_view text) {
  while (!text.empty() && (text.front() == ' ' || text.front() == '\t')) text.remove_prefix(1);
  while (!text.empty() && (text.back() == ' ' || text.back() == '\t')) text.remove_suffix(1);
  return std::string(text);
}

// One column of the result while rows arrive.
struct ColumnBuffer {
  std::string name;
  unsigned oid = 0;
  ColumnRead read = ColumnRead::Other;
  bool kept = false;
  std::vector<double> numbers;        // Number and Boolean
  std::vector<std::string> strings;   // Text, trimmed; empty where missing
  std::vector<std::uint8_t> missing;  // Text: 1 where missing
  std::size_t missingCount = 0;
  std::optional<std::size_t> firstNotFinite;  // Number: record of a NaN or infinity
  std::string notFiniteText;
  std::string typeName;  // for messages about refused columns
};

// The text of a server or libpq message on one line.
std::string oneLine(std::string text) {
  while (!text.empty() && (text.back() == '\n' || text.back() == ' ')) text.pop_back();
  for (char& c : text) {
    if (c == '\n') c = ' ';
  }
  const std::string prefix = "ERROR:  ";
  if (text.rfind(prefix, 0) == 0) text.erase(0, prefix.size());
  return shownText(text, 400);
}

// Appends `bytes` as the fingerprint layout's value: 0x01, its length as 8 bytes little-endian,
// the bytes.
void appendValue(std::string& out, std::string_view bytes) {
  out.push_back('\x01');
  std::uint64_t length = bytes.size();
  for (int i = 0; i < 8; ++i) {
    out.push_back(static_cast<char>(length & 0xFF));
    length >>= 8;
  }
  out.append(bytes);
}

std::string quotedTable(pqxx::connection_base& connection, const std::string& table) {
  const std::size_t dot = table.find('.');
  if (dot == std::string::npos) return connection.quote_name(table);
  return connection.quote_name(table.substr(0, dot)) + "." +
         connection.quote_name(table.substr(dot + 1));
}

// The user's query without the trailing semicolons and spaces a cursor declaration cannot take.
std::string cursorBody(std::string query) {
  while (!query.empty() && (query.back() == ';' || query.back() == ' ' || query.back() == '\n' ||
                            query.back() == '\t' || query.back() == '\r')) {
    query.pop_back();
  }
  return query;
}

Column numberColumn(ColumnBuffer& buffer) {
  Column column;
  column.name = buffer.name;
  column.numbers = std::move(buffer.numbers);
  column.missingCount = buffer.missingCount;
  return column;
}

// A text column as CSV reads one: numbers when every non-missing value is one, otherwise levels
// in byte order.
Column textColumn(ColumnBuffer& buffer) {
  Column column;
  column.name = buffer.name;
  column.missingCount = buffer.missingCount;
  const std::size_t rows = buffer.strings.size();
  std::vector<double> numbers(rows, std::numeric_limits<double>::quiet_NaN());
  std::optional<std::size_t> firstText;
  for (std::size_t row = 0; row < rows && !firstText; ++row) {
    if (buffer.missing[row] != 0) continue;
    if (!csv::parseNumber(buffer.strings[row], numbers[row])) firstText = row;
  }
  if (!firstText) {
    column.numbers = std::move(numbers);
    buffer.strings.clear();
    return column;
  }
  column.kind = ColumnKind::Text;
  column.nonNumericNote = "holds text (database type " + buffer.typeName + "; record " +
                          std::to_string(*firstText + 1) + " is '" +
                          shownText(buffer.strings[*firstText], 60) + "')";
  std::set<std::string> distinct;
  for (std::size_t row = 0; row < rows; ++row) {
    if (buffer.missing[row] == 0) distinct.insert(buffer.strings[row]);
  }
  column.levels.assign(distinct.begin(), distinct.end());
  std::unordered_map<std::string, std::int32_t> levelOf;
  for (std::size_t level = 0; level < column.levels.size(); ++level) {
    levelOf.emplace(column.levels[level], static_cast<std::int32_t>(level));
  }
  column.codes.reserve(rows);
  for (std::size_t row = 0; row < rows; ++row) {
    column.codes.push_back(buffer.missing[row] != 0 ? -1 : levelOf.at(buffer.strings[row]));
  }
  buffer.strings.clear();
  return column;
}

struct ReadState {
  explicit ReadState(const DatabaseReadOptions& options) : missingTokens(options.missingTokens) {}
  csv::MissingTokens missingTokens;
  std::vector<double> missingNumbers;
  std::vector<ColumnBuffer> columns;
  std::size_t rows = 0;
  std::string hashBatch;
  std::string word;    // scratch: how a value that is not a finite number is named
  std::string source;  // the source's name, for messages
};

void takeValue(ReadState& state, ColumnBuffer& buffer, const pqxx::field& field,
               std::size_t record) {
  const bool isNull = field.is_null();
  const std::string_view text =
      isNull ? std::string_view() : std::string_view(field.c_str(), field.size());
  if (isNull) {
    state.hashBatch.push_back('\0');
  } else {
    appendValue(state.hashBatch, text);
  }
  if (!buffer.kept) return;
  switch (buffer.read) {
    case ColumnRead::Number:
    case ColumnRead::Boolean: {
      double value = std::numeric_limits<double>::quiet_NaN();
      bool missing = isNull;
      const postgres::Decoded decoded =
          isNull ? postgres::Decoded::Number
                 : postgres::decodeNumber(buffer.oid, text, value, state.word);
      if (decoded == postgres::Decoded::Malformed) {
        throw InputError(state.source + ", record " + std::to_string(record) + ", column '" +
                         shownText(buffer.name) +
                         "': the server sent a value that does not fit "
                         "its type's binary layout");
      }
      if (decoded == postgres::Decoded::NotFinite) {
        if (!buffer.firstNotFinite) {
          buffer.firstNotFinite = record;
          buffer.notFiniteText = state.word;
        }
        value = std::numeric_limits<double>::quiet_NaN();
      } else if (!isNull) {
        for (double token : state.missingNumbers) {
          if (value == token) {
            missing = true;
            value = std::numeric_limits<double>::quiet_NaN();
            break;
          }
        }
      }
      buffer.numbers.push_back(value);
      buffer.missingCount += missing ? 1 : 0;
      return;
    }
    case ColumnRead::Text: {
      std::string value = isNull ? std::string() : trimmedText(text);
      const bool missing = isNull || state.missingTokens.contains(value);
      buffer.strings.push_back(missing ? std::string() : std::move(value));
      buffer.missing.push_back(missing ? 1 : 0);
      buffer.missingCount += missing ? 1 : 0;
      return;
    }
    case ColumnRead::DateTime:
    case ColumnRead::Other:
      return;
  }
}

// Fetches the cursor's next batches on a thread of its own while the caller decodes the batch
// before: the server writes one batch while Calivera reads the last, so on two cores a read takes
// about the longer of the two instead of their sum. At most kAhead batches wait (memory stays
// bounded). While it runs, only its thread uses the transaction.
class BatchPrefetcher {
 public:
  static constexpr std::size_t kAhead = 2;

  BatchPrefetcher(pqxx::transaction_base& transaction, std::string fetch)
      : transaction_(transaction), fetch_(std::move(fetch)), thread_([this] { run(); }) {}
  ~BatchPrefetcher() { stop(); }
  BatchPrefetcher(const BatchPrefetcher&) = delete;
  BatchPrefetcher& operator=(const BatchPrefetcher&) = delete;

  // The next batch (empty at the end); rethrows what ended the fetching thread.
  pqxx::result next() {
    std::unique_lock lock(mutex_);
    changed_.wait(lock, [&] { return !ready_.empty() || finished_; });
    if (!ready_.empty()) {
      pqxx::result batch = std::move(ready_.front());
      ready_.pop_front();
      changed_.notify_all();
      return batch;
    }
    if (error_) std::rethrow_exception(error_);
    return pqxx::result();
  }

  // Waits for a fetch under way to return, then ends the thread; the transaction is the
  // caller's again.
  void stop() {
    {
      std::lock_guard lock(mutex_);
      stopping_ = true;
    }
    changed_.notify_all();
    if (thread_.joinable()) thread_.join();
  }

 private:
  void run() {
    try {
      for (;;) {
        {
          std::unique_lock lock(mutex_);
          changed_.wait(lock, [&] { return ready_.size() < kAhead || stopping_; });
          if (stopping_) break;
        }
        pqxx::result batch = transaction_.exec(fetch_);
        const bool last = batch.empty();
        {
          std::lock_guard lock(mutex_);
          ready_.push_back(std::move(batch));
        }
        changed_.notify_all();
        if (last) break;
      }
    } catch (...) {
      std::lock_guard lock(mutex_);
      error_ = std::current_exception();
    }
    {
      std::lock_guard lock(mutex_);
      finished_ = true;
    }
    changed_.notify_all();
  }

  pqxx::transaction_base& transaction_;
  const std::string fetch_;
  std::mutex mutex_;
  std::condition_variable changed_;
  std::deque<pqxx::result> ready_;
  std::exception_ptr error_;
  bool stopping_ = false;
  bool finished_ = false;
  std::thread thread_;  // last: starts after every other member is made
};

std::string serverOf(pqxx::connection_base& connection) {
  const char* host = connection.hostname();
  const char* port = connection.port();
  std::string server = host != nullptr && *host != '\0' ? host : "local socket";
  if (port != nullptr && *port != '\0') server += std::string(":") + port;
  return server;
}

std::string versionText(int version) {
  if (version <= 0) return "unknown";
  return std::to_string(version / 10000) + "." + std::to_string(version % 10000);
}

}  // namespace

std::string databaseSourceName(const std::string& uri, const DatabaseSelection& selection) {
  return uri + (selection.table.empty() ? " (query)"
                                        : " (table '" + shownText(selection.table, 80) + "')");
}

bool isDatabaseUri(std::string_view data) {
  return data.rfind("postgresql://", 0) == 0 || data.rfind("postgres://", 0) == 0;
}

void checkDatabaseUri(const std::string& uri, const std::string& label) {
  const std::string prefix = label.empty() ? std::string() : label + ": ";
  if (!isDatabaseUri(uri)) {
    throw InputError(prefix + "'" + shownText(uri, 80) +
                     "' is not a PostgreSQL URI (postgresql://HOST:PORT/DATABASE)");
  }
  if (uri.size() > kMaxUriBytes) {
    throw InputError(prefix + "the PostgreSQL URI is longer than " + std::to_string(kMaxUriBytes) +
                     " bytes");
  }
  if (uri.find('\0') != std::string::npos) {
    throw InputError(prefix + "the PostgreSQL URI holds a NUL byte");
  }
  const std::string refusal =
      ": Calivera never takes a password on the command line, in a study file or in a report; "
      "give it in the password file (~/.pgpass or PGPASSFILE) or a service file instead";
  const std::size_t start = uri.find("://") + 3;
  const std::size_t end = uri.find_first_of("/?", start);
  const std::string authority =
      uri.substr(start, end == std::string::npos ? std::string::npos : end - start);
  const std::size_t at = authority.rfind('@');
  if (at != std::string::npos && authority.substr(0, at).find(':') != std::string::npos) {
    throw InputError(prefix + "the PostgreSQL URI carries a password" + refusal);
  }
  const std::size_t question = uri.find('?');
  if (question != std::string::npos) {
    std::size_t begin = question + 1;
    while (begin <= uri.size()) {
      const std::size_t amp = std::min(uri.find('&', begin), uri.size());
      const std::string item = uri.substr(begin, amp - begin);
      const std::string key = item.substr(0, item.find('='));
      if (key == "password") {
        throw InputError(prefix + "the PostgreSQL URI carries a password (password=)" + refusal);
      }
      begin = amp + 1;
    }
  }
}

void checkDatabaseSelection(const DatabaseSelection& selection) {
  if (!selection.isValid()) {
    throw InputError(
        "a PostgreSQL source needs exactly one of --table NAME and --query 'SELECT ...'");
  }
  if (!selection.table.empty()) {
    const std::string& t = selection.table;
    if (t.size() > kMaxTableNameBytes || t.find('\0') != std::string::npos) {
      throw InputError("--table: not a table name Calivera sends (too long or a NUL byte)");
    }
    const std::size_t dot = t.find('.');
    if (dot == 0 || dot + 1 == t.size() ||
        (dot != std::string::npos && t.find('.', dot + 1) != std::string::npos)) {
      throw InputError("--table: '" + shownText(t, 80) +
                       "' is not NAME or SCHEMA.NAME (for other names use --query)");
    }
    return;
  }
  const std::string& q = selection.query;
  if (q.size() > kMaxQueryBytes) {
    throw InputError("--query: longer than " + std::to_string(kMaxQueryBytes) + " bytes");
  }
  if (q.find('\0') != std::string::npos) throw InputError("--query: holds a NUL byte");
  if (cursorBody(q).find_first_not_of(" \t\r\n") == std::string::npos) {
    throw InputError("--query: empty");
  }
}

DatabaseRead readDatabase(const std::string& uri, const DatabaseSelection& selection,
                          const DatabaseReadOptions& options) {
  checkDatabaseUri(uri);
  checkDatabaseSelection(selection);
  assert(options.isValid());
  const std::string source = databaseSourceName(uri, selection);
  DatabaseRead out;
  DatabaseProvenance& provenance = out.provenance;
  provenance.uri = uri;
  provenance.selection = selection;

  ReadState state(options);
  state.source = source;
  for (const std::string& token : options.missingTokens) {
    double number = 0;
    if (csv::parseNumber(trimmedText(token), number)) state.missingNumbers.push_back(number);
  }
  Sha256Stream fingerprint;
  fingerprint.add("calivera-result-v1\n");

  bool connected = false;
  std::vector<std::string> tableColumns;  // a table's every column, when only some are read
  try {
    pqxx::connection connection(uri);
    connected = true;
    provenance.server = serverOf(connection);
    provenance.database = connection.dbname() != nullptr ? connection.dbname() : "";
    provenance.user = connection.username() != nullptr ? connection.username() : "";
    provenance.serverVersion = versionText(connection.server_version());
    pqxx::transaction<pqxx::isolation_level::repeatable_read, pqxx::read_only> transaction(
        connection, "calivera_read");
    if (selection.table.empty()) {
      provenance.statement = cursorBody(selection.query);
    } else {
      // A table is read for the columns the analysis asks for only (issue 13: time and memory
      // follow them, not the table's width); a zero-row read names every column for messages.
      const std::string quoted = quotedTable(connection, selection.table);
      std::string list;
      if (!options.onlyColumns.empty()) {
        const pqxx::result shape = transaction.exec("SELECT * FROM " + quoted + " LIMIT 0");
        for (pqxx::row::size_type c = 0; c < shape.columns(); ++c) {
          const std::string name = shape.column_name(c);
          tableColumns.push_back(name);
          const auto& only = options.onlyColumns;
          if (std::find(only.begin(), only.end(), name) == only.end()) continue;
          list += (list.empty() ? "" : ", ") + connection.quote_name(name);
        }
      }
      provenance.statement =
          "SELECT " + (list.empty() ? std::string("*") : list) + " FROM " + quoted;
    }
    // One statement through the extended query protocol: a second statement is an error.
    // Binary: the server sends numbers as their bytes instead of writing them as text, half its
    // work (core/data/postgres_binary.h decodes them to the doubles the text would give).
    transaction.exec_params(std::string("DECLARE ") + kCursorName +
                            " BINARY NO SCROLL CURSOR FOR " + provenance.statement);
    const std::string fetch =
        "FETCH FORWARD " + std::to_string(options.fetchRows) + " FROM " + kCursorName;
    // The first batch on this thread: it names the columns, and their type names are asked for
    // before another thread fetches.
    pqxx::result batch = transaction.exec(fetch);
    {
      std::set<std::string> names;
      for (pqxx::row::size_type c = 0; c < batch.columns(); ++c) {
        ColumnBuffer buffer;
        buffer.name = batch.column_name(c);
        buffer.oid = batch.column_type(c);
        buffer.read = readOfType(buffer.oid);
        if (!names.insert(buffer.name).second) {
          throw InputError(source + ": two columns of the result are named '" +
                           shownText(buffer.name) + "' (name them apart with AS)");
        }
        const auto& only = options.onlyColumns;
        buffer.kept =
            only.empty() || std::find(only.begin(), only.end(), buffer.name) != only.end();
        fingerprint.add(buffer.name);
        fingerprint.add(std::string(1, '\0') + std::to_string(buffer.oid) + "\n");
        state.columns.push_back(std::move(buffer));
      }
      if (state.columns.empty()) throw InputError(source + ": the result has no columns");
      for (ColumnBuffer& buffer : state.columns) {
        if (buffer.read == ColumnRead::Number || buffer.read == ColumnRead::Boolean) continue;
        buffer.typeName = transaction
                              .exec_params("SELECT format_type($1::oid, NULL)",
                                           static_cast<long long>(buffer.oid))[0][0]
                              .as<std::string>();
      }
    }
    std::optional<BatchPrefetcher> ahead;
    while (!batch.empty()) {
      if (!ahead) ahead.emplace(transaction, fetch);
      for (const pqxx::row& row : batch) {
        if (state.rows >= kMaxDatabaseRows) {
          throw InputError(source + ": more rows than Calivera analyses (" +
                           std::to_string(kMaxDatabaseRows) + ")");
        }
        ++state.rows;
        for (std::size_t c = 0; c < state.columns.size(); ++c) {
          takeValue(state, state.columns[c], row[static_cast<pqxx::row::size_type>(c)], state.rows);
        }
        if (options.rowLimit > 0 && state.rows >= options.rowLimit) break;
      }
      fingerprint.add(state.hashBatch);
      state.hashBatch.clear();
      reportProgress(options.progress, 0.0);
      if (options.rowLimit > 0 && state.rows >= options.rowLimit) break;
      batch = ahead->next();
    }
    if (ahead) ahead->stop();
    transaction.commit();
  } catch (const pqxx::broken_connection& e) {
    if (!connected) {
      throw InputError(source + ": cannot connect to the server (" + oneLine(e.what()) + ")");
    }
    throw InputError(source + ": the connection to the server was lost while reading the rows (" +
                     oneLine(e.what()) + ")");
  } catch (const pqxx::sql_error& e) {
    throw InputError(source + ": the server refused the query (" + oneLine(e.what()) + ")");
  } catch (const pqxx::failure& e) {
    throw InputError(source + ": " + oneLine(e.what()));
  }
  if (state.rows == 0) throw InputError(source + ": the result has no rows");
  provenance.rows = state.rows;
  provenance.resultSha256 = fingerprint.hex();

  Table& table = out.table;
  table.sourceName = source;
  table.rowsAreRecords = true;
  table.rowCount = state.rows;
  if (!tableColumns.empty()) {
    table.headerNames = tableColumns;
  } else if (!options.onlyColumns.empty()) {
    for (const ColumnBuffer& buffer : state.columns) table.headerNames.push_back(buffer.name);
  }
  for (ColumnBuffer& buffer : state.columns) {
    if (!buffer.kept) continue;
    switch (buffer.read) {
      case ColumnRead::Number:
      case ColumnRead::Boolean:
        if (buffer.firstNotFinite) {
          table.refusedColumns.push_back(
              {buffer.name, "it holds " + buffer.notFiniteText + " (record " +
                                std::to_string(*buffer.firstNotFinite) + "), not a finite number"});
        } else {
          table.columns.push_back(numberColumn(buffer));
        }
        break;
      case ColumnRead::Text:
        table.columns.push_back(textColumn(buffer));
        break;
      case ColumnRead::DateTime:
        table.refusedColumns.push_back({buffer.name, "it holds dates or times (database type " +
                                                         buffer.typeName + "), not numbers"});
        break;
      case ColumnRead::Other:
        table.refusedColumns.push_back(
            {buffer.name, "its database type (" + buffer.typeName + ") is not one Calivera reads"});
        break;
    }
  }
  table.database = std::make_shared<const DatabaseProvenance>(provenance);
  return out;
}

std::string databaseLibraryVersion() {
  return std::string("libpqxx ") + PQXX_VERSION;
}

}  // namespace calivera
