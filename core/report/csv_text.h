#pragma once
// One CSV table being built, as every table of core/report writes it (validation_tables.h): comma
// separated, header row, '.' decimals, 10 significant digits, an empty field for an undefined
// (non-finite) value, text fields quoted when they hold a comma, quote or line break.

#include <cmath>
#include <cstddef>
#include <sstream>
#include <string>
#include <vector>

#include "core/metrics/validation.h"

namespace calivera {

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
    if (text.find_first_of(",\"\n\r") == std::string::npos) {
      out_ << text;
    } else {
      out_ << '"';
      for (const char c : text) out_ << (c == '"' ? "\"\"" : std::string(1, c));
      out_ << '"';
    }
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
