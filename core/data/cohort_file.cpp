#include "core/data/cohort_file.h"

#include "core/data/database_source.h"
#include "core/data/package_file_reader.h"
#include "core/util/errors.h"

namespace calivera {

std::string cohortFileFormat(const std::string& path) {
  if (isDatabaseUri(path)) return "PostgreSQL";
  PackageFormat format{};
  return packageFormatOf(path, format) ? packageFormatName(format) : std::string("CSV");
}

CohortFileRead readCohortFile(const std::string& path, const CsvOptions& options) {
  CohortFileRead read;
  PackageFormat format{};
  if (packageFormatOf(path, format)) {
    read.format = packageFormatName(format);
    read.isCsv = false;
    if (options.delimiter != 0) {
      throw InputError(path + ": a " + read.format +
                       " file has no delimiter; leave the delimiter out (it applies to CSV)");
    }
    PackageReadOptions packageOptions;
    packageOptions.missingTokens = options.missingTokens;
    packageOptions.onlyColumns = options.onlyColumns;
    read.table = readPackageFile(path, format, packageOptions);
    return read;
  }
  CsvReadResult csv = readCsvFile(path, options);
  read.table = std::move(csv.table);
  read.delimiter = csv.delimiter;
  read.delimiterDetected = csv.delimiterDetected;
  read.hadByteOrderMark = csv.hadByteOrderMark;
  return read;
}

}  // namespace calivera
