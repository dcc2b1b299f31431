#pragma once
// Cohorts that live in a PostgreSQL database (issue 16, row mode): `--data 'postgresql://...'`
// with `--table NAME` or `--query 'SELECT ...'`, read through libpqxx (Debian libpqxx-dev) into
// the same columnar Table as a file, so every analysis treats them alike.
//
// Decisions (tested in tests/database/, against a real PostgreSQL 15 server):
// - Connection settings and passwords come from libpq's own environment (PGHOST, PGUSER,
//   PGSERVICE, ...), service file and password file. A URI that carries a password (user:secret@
//   or password=) is refused before any connection is made, so no password reaches a command
//   line, a study file or a report.
// - Everything runs in one read-only, repeatable-read transaction. `--table` names a table or
//   view as NAME or SCHEMA.NAME; each part is quoted as an identifier, and only the columns the
//   analysis reads are selected (by name, quoted, in the table's order). `--query` is one SELECT
//   statement, run as it is as the body of a server-side cursor through the extended query
//   protocol, which refuses a second statement.
// - Rows are fetched in batches of kDatabaseFetchRows from the cursor, so the connection never
//   holds the whole result at once. Rows are named "record N", N the 1-based row of the result,
//   in the order the server sends them (a table read without ORDER BY comes in the server's
//   storage order; the result fingerprint covers that order).
// - Rows come through a BINARY cursor: numbers are decoded from their bytes to the doubles their
//   text would read as (core/data/postgres_binary.h).
// - Column types, by the result's type OIDs: smallint, integer, bigint, real, double precision
//   and numeric are numbers; boolean is 1 (true) / 0 (false); text, varchar, char and name are
//   read as CSV fields are (trimmed, missing tokens, numbers where every value is one, otherwise
//   category levels in byte order). SQL NULL is missing, counted per column; a numeric missing
//   token (--missing -99) makes that number missing in number columns too. Dates, times,
//   intervals, NaN, infinities and every other type are refused with the reason, named in the
//   message of any analysis that asks for the column.
// - The result fingerprint (`resultSha256`, where a file has its SHA-256) is the SHA-256 of the
//   result as received (the statement recorded says which columns): for each column its name
//   and type OID, then for each row and column a NULL marker or the value's bytes as the server
//   sent them in its binary format, with their length (the exact layout is in docs/methods.md). The
//   same columns and rows in the same order give the same fingerprint on any server; `fit` and
//   `validate` of one model on one table read the same columns, so the model's development record
//   matches.

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/data/database_provenance.h"
#include "core/data/table.h"
#include "core/util/progress.h"

namespace calivera {

// Rows fetched from the cursor per round trip.
inline constexpr std::size_t kDatabaseFetchRows = 20000;
// Rows are bounded by the analyses' 32-bit row indices, as for files.
inline constexpr std::size_t kMaxDatabaseRows = 0xFFFFFFFEu;
// A query's text is bounded so that it fits in reports and study files.
inline constexpr std::size_t kMaxQueryBytes = 64 * 1024;

// True when `data` names a PostgreSQL database (postgresql:// or postgres://) rather than a file.
bool isDatabaseUri(std::string_view data);

// The name messages give the source: "URI (table 'T')" or "URI (query)"; Table::sourceName.
std::string databaseSourceName(const std::string& uri, const DatabaseSelection& selection);

// Throws InputError when the URI carries a password, or is longer than a URI may be; says how
// to give the password instead.
// `label` starts each message ("--data"; empty for none).
void checkDatabaseUri(const std::string& uri, const std::string& label = "--data");

// Throws InputError unless the selection is valid and its table name or query is one Calivera
// sends (not empty, bounded, no NUL byte; a table name of one or two non-empty parts).
void checkDatabaseSelection(const DatabaseSelection& selection);

// One sentence for reports: what the result fingerprint is a digest of.
inline constexpr const char* kDatabaseFingerprintRule =
    "SHA-256 of the result as received: every column's name and type, then every value's "
    "bytes in PostgreSQL's binary format (or NULL) row by row, in the order the server sent the "
    "rows";

struct DatabaseReadOptions {
  // As CsvOptions::missingTokens.
  std::vector<std::string> missingTokens{"", "NA"};
  // As CsvOptions::onlyColumns: empty keeps every column; otherwise only these are stored (every
  // column is still fingerprinted) and Table::headerNames keeps every name.
  std::vector<std::string> onlyColumns;
  // 0: every row; otherwise at most this many (a preview). The fingerprint is then of those rows.
  std::size_t rowLimit = 0;
  // Polled after every batch (the fraction is unknown, so it reports 0); false cancels.
  ProgressCallback progress;
  // Rows per round trip (tests use a few to cross many batches).
  std::size_t fetchRows = kDatabaseFetchRows;

  bool isValid() const { return fetchRows >= 1 && fetchRows <= 1000000; }
};

struct DatabaseRead {
  Table table;
  DatabaseProvenance provenance;
};

// Connects, reads the selection and disconnects. Throws InputError naming the source for a
// refused URI, a failed connection (libpq's reason), an SQL error (the server's message), a
// lost connection, too many rows or duplicate column names; Cancelled when progress says so.
DatabaseRead readDatabase(const std::string& uri, const DatabaseSelection& selection,
                          const DatabaseReadOptions& options);

// The libpqxx version this build uses, for About and reports.
std::string databaseLibraryVersion();

}  // namespace calivera
