#pragma once
// Cohorts saved by statistical packages (SAS .sas7bdat, Stata .dta, SPSS .sav and .zsav), read
// through ReadStat (Debian libreadstat-dev; github.com/WizardMac/ReadStat, MIT) into the same
// columnar Table as a CSV file, so every analysis treats both alike.
//
// Decisions (tested in tests/unit/package_file_reader_test.cpp and
// tests/reference/package_files_test.cpp):
// - Numeric variables are read as numbers. System missing (SAS '.', Stata '.'), tagged missing
//   (Stata .a-.z, SAS .A-.Z and ._) and SPSS user-defined missing values and ranges are missing,
//   counted per column in Column::missingCount as CSV's missing fields are.
// - Value labels become category levels when every non-missing value of the variable has one:
//   the column is then Text, its levels the labels in byte order (as CSV's) and
//   Column::levelCodes keeps each level's stored code for display ("white" = 1). A variable
//   whose labels cover only some values (a scale with labelled ends, labels on missing codes)
//   stays numeric. Two codes with the same label would merge categories silently, so such a
//   column is refused (Table::refusedColumns) with a message naming both codes.
// - SAS keeps value labels in a separate catalog (.sas7bcat) that is not read: SAS variables are
//   numbers or strings.
// - String variables are Text columns, their values trimmed of surrounding spaces; a value equal
//   to a missing token (by default '' and 'NA') is missing, as in CSV. A numeric missing token
//   (for example '-99') makes that number missing in numeric variables too.
// - Dates, times and date-times (by the variable's display format) are not numbers an analysis
//   may use: the column is refused, named in the message of any analysis that asks for it.
//   So is a numeric variable holding an infinite value.
// - Messages name rows as "record N" (the 1-based observation number), not lines.
// - A file that ReadStat cannot parse is an InputError naming the file, the format and ReadStat's
//   reason. Rows are bounded by the 32-bit row indices of the analyses (kMaxPackageFileRows).

#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

#include "core/data/csv_reader.h"
#include "core/data/table.h"

namespace calivera {

enum class PackageFormat { Sas7bdat, Stata, Spss };

inline constexpr std::size_t kMaxPackageFileRows = 0xFFFFFFFEu;

// The statistical-package format of a path by its extension (case-insensitive): .sas7bdat,
// .dta, .sav or .zsav; nullptr-like false when the path is none of these (then it is read as
// CSV).
bool packageFormatOf(std::string_view path, PackageFormat& format);

// "SAS", "Stata" or "SPSS", for messages and reports.
std::string packageFormatName(PackageFormat format);

struct PackageReadOptions {
  // As CsvOptions::missingTokens: string values equal to one of these (after trimming) are
  // missing; a token that is a number makes that number missing in numeric variables.
  std::vector<std::string> missingTokens{"", "NA"};
  // As CsvOptions::onlyColumns: empty reads every variable; otherwise only these, and
  // Table::headerNames keeps every variable's name for messages.
  std::vector<std::string> onlyColumns;
  // 0: every record; otherwise at most this many (the import dialog's preview).
  std::size_t rowLimit = 0;
};

// Throws InputError naming the file for an unreadable or malformed file.
Table readPackageFile(const std::string& path, PackageFormat format,
                      const PackageReadOptions& options);

}  // namespace calivera
