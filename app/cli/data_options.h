#pragma once
// Cohort-file options shared by the commands that read a cohort:
//   --delimiter C     ',' ';' or 'tab' (also '\t' or a literal tab); default: detected
//   --missing TOKEN   one more field value that means missing (repeatable; the empty field and
//                     NA always do), as for `calivera fit`
//   --event-value V   the outcome value that means event (default: the column holds 0/1)

#include <optional>
#include <string>

#include "app/cli/arguments.h"
#include "core/data/csv_reader.h"

namespace calivera::cli {

void addDataOptions(OptionSpec& spec);
CsvOptions csvOptionsFrom(const Arguments& arguments);
std::optional<std::string> eventValueFrom(const Arguments& arguments);

inline constexpr const char* kDataOptionsHelp =
    "  --delimiter C        field delimiter: ',' ';' or 'tab' (default: detected from the header)\n"
    "  --missing TOKEN      one more value meaning missing (repeatable; empty and NA always)\n"
    "  --event-value V      outcome value meaning event (default: outcome column holds 0/1)\n";

}  // namespace calivera::cli
