#pragma once
// One CSV table being built, as every table of core/report writes it (validation_tables.h): comma
// separated, header row, '.' decimals, 10 significant digits, an empty field for an undefined
// (non-finite) value, text fields quoted when they hold a comma, quote or line break.
//
// Formula injection: a spreadsheet runs a cell that starts with =, +, -, @, a tab or a carriage
// return as a formula, and level names, model names and file names come from files we do not
// control. Such a text cell is neutralised with a leading apostrophe (the spreadsheet convention
// for "text, not a formula") and quoted; a cell that is a plain number ("-0.41") is left alone.
// csvCell is the one rule, used by every CSV and every copied table Calivera writes.

#include <cmath>
#include <cstddef>
#include <sstream>
#include <string>
#include <vector>

#include "core/metrics/validation.h"

namespace calivera {

// True when a spreadsheet would read `text` as a formula (and it is not simply a number).
bool csvLooksLikeFormula(const std::string& text);
// `text` neutralised (see above); quoted when `quote` and it holds a separator, quote or line
// break, or was neutralised.
std::string csvCell(const std::string& text, bool quote = true);

class CsvText {
 public:
  explicit CsvText(const std::vector<std::string>& header) {
    out_.precision(10);
    for (const std::string& h : header) field(h);
    end();
  }
  CsvText& num(double value) {
    separate();
    if (std::isfinite(value)) out_ << value;
    return *this;
  }
  CsvText& count(std::size_t value) {
    separate();
    out_ << value;
    return *this;
  }
  CsvText& field(const std::string& text) {
    separate();
    out_ << csvCell(text);
    return *this;
  }
  CsvText& ci(const Interval& i) { return num(i.lo).num(i.hi); }
  void end() {
    out_ << '\n';
    first_ = true;
  }
  std::string str() const { return out_.str(); }

 private:
  void separate() {
    if (!first_) out_ << ',';
    first_ = false;
  }
  std::ostringstream out_;
  bool first_ = true;
};

}  // namespace calivera
