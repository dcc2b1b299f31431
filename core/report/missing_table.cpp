#include "core/report/missing_table.h"

#include <cmath>

#include "core/present/measures.h"

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

ResultTable pooledImputationsTable(const ImputedValidation& imputed,
                                   const ValidationResult& completeCases) {
  ResultTable t;
  t.fileName = "pooled_imputations.csv";
  // The CSV's first 13 columns are those it had before the table existed; added ones follow.
  t.columns = {
      text("measure", "Key"),
      number("estimate", "Pooled", 3, "Rubin's rules over the imputed copies, back-transformed"),
      interval("ci_lo", "ci_hi", "Pooled 95% CI", 3,
               "Estimate +/- t(df) x sqrt(total variance) on the pooling scale, back-transformed"),
      text("scale", "Pooled on", "The scale on which the copies' estimates were averaged"),
      number("estimate_on_scale", "Estimate on scale", 4),
      number("within_variance", "Within variance", 6, "Mean of the copies' variances"),
      number("between_variance", "Between variance", 6, "Variance of the copies' estimates"),
      number("total_variance", "Total variance", 6, "Within + (1 + 1/m) x between"),
      number("fraction_missing_information", "Missing information", 3,
             "The fraction of the pooled variance due to the missing values (Rubin 1987)"),
      number("df", "df", 1, "Barnard-Rubin degrees of freedom"),
      number("complete_data_df", "Complete-data df", 0),
      text("problem", "Not pooled because"),
      text("label", "Measure"),
      number("complete_case_estimate", "Complete cases", 3,
             "The same measure on the patients with every analysed value"),
      interval("complete_case_ci_lo", "complete_case_ci_hi", "Complete cases 95% CI", 3)};
  t.shownOrder = {12, 13, 14, 1, 2, 8, 9, 3, 11};
  const double nan = std::nan("");
  for (const PooledImputedMeasure& m : imputed.pooled) {
    const Measure& measure = measureOfPooledKey(m.key);
    const bool pooled = m.problem.empty();
    const auto value = [&](double v) { return TableValue::of(pooled ? v : nan); };
    const Interval none{nan, nan};
    t.rows.push_back({TableValue::of(m.key), TableValue::of(m.estimate),
                      TableValue::of(pooled ? m.ci : none), TableValue::of(m.scale),
                      value(m.rubin.estimate), value(m.rubin.withinVariance),
                      value(m.rubin.betweenVariance), value(m.rubin.totalVariance),
                      value(m.rubin.fractionMissingInformation), value(m.rubin.df),
                      value(m.rubin.completeDataDf), TableValue::of(m.problem),
                      TableValue::of(std::string(measure.label)),
                      TableValue::of(measure.estimate(completeCases)),
                      TableValue::of(measure.interval ? measure.interval(completeCases) : none)});
  }
  return t;
}

}  // namespace calivera
