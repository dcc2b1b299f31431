#include "core/report/audit_missing.h"

#include <algorithm>
#include <cmath>

#include "core/present/measures.h"
#include "core/report/audit_blocks.h"
#include "core/report/audit_format.h"

namespace calivera {
namespace {

std::string patternName(const MissingPattern& p) {
  if (p.missingColumns.empty()) return "none (complete rows)";
  std::string names;
  for (const std::string& c : p.missingColumns)
    names += (names.empty() ? "" : ", ") + reportName(c);
  return names;
}

void addPatterns(const AuditReportInput& input, const DisclosurePlan& plan,
                 std::vector<ReportBlock>& blocks) {
  const MissingPatternReport& report = input.missingPatterns;
  ReportTable table;
  table.caption = std::string(kTablePrefix) + "Columns missing together";
  const bool suppress = plan.active();
  if (suppress) {
    table.header = {"Missing together", "Rows"};
    table.widths = {0.75, 0.25};
    table.align = {CellAlign::Left, CellAlign::Right};
    // Small patterns merged; a merged line that is itself small takes the smallest other
    // incomplete pattern too, so no published count falls below the threshold by subtraction.
    std::vector<MissingPattern> shown;
    std::size_t mergedRows = report.othersRows;
    std::size_t mergedPatterns = report.otherPatterns;
    for (const MissingPattern& p : report.patterns) {
      if (p.rows < plan.below() && !p.missingColumns.empty()) {
        mergedRows += p.rows;
        ++mergedPatterns;
      } else {
        shown.push_back(p);
      }
    }
    while (mergedRows > 0 && mergedRows < plan.below()) {
      auto smallest = shown.end();
      for (auto it = shown.begin(); it != shown.end(); ++it) {
        if (!it->missingColumns.empty() && (smallest == shown.end() || it->rows < smallest->rows))
          smallest = it;
      }
      if (smallest == shown.end()) break;
      mergedRows += smallest->rows;
      ++mergedPatterns;
      shown.erase(smallest);
    }
    for (const MissingPattern& p : shown) {
      table.rows.push_back({patternName(p), std::to_string(p.rows)});
    }
    if (mergedRows > 0) {
      table.rows.push_back({std::to_string(mergedPatterns) + " other patterns together",
                            mergedRows < plan.below() ? "<" + std::to_string(plan.below())
                                                      : std::to_string(mergedRows)});
    }
    table.note = "Small-cell suppression: patterns with fewer than " +
                 std::to_string(plan.below()) +
                 " rows are merged, and events per pattern are withheld.";
  } else {
    table.header = {"Missing together", "Rows", "Outcome known", "Events"};
    table.widths = {0.55, 0.15, 0.15, 0.15};
    table.align = {CellAlign::Left, CellAlign::Right, CellAlign::Right, CellAlign::Right};
    for (const MissingPattern& p : report.patterns) {
      table.rows.push_back({patternName(p), std::to_string(p.rows), std::to_string(p.outcomeKnown),
                            std::to_string(p.events)});
    }
    if (report.otherPatterns > 0) {
      table.rows.push_back({std::to_string(report.otherPatterns) + " other patterns together",
                            std::to_string(report.othersRows), "", ""});
    }
    table.note =
        "Each row is one combination of the analysed columns missing together. An event rate "
        "that differs between patterns means the complete cases are not a random part of the "
        "cohort.";
  }
  blocks.push_back(reportTable(table));
}

// How the copies came about: read from the cohort file, or made here by chained equations.
std::string copiesOrigin(const ImputedValidation& imputed, const DisclosurePlan& plan) {
  if (!imputed.column.empty()) {
    return "The cohort file stacks " + std::to_string(imputed.indices.size()) +
           " imputed copies of the data (column '" + reportName(imputed.column) + "', " +
           std::to_string(imputed.n) +
           " patients in each) under the original data. The results elsewhere in this report are "
           "the complete cases of the original data; ";
  }
  std::string columns;
  for (std::size_t i = 0; i < imputed.imputedColumns.size(); ++i) {
    const ImputedColumnRecord& c = imputed.imputedColumns[i];
    const bool small = plan.active() && c.missing > 0 && c.missing < plan.below();
    columns += std::string(i == 0                                   ? ""
                           : i + 1 == imputed.imputedColumns.size() ? " and "
                                                                    : ", ") +
               "'" + reportName(c.column) + "' (" +
               (small ? "<" + std::to_string(plan.below()) : std::to_string(c.missing)) +
               " values, " + imputationMethodText(c.method) + ")";
  }
  return "The missing values of the model's columns were imputed " +
         std::to_string(imputed.indices.size()) + " times by chained equations (" +
         std::to_string(imputed.iterations) + " iterations, seed " + std::to_string(imputed.seed) +
         ") for the " + std::to_string(imputed.n) + " patients with a known outcome: " + columns +
         ". Each imputation model holds the outcome and every other model column; the outcome "
         "itself was never imputed. The results elsewhere in this report are the complete cases "
         "of the cohort as read; ";
}

void addPooled(const AuditReportInput& input, const DisclosurePlan& plan,
               std::vector<ReportBlock>& blocks) {
  const ImputedValidation& imputed = *input.imputed;
  blocks.push_back(reportParagraph(
      copiesOrigin(imputed, plan) +
      "each copy was validated the same way and the "
      "measures below are pooled by Rubin's rules, on the logit scale for the c-statistic and "
      "the log scale for O/E, with Barnard-Rubin degrees of freedom. Hosmer-Lemeshow is a test, "
      "not an estimate: over the copies its statistic ranged from " +
      formatFixed(imputed.hosmerLemeshowStatistic.smallest, 2) + " to " +
      formatFixed(imputed.hosmerLemeshowStatistic.largest, 2) + " (median " +
      formatFixed(imputed.hosmerLemeshowStatistic.median, 2) + ") on " +
      std::to_string(imputed.hosmerLemeshowDf) + " df."));
  ReportTable table;
  table.caption = std::string(kTablePrefix) + "Complete cases and imputed copies pooled";
  table.header = {"Measure", "Complete cases (95% CI)", "Pooled (95% CI)", "Missing information",
                  "df"};
  table.widths = {0.22, 0.26, 0.26, 0.14, 0.12};
  table.align = {CellAlign::Left, CellAlign::Right, CellAlign::Right, CellAlign::Right,
                 CellAlign::Right};
  for (const PooledImputedMeasure& m : imputed.pooled) {
    const Measure& measure = measureOfPooledKey(m.key);
    const double complete = measure.estimate(input.result);
    const std::string completeText =
        measure.interval ? formatWithCi(complete, measure.interval(input.result), measure.decimals)
                         : formatFixed(complete, measure.decimals);
    if (!m.problem.empty()) {
      table.rows.push_back({measure.label, completeText, "not pooled", "", ""});
      continue;
    }
    table.rows.push_back(
        {measure.label, completeText, formatWithCi(m.estimate, m.ci, measure.decimals),
         formatPercent(m.rubin.fractionMissingInformation, 1), formatFixed(m.rubin.df, 0)});
  }
  table.note =
      "Missing information: the fraction of the pooled variance due to the missing "
      "values (Rubin 1987).";
  blocks.push_back(reportTable(table));
}

}  // namespace

void addMissingDataSection(const AuditReportInput& input, const DisclosurePlan& plan,
                           std::vector<ReportBlock>& blocks) {
  if (input.missingPatterns.patterns.size() <= 1 && !input.imputed) return;  // nothing missing
  blocks.push_back(reportHeading("Missing data", 2));
  addPatterns(input, plan, blocks);
  if (input.imputed) addPooled(input, plan, blocks);
}

}  // namespace calivera
