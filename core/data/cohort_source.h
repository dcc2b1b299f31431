#pragma once
// Where a cohort comes from, whatever it is: a file (CSV or a statistical-package file,
// core/data/cohort_file.h) or a PostgreSQL table or query (core/data/database_source.h). Every
// command reads its cohort here, so a table in the database and the same rows as CSV give the
// same Table, and the run records the file's SHA-256 or the result's fingerprint alike.

#include <optional>
#include <string>

#include "core/data/csv_reader.h"
#include "core/data/database_source.h"
#include "core/data/table.h"
#include "core/util/progress.h"

namespace calivera {

struct CohortRead {
  Table table;
  // The file's SHA-256, or the database result's fingerprint (DatabaseProvenance::resultSha256).
  std::string sha256;
};

// Throws InputError when `data` and `database` do not go together: a PostgreSQL URI needs a
// table or a query, and a table or a query needs a PostgreSQL URI.
void checkCohortSource(const std::string& data, const std::optional<DatabaseSelection>& database);

// Reads the cohort. For a file, `progress` is not polled (files are read at once) and the SHA-256
// is computed while the file is parsed; for a database it is polled after every batch. The CSV
// options' missing tokens and column selection apply to every source, the delimiter to CSV only.
CohortRead readCohort(const std::string& data, const std::optional<DatabaseSelection>& database,
                      const CsvOptions& csv, const ProgressCallback& progress = {});

}  // namespace calivera
