#include "app/cli/data_options.h"

#include "core/data/cohort_source.h"
#include "core/util/errors.h"

namespace calivera::cli {

void addDataOptions(OptionSpec& spec) {
  spec.valued.insert({"--delimiter", "--missing", "--event-value", "--table", "--query"});
}

CsvOptions csvOptionsFrom(const Arguments& arguments) {
  CsvOptions options;
  if (const auto d = arguments.value("--delimiter")) {
    if (*d == "," || *d == ";") {
      options.delimiter = (*d)[0];
    } else if (*d == "tab" || *d == "\\t" || *d == "\t") {
      options.delimiter = '\t';
    } else {
      throw InputError("--delimiter: '" + *d + "' is not one of ',' ';' 'tab'");
    }
  }
  // As for fit: each --missing adds a token; the empty field and NA always stay missing.
  for (const std::string& token : arguments.values("--missing")) {
    options.missingTokens.push_back(token);
  }
  return options;
}

std::optional<DatabaseSelection> databaseSelectionFrom(const Arguments& arguments) {
  std::optional<DatabaseSelection> selection;
  const auto table = arguments.value("--table");
  const auto query = arguments.value("--query");
  if (table || query) {
    if (table && query) throw InputError("--table, --query: give one of them, not both");
    selection = DatabaseSelection{table.value_or(""), query.value_or("")};
  }
  checkCohortSource(arguments.required("--data"), selection);
  return selection;
}

std::optional<std::string> eventValueFrom(const Arguments& arguments) {
  return arguments.value("--event-value");
}

}  // namespace calivera::cli
