#pragma once
// One entry point for reading a cohort file, whatever its format: statistical-package files
// (.sas7bdat, .dta, .sav, .zsav, by extension; core/data/package_file_reader.h) and CSV (every
// other name; core/data/csv_reader.h). Every command and the workstation read cohorts here, so
// a Stata file and the same data as CSV give the same Table.

#include <string>

#include "core/data/csv_reader.h"
#include "core/data/table.h"

namespace calivera {

struct CohortFileRead {
  Table table;
  std::string format = "CSV";  // "CSV", "SAS", "Stata" or "SPSS"
  bool isCsv = true;
  char delimiter = 0;  // CSV only
  bool delimiterDetected = false;
  bool hadByteOrderMark = false;
};

// The format name of a cohort path, by its extension ("CSV" for any other); "PostgreSQL" for a
// database URI.
std::string cohortFileFormat(const std::string& path);

// Reads the file by its format. For statistical-package files the CSV options' missing tokens
// and column selection apply; a delimiter is an InputError (such files have none).
CohortFileRead readCohortFile(const std::string& path, const CsvOptions& options);

}  // namespace calivera
