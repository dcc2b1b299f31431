#pragma once
// Number formatting shared by the audit report's tables: fixed decimals, 95% intervals and
// thresholds, locale-independent (the report must read the same on every machine).

#include <string>

#include "core/metrics/validation.h"

namespace calivera {

// Fixed `decimals` by the one policy of core/present/number_text.h ("not defined" for NaN,
// "inf"/"-inf", never "-0.000").
std::string formatFixed(double value, int decimals);
// "0.812 (0.751 to 0.861)"
std::string formatWithCi(double value, const Interval& ci, int decimals);
// "0.812 to 0.861"
std::string formatInterval(const Interval& ci, int decimals);
// Thresholds as risk: "0.1" -> "0.10", "0.075" -> "0.075" (two decimals at least, up to four).
std::string formatThreshold(double threshold);
// 0.0123 -> "1.2%"
std::string formatPercent(double proportion, int decimals);
// The last component of a path: reports name files, never folders (they can name people).
std::string fileNameOnly(const std::string& path);

// A name from a file (model, level, file name, title) as the report prints it: controls and
// bidirectional overrides written out, cut after kReportNameChars characters, so a 2,000-character
// level cannot run over the page or its caution and fingerprint footer (core/util/shown_text.h).
inline constexpr std::size_t kReportNameChars = 80;
// The report's title gets three lines of the title font before it is cut.
inline constexpr std::size_t kReportTitleChars = 160;
std::string reportName(const std::string& text);

}  // namespace calivera
