#pragma once
// What a PostgreSQL source is (a table or a query) and where a table's rows came from, as plain
// values: the reader (core/data/database_source.h) fills them, a Table read from a database
// carries its provenance, and the reports record it.

#include <cstddef>
#include <string>

namespace calivera {

// What to read from the database: exactly one of a table (NAME or SCHEMA.NAME) and a query.
struct DatabaseSelection {
  std::string table;
  std::string query;

  bool isValid() const { return table.empty() != query.empty(); }
  friend bool operator==(const DatabaseSelection&, const DatabaseSelection&) = default;
};

// Where the rows came from, as the reports record it (never a password).
struct DatabaseProvenance {
  std::string uri;            // as given, password-free
  std::string server;         // "HOST:PORT", or the socket directory and port
  std::string database;       // the database connected to
  std::string user;           // the role connected as
  std::string serverVersion;  // e.g. "15.18"
  DatabaseSelection selection;
  std::string statement;  // the SELECT the cursor ran
  std::size_t rows = 0;
  std::string resultSha256;  // the result fingerprint (above)
};

}  // namespace calivera
