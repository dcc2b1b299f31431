#include "core/report/missing_table.h"

#include <cmath>

namespace calivera {

using namespace table_columns;

ResultTable missingPatternsTable(const MissingPatternReport& report) {
  ResultTable t;
  t.fileName = "missing_patterns.csv";
  t.columns = {text("missing_columns", "Missing together",
                    "The analysed columns missing together on these rows; empty: complete rows"),
               count("rows", "Rows"),
               count("outcome_known", "Outcome known", "Rows of the pattern with an outcome"),
               count("events", "Events", "Events among the rows with an outcome"),
               number("event_rate", "Event rate", 3,
                      "Events / outcome known: a rate unlike the complete rows' means the "
                      "complete cases are not a random part of the cohort")};
  for (const MissingPattern& p : report.patterns) {
    std::string names;
    for (const std::string& c : p.missingColumns) names += (names.empty() ? "" : "; ") + c;
    const double rate = p.outcomeKnown > 0
                            ? static_cast<double>(p.events) / static_cast<double>(p.outcomeKnown)
                            : std::nan("");
    t.rows.push_back({TableValue::of(names.empty() ? std::string("(none: complete rows)") : names),
                      TableValue::ofCount(p.rows), TableValue::ofCount(p.outcomeKnown),
                      TableValue::ofCount(p.events), TableValue::of(rate)});
  }
  if (report.otherPatterns > 0) {
    t.rows.push_back(
        {TableValue::of("(" + std::to_string(report.otherPatterns) + " other patterns)"),
         TableValue::ofCount(report.othersRows), TableValue::of(std::nan("")),
         TableValue::of(std::nan("")), TableValue::of(std::nan(""))});
  }
  return t;
}

}  // namespace calivera
