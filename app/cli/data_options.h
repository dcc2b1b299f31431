#pragma once
// Cohort-file options shared by the commands that read a cohort:
//   --delimiter C     ',' ';' or 'tab' (also '\t' or a literal tab); default: detected
//   --missing TOKEN   one more field value that means missing (repeatable; the empty field and
//                     NA always do), as for `calivera fit`
//   --event-value V   the outcome value that means event (default: the column holds 0/1)
//   --table NAME      with --data postgresql://...: read this table or view (NAME or SCHEMA.NAME)
//   --query 'SELECT'  with --data postgresql://...: read the rows of this query

#include <optional>
#include <string>

#include "app/cli/arguments.h"
#include "core/data/csv_reader.h"
#include "core/data/database_source.h"

namespace calivera::cli {

void addDataOptions(OptionSpec& spec);
CsvOptions csvOptionsFrom(const Arguments& arguments);
std::optional<std::string> eventValueFrom(const Arguments& arguments);
// The table or query of a PostgreSQL source; empty when neither option is given. Checks that the
// source and --data go together (core/data/cohort_source.h).
std::optional<DatabaseSelection> databaseSelectionFrom(const Arguments& arguments);

inline constexpr const char* kDataOptionsHelp =
    "  --delimiter C        field delimiter: ',' ';' or 'tab' (default: detected from the header)\n"
    "  --missing TOKEN      one more value meaning missing (repeatable; empty and NA always)\n"
    "  --event-value V      outcome value meaning event (default: outcome column holds 0/1)\n"
    "  --table NAME         with --data postgresql://HOST:PORT/DB: read this table (or view)\n"
    "  --query 'SELECT ..'  with --data postgresql://HOST:PORT/DB: read this query's rows\n"
    "                       (passwords only from ~/.pgpass, PGPASSFILE or a service file)\n";

}  // namespace calivera::cli
