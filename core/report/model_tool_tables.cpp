#include "core/report/model_tool_tables.h"

namespace calivera {

namespace {

using table_columns::count;
using table_columns::number;
using table_columns::pValue;
using table_columns::text;

}  // namespace

ResultTable optimismTable(const OptimismResult& result) {
  ResultTable t;
  t.fileName = "internal_validation.csv";
  t.columns = {
      text("measure", "Measure"),
      number("apparent", "On fitting data", 4,
             "Apparent performance: the model checked on the patients it was fitted to"),
      number("optimism", "Overfit", 4,
             "Optimism: over the resamples, the mean of (performance on the resample the model "
             "was refitted on − performance of that refit on the original cohort)"),
      number("corrected", "On new patients", 4,
             "Optimism-corrected: on fitting data minus overfit"),
      number("optimism_sd", "Overfit SD", 4,
             "Standard deviation of the overfit over the resamples used"),
      count("replicates_used", "Resamples", "Resamples whose refit and measures succeeded")};
  for (const OptimismMeasure& m : result.measures) {
    t.rows.push_back({TableValue::of(m.measure), TableValue::of(m.apparent),
                      TableValue::of(m.meanOptimism), TableValue::of(m.corrected),
                      TableValue::of(m.optimismSd), TableValue::ofCount(m.replicatesUsed)});
  }
  return t;
}

ResultTable closedTestTable(const ClosedTestResult& result) {
  ResultTable t;
  t.fileName = "closed_test.csv";
  t.columns = {text("hypothesis", "Test", "Each smaller model against the refit"),
               number("lr_statistic", "LR statistic", 3, "Difference in deviance"),
               count("df", "df"), pValue("p_value", "p"),
               text("decision", "Decision", "At the chosen alpha")};
  for (const ClosedTestStep& step : result.steps) {
    t.rows.push_back({TableValue::of(step.hypothesis), TableValue::of(step.lrStatistic),
                      TableValue::ofCount(static_cast<std::size_t>(step.df)),
                      TableValue::of(step.pValue),
                      TableValue::of(std::string(step.rejected ? "rejected" : "not rejected"))});
  }
  return t;
}

}  // namespace calivera
