#include "core/data/cohort_source.h"

#include <future>

#include "core/data/cohort_file.h"
#include "core/util/errors.h"
#include "core/util/sha256.h"
#include "core/util/stage_times.h"

namespace calivera {

void checkCohortSource(const std::string& data, const std::optional<DatabaseSelection>& database) {
  if (isDatabaseUri(data)) {
    if (!database) {
      throw InputError("--data: a PostgreSQL source needs --table NAME or --query 'SELECT ...'");
    }
    checkDatabaseUri(data);
    checkDatabaseSelection(*database);
  } else if (database) {
    throw InputError(std::string(database->table.empty() ? "--query" : "--table") +
                     ": needs --data postgresql://HOST:PORT/DATABASE (a file has no tables)");
  }
}

CohortRead readCohort(const std::string& data, const std::optional<DatabaseSelection>& database,
                      const CsvOptions& csv, const ProgressCallback& progress) {
  checkCohortSource(data, database);
  CohortRead read;
  if (database) {
    if (csv.delimiter != 0) {
      throw InputError(data +
                       ": a database has no delimiter; leave the delimiter out (it applies "
                       "to CSV)");
    }
    DatabaseReadOptions options;
    options.missingTokens = csv.missingTokens;
    options.onlyColumns = csv.onlyColumns;
    options.progress = progress;
    DatabaseRead rows = readDatabase(data, *database, options);
    markStage("cohort fetched from the database");
    read.table = std::move(rows.table);
    read.sha256 = rows.provenance.resultSha256;  // the table carries the whole provenance
    return read;
  }
  std::future<std::string> hash = sha256OfFileInBackground(data);
  read.table = readCohortFile(data, csv).table;
  markStage("cohort parsed");
  read.sha256 = hash.get();
  markStage("cohort hashed");
  return read;
}

}  // namespace calivera
