#pragma once
// The one number formatter for everything a person reads: the command line's summary, the
// workstation's panels, tables and charts, and the PDF report. Stated policy:
//   - fixed decimals as each measure asks; a rounded zero is "0.000", never "-0.000";
//   - an undefined value (NaN: a ratio with an empty denominator, a measure that cannot be
//     estimated) is "not defined" in every human-readable medium; JSON writes null and CSV an
//     empty field (core/metrics/json_values.h, core/report/csv_text.h), never a made-up number;
//   - infinities are "inf" / "-inf";
//   - p-values have three decimals with one floor, "< 0.001", so none reads as 0.000;
//   - intervals are "LO to HI", so a negative bound keeps its sign clear ("-0.41 to -0.17");
//     an interval with neither bound is "not defined" once.

#include <string>

namespace calivera {

inline constexpr const char* kNotDefinedText = "not defined";
inline constexpr double kPValueFloor = 0.001;

std::string formatNumber(double value, int decimals);
std::string formatPValue(double p);
std::string formatRange(double lo, double hi, int decimals);

}  // namespace calivera
