#pragma once
// A result table as data: what each column holds (its CSV key, its on-screen label and tooltip,
// how many decimals the screen shows) and the values, kept at full precision. One definition per
// table, two renderings:
//   tableCsv()  the file `calivera validate --csv-dir` writes (core/report/validation_tables.h),
//               byte for byte; the workstation's "Export table" writes the same text;
//   the workstation's table view (ui/models/result_tables.h) shows the labels and rounds to the
//               decimals, with "not defined" for an undefined value (core/present/number_text.h).
// An interval column is one column on screen ("lo to hi") and two in the CSV (its two keys).
//
// Aggregates only: no table here carries a patient-level value.

#include <cstddef>
#include <limits>
#include <string>
#include <vector>

#include "core/metrics/validation.h"

namespace calivera {

// PValue: a number in the CSV, shown on screen with the p floor of core/present/number_text.h.
enum class TableColumnKind { Number, Count, Interval, Text, PValue };

struct TableColumn {
  std::string key;    // CSV header (for an interval: the lower bound's)
  std::string keyHi;  // interval only: the upper bound's CSV header
  std::string label;  // on-screen header
  std::string tip;    // on-screen header tooltip; may be empty
  TableColumnKind kind = TableColumnKind::Number;
  int decimals = 3;  // on screen only; the CSV keeps 10 significant digits
  // Text only: how many characters the screen shows (0: the screen's default cut); the CSV and
  // the tooltip keep the whole text. A 64-digit SHA-256 shows its first 16.
  std::size_t shownChars = 0;
};

// One cell; which member is read follows the column's kind.
struct TableValue {
  double number = std::numeric_limits<double>::quiet_NaN();  // Number (NaN: not defined), Count
  Interval interval{std::numeric_limits<double>::quiet_NaN(),
                    std::numeric_limits<double>::quiet_NaN()};
  std::string text;

  static TableValue of(double v) { return {v, {}, {}}; }
  static TableValue ofCount(std::size_t v) { return {static_cast<double>(v), {}, {}}; }
  static TableValue of(const Interval& ci) { return {0.0, ci, {}}; }
  static TableValue of(const std::string& s) { return {0.0, {}, s}; }
};

struct ResultTable {
  std::string fileName;  // as written by --csv-dir, e.g. "thresholds.csv"
  std::vector<TableColumn> columns;
  std::vector<std::vector<TableValue>> rows;  // each row has one value per column
  // The order the screen shows the columns in (indices into `columns`); empty: as in the CSV.
  // The CSV keeps its own order, which later additions never disturb. A column left out is
  // written to the CSV but not shown (a constant, or the name of the table a view already shows).
  std::vector<std::size_t> shownOrder;
};

// The CSV text (core/report/csv_text.h conventions).
std::string tableCsv(const ResultTable& table);

// The table as the command line prints it: the screen's labels and column order, values rounded
// as on screen (core/present/number_text.h: "not defined", p floors, "lo to hi"), names from files
// shown with controls written out and cut (core/util/shown_text.h), columns aligned (text left,
// numbers right), each line starting with `indent`.
std::string tableText(const ResultTable& table, const std::string& indent = "  ");

// Column makers shared by the table definitions (result_table.cpp, uncertainty_result_tables.cpp).
namespace table_columns {
TableColumn number(std::string key, std::string label, int decimals, std::string tip = {});
TableColumn count(std::string key, std::string label, std::string tip = {});
TableColumn interval(std::string lo, std::string hi, std::string label, int decimals,
                     std::string tip = {});
TableColumn text(std::string key, std::string label, std::string tip = {},
                 std::size_t shownChars = 0);
TableColumn pValue(std::string key, std::string label, std::string tip = {});
}  // namespace table_columns

// The threshold trade-off table: one row per threshold of the result's grid, with the net
// benefit of the decision curve at the same threshold (core builds both from the same grid).
ResultTable thresholdTable(const ValidationResult& result);
// The grouped calibration (Hosmer-Lemeshow) table: one row per risk group.
ResultTable hosmerLemeshowTable(const HosmerLemeshow& hl);

}  // namespace calivera
