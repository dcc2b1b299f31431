#include "core/data/package_file_reader.h"

#include <readstat.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <limits>
#include <map>
#include <memory>
#include <optional>
#include <set>
#include <unordered_map>

#include "core/data/csv_field.h"
#include "core/util/errors.h"
#include "core/util/number_format.h"
#include "core/util/shown_text.h"

namespace calivera {
namespace {

std::string lowerExtension(std::string_view path) {
  const std::size_t slash = path.find_last_of("/\\");
  const std::size_t dot = path.find_last_of('.');
  if (dot == std::string_view::npos || (slash != std::string_view::npos && dot < slash)) return {};
  std::string extension(path.substr(dot + 1));
  for (char& c : extension) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return extension;
}

// Display formats that make a number a date, a time or a date-time. Stata: every %t and the old
// %d formats. SPSS and SAS: the format's name without width and decimals (ReadStat writes SPSS
// formats as their names, for example "DATE11" or "ADATE10").
bool isDateFormat(const std::string& format) {
  if (format.empty()) return false;
  if (format[0] == '%') {
    const std::size_t at = format.size() > 1 && format[1] == '-' ? 2 : 1;
    return at < format.size() && (format[at] == 't' || format[at] == 'd');
  }
  std::string upper;
  for (char c : format) upper += static_cast<char>(std::toupper(static_cast<unsigned char>(c)));
  if (upper.find("8601") != std::string::npos) return true;  // E8601DA, B8601DT, IS8601...
  std::string name;                                          // the letters before the width
  for (char c : upper) {
    if (!std::isalpha(static_cast<unsigned char>(c))) break;
    name += c;
  }
  static const char* const kDateWords[] = {
      "DATE", "TIME",  "MMDDYY", "DDMMYY", "YYMMDD", "YYQ",    "MONYY",  "MONTH",
      "WEEK", "WKDAY", "WKYR",   "MOYR",   "QYR",    "JULIAN", "JULDAY", "HHMM",
      "HOUR", "TOD",   "DTIME",  "QTR",    "MMYY",   "YYMM",   "NENGO",  "DOWNAME"};
  for (const char* word : kDateWords) {
    if (name.find(word) != std::string::npos) return true;
  }
  return name == "YEAR" || name == "DAY" || name == "MDY";
}

std::string trimmed(const char* text) {
  std::string_view view = text != nullptr ? std::string_view(text) : std::string_view();
  while (!view.empty() && (view.front() == ' ' || view.front() == '\t')) view.remove_prefix(1);
  while (!view.empty() && (view.back() == ' ' || view.back() == '\t')) view.remove_suffix(1);
  return std::string(view);
}

// One variable as read, before value labels (which a Stata file stores after the data) apply.
struct VariableBuffer {
  std::string name;
  std::string labelSet;
  std::string format;
  bool isString = false;
  std::vector<double> numbers;              // numeric variables, NaN where missing
  std::vector<std::string> strings;         // string variables, the trimmed value
  std::vector<std::uint8_t> stringMissing;  // string variables, 1 where missing
  std::size_t missingCount = 0;
  std::optional<std::size_t> firstInfiniteRecord;
};

struct ReadContext {
  const PackageReadOptions* options = nullptr;
  std::set<std::string> missingStrings;
  std::vector<double> missingNumbers;
  std::vector<std::string> allNames;
  std::vector<VariableBuffer> variables;  // the variables kept, by index after skipping
  std::map<std::string, std::map<double, std::string>> labelSets;
  std::size_t records = 0;
  long long declaredRecords = -1;  // the file's own count, -1 when it states none
  std::string failure;             // set by a handler that aborts the parse
};

int onMetadata(readstat_metadata_t* metadata, void* raw) {
  static_cast<ReadContext*>(raw)->declaredRecords = readstat_get_row_count(metadata);
  return READSTAT_HANDLER_OK;
}

int onVariable(int /*index*/, readstat_variable_t* variable, const char* labelSet, void* raw) {
  auto& context = *static_cast<ReadContext*>(raw);
  const char* rawName = readstat_variable_get_name(variable);
  const std::string name = rawName != nullptr ? rawName : "";
  context.allNames.push_back(name);
  const auto& only = context.options->onlyColumns;
  if (!only.empty() && std::find(only.begin(), only.end(), name) == only.end()) {
    return READSTAT_HANDLER_SKIP_VARIABLE;
  }
  VariableBuffer buffer;
  buffer.name = name;
  buffer.labelSet = labelSet != nullptr ? labelSet : "";
  const char* format = readstat_variable_get_format(variable);
  buffer.format = format != nullptr ? format : "";
  buffer.isString = readstat_variable_get_type_class(variable) == READSTAT_TYPE_CLASS_STRING;
  context.variables.push_back(std::move(buffer));
  return READSTAT_HANDLER_OK;
}

int onValue(int record, readstat_variable_t* variable, readstat_value_t value, void* raw) {
  auto& context = *static_cast<ReadContext*>(raw);
  const int index = readstat_variable_get_index_after_skipping(variable);
  if (index < 0 || static_cast<std::size_t>(index) >= context.variables.size() || record < 0) {
    context.failure = "a value outside the file's declared variables";
    return READSTAT_HANDLER_ABORT;
  }
  if (static_cast<std::size_t>(record) >= kMaxPackageFileRows) {
    context.failure =
        "more records than Calivera analyses (" + std::to_string(kMaxPackageFileRows) + ")";
    return READSTAT_HANDLER_ABORT;
  }
  VariableBuffer& buffer = context.variables[static_cast<std::size_t>(index)];
  const std::size_t have = buffer.isString ? buffer.strings.size() : buffer.numbers.size();
  if (static_cast<std::size_t>(record) != have) {
    context.failure = "record " + std::to_string(record + 1) + " of variable '" +
                      shownText(buffer.name) + "' out of order";
    return READSTAT_HANDLER_ABORT;
  }
  context.records = std::max(context.records, static_cast<std::size_t>(record) + 1);
  if (buffer.isString) {
    std::string text = trimmed(readstat_string_value(value));
    const bool missing =
        readstat_value_is_missing(value, variable) != 0 || context.missingStrings.count(text) > 0;
    buffer.strings.push_back(missing ? std::string() : std::move(text));
    buffer.stringMissing.push_back(missing ? 1 : 0);
    buffer.missingCount += missing ? 1 : 0;
    return READSTAT_HANDLER_OK;
  }
  double number = std::numeric_limits<double>::quiet_NaN();
  bool missing = readstat_value_is_missing(value, variable) != 0;
  if (!missing) {
    number = readstat_double_value(value);
    if (std::isnan(number)) {
      missing = true;
    } else if (std::find(context.missingNumbers.begin(), context.missingNumbers.end(), number) !=
               context.missingNumbers.end()) {
      missing = true;
      number = std::numeric_limits<double>::quiet_NaN();
    } else if (std::isinf(number) && !buffer.firstInfiniteRecord) {
      buffer.firstInfiniteRecord = static_cast<std::size_t>(record) + 1;
    }
  }
  buffer.numbers.push_back(number);
  buffer.missingCount += missing ? 1 : 0;
  return READSTAT_HANDLER_OK;
}

int onValueLabel(const char* labelSet, readstat_value_t value, const char* label, void* raw) {
  auto& context = *static_cast<ReadContext*>(raw);
  // Labels of string values and of tagged missing values never name a category of a number.
  if (labelSet == nullptr || readstat_value_type_class(value) != READSTAT_TYPE_CLASS_NUMERIC ||
      readstat_value_is_tagged_missing(value) || readstat_value_is_system_missing(value)) {
    return READSTAT_HANDLER_OK;
  }
  context.labelSets[labelSet][readstat_double_value(value)] = trimmed(label);
  return READSTAT_HANDLER_OK;
}

struct ParserDeleter {
  void operator()(readstat_parser_t* parser) const { readstat_parser_free(parser); }
};

// A numeric variable whose every non-missing value has a label, as a Text column of labels.
// Returns false (and leaves `column` alone) when some value has none; sets `refusal` when two
// codes share a label.
bool labelledColumn(const VariableBuffer& buffer, const std::map<double, std::string>& labels,
                    Column& column, std::string& refusal) {
  std::map<double, const std::string*> used;
  for (double value : buffer.numbers) {
    if (std::isnan(value) || used.count(value) > 0) continue;
    const auto found = labels.find(value);
    if (found == labels.end()) return false;
    used.emplace(value, &found->second);
  }
  if (used.empty()) return false;  // no values: nothing to name
  std::map<std::string, double> codeOfLabel;
  for (const auto& [code, label] : used) {
    const auto [at, inserted] = codeOfLabel.emplace(*label, code);
    if (!inserted) {
      refusal = "its value label '" + shownText(*label) + "' names two codes (" +
                formatShortest(at->second) + " and " + formatShortest(code) +
                "), and reading both as one category would merge them";
      return true;
    }
  }
  column.kind = ColumnKind::Text;
  for (const auto& [label, code] : codeOfLabel) {  // byte order of the labels, as CSV's levels
    column.levels.push_back(label);
    column.levelCodes.push_back(formatShortest(code));
  }
  std::map<double, std::int32_t> levelOfCode;
  for (std::size_t level = 0; level < column.levels.size(); ++level) {
    levelOfCode.emplace(codeOfLabel.at(column.levels[level]), static_cast<std::int32_t>(level));
  }
  column.codes.reserve(buffer.numbers.size());
  for (double value : buffer.numbers) {
    column.codes.push_back(std::isnan(value) ? -1 : levelOfCode.at(value));
  }
  column.nonNumericNote = "holds categories named by value labels";
  return true;
}

Column stringColumn(VariableBuffer& buffer, const std::string& formatName) {
  Column column;
  column.name = buffer.name;
  column.kind = ColumnKind::Text;
  std::set<std::string> distinct;
  for (std::size_t row = 0; row < buffer.strings.size(); ++row) {
    if (buffer.stringMissing[row] == 0) distinct.insert(buffer.strings[row]);
  }
  column.levels.assign(distinct.begin(), distinct.end());
  std::unordered_map<std::string, std::int32_t> levelOf;
  for (std::size_t level = 0; level < column.levels.size(); ++level) {
    levelOf.emplace(column.levels[level], static_cast<std::int32_t>(level));
  }
  column.codes.reserve(buffer.strings.size());
  for (std::size_t row = 0; row < buffer.strings.size(); ++row) {
    column.codes.push_back(buffer.stringMissing[row] != 0 ? -1 : levelOf.at(buffer.strings[row]));
  }
  column.missingCount = buffer.missingCount;
  column.nonNumericNote = "is a string variable in the " + formatName + " file";
  buffer.strings.clear();
  return column;
}

readstat_error_t parse(PackageFormat format, readstat_parser_t* parser, const char* path,
                       void* context) {
  switch (format) {
    case PackageFormat::Sas7bdat:
      return readstat_parse_sas7bdat(parser, path, context);
    case PackageFormat::Stata:
      return readstat_parse_dta(parser, path, context);
    case PackageFormat::Spss:
      return readstat_parse_sav(parser, path, context);
  }
  return READSTAT_ERROR_PARSE;
}

}  // namespace

bool packageFormatOf(std::string_view path, PackageFormat& format) {
  const std::string extension = lowerExtension(path);
  if (extension == "sas7bdat") {
    format = PackageFormat::Sas7bdat;
  } else if (extension == "dta") {
    format = PackageFormat::Stata;
  } else if (extension == "sav" || extension == "zsav") {
    format = PackageFormat::Spss;
  } else {
    return false;
  }
  return true;
}

std::string packageFormatName(PackageFormat format) {
  switch (format) {
    case PackageFormat::Sas7bdat:
      return "SAS";
    case PackageFormat::Stata:
      return "Stata";
    case PackageFormat::Spss:
      return "SPSS";
  }
  return "statistical-package";
}

Table readPackageFile(const std::string& path, PackageFormat format,
                      const PackageReadOptions& options) {
  const std::string formatName = packageFormatName(format);
  ReadContext context;
  context.options = &options;
  for (const std::string& token : options.missingTokens) {
    const std::string text = trimmed(token.c_str());
    context.missingStrings.insert(text);
    double number = 0;
    if (csv::parseNumber(text, number)) context.missingNumbers.push_back(number);
  }

  std::unique_ptr<readstat_parser_t, ParserDeleter> parser(readstat_parser_init());
  if (!parser) throw InputError(path + ": cannot start the " + formatName + " file reader");
  readstat_set_metadata_handler(parser.get(), &onMetadata);
  readstat_set_variable_handler(parser.get(), &onVariable);
  readstat_set_value_handler(parser.get(), &onValue);
  readstat_set_value_label_handler(parser.get(), &onValueLabel);
  if (options.rowLimit > 0) {
    readstat_set_row_limit(parser.get(),
                           static_cast<long>(std::min<std::size_t>(options.rowLimit, 1u << 30)));
  }
  const readstat_error_t error = parse(format, parser.get(), path.c_str(), &context);
  if (error != READSTAT_OK) {
    const char* reason = readstat_error_message(error);
    throw InputError(path + ": not a readable " + formatName + " file (" +
                     (context.failure.empty() ? std::string(reason != nullptr ? reason : "?")
                                              : context.failure) +
                     ")");
  }

  Table table;
  table.sourceName = path;
  table.rowsAreRecords = true;
  if (context.allNames.empty()) {
    throw InputError(path + ": the " + formatName + " file has no variables");
  }
  if (context.variables.empty()) {
    // No variable was kept (the analysis asked for none of them), so no value told the count.
    context.records = static_cast<std::size_t>(std::max<long long>(context.declaredRecords, 0));
  } else if (options.rowLimit == 0 && context.declaredRecords >= 0 &&
             static_cast<std::size_t>(context.declaredRecords) != context.records) {
    // A file cut short can parse without error up to where it ends: its own count says so.
    throw InputError(path + ": the " + formatName + " file declares " +
                     std::to_string(context.declaredRecords) + " records but " +
                     std::to_string(context.records) + " could be read (is the file complete?)");
  }
  if (context.records == 0 && !context.variables.empty()) {
    throw InputError(path + ": the " + formatName + " file has no records");
  }
  table.rowCount = context.records;
  std::set<std::string> seen;
  for (const std::string& name : context.allNames) {
    if (name.empty()) throw InputError(path + ": a variable without a name");
    if (!seen.insert(name).second) {
      throw InputError(path + ": two variables are named '" + shownText(name) + "'");
    }
  }
  table.headerNames = context.allNames;

  for (VariableBuffer& buffer : context.variables) {
    const std::size_t have = buffer.isString ? buffer.strings.size() : buffer.numbers.size();
    if (have != context.records) {
      throw InputError(path + ": variable '" + shownText(buffer.name) + "' has " +
                       std::to_string(have) + " values for " + std::to_string(context.records) +
                       " records");
    }
    if (buffer.isString) {
      table.columns.push_back(stringColumn(buffer, formatName));
      continue;
    }
    if (isDateFormat(buffer.format)) {
      table.refusedColumns.push_back({buffer.name, "it holds dates or times (display format " +
                                                       shownText(buffer.format) + " in the " +
                                                       formatName + " file), not numbers"});
      continue;
    }
    if (buffer.firstInfiniteRecord) {
      table.refusedColumns.push_back({buffer.name, "it holds an infinite value (record " +
                                                       std::to_string(*buffer.firstInfiniteRecord) +
                                                       ")"});
      continue;
    }
    Column column;
    column.name = buffer.name;
    column.missingCount = buffer.missingCount;
    const auto labels = context.labelSets.find(buffer.labelSet);
    std::string refusal;
    if (!buffer.labelSet.empty() && labels != context.labelSets.end() &&
        labelledColumn(buffer, labels->second, column, refusal)) {
      if (!refusal.empty()) {
        table.refusedColumns.push_back({buffer.name, refusal});
        continue;
      }
    } else {
      column.numbers = std::move(buffer.numbers);
    }
    table.columns.push_back(std::move(column));
  }
  return table;
}

}  // namespace calivera
