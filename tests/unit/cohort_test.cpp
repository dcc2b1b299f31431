// Complete-case selection and outcome coding: exclusion counts per column, strict 0/1 outcomes,
// and the event-value rule (exactly two distinct values, one of them the event).

#include "core/data/cohort.h"

#include <gtest/gtest.h>

#include "core/data/csv_reader.h"
#include "core/util/errors.h"

namespace calivera {
namespace {

Table tableOf(std::string_view text) {
  return parseCsv(text, "study.csv", {}).table;
}

std::string outcomeError(const Table& table, const OutcomeSpec& spec) {
  try {
    outcomeValues(table, spec, selectCompleteCases(table, {spec.column}).rows);
  } catch (const InputError& error) {
    return error.what();
  }
  return "";
}

TEST(Cohort, CompleteCasesCountMissingPerColumn) {
  const Table table = tableOf("y,age,sbp,grp\n1,50,NA,a\n0,,120,\n1,61,130,b\n0,70,140,a\n");
  const AnalysisRows selected = selectCompleteCases(table, {"y", "age", "sbp", "grp"});
  EXPECT_EQ(selected.rows, (std::vector<std::uint32_t>{2, 3}));
  const ExclusionReport& report = selected.exclusions;
  EXPECT_EQ(report.rowsRead, 4U);
  EXPECT_EQ(report.rowsExcluded, 2U);
  EXPECT_EQ(report.rowsAnalysed, 2U);
  ASSERT_EQ(report.byColumn.size(), 4U);
  EXPECT_EQ(report.byColumn[0].column, "y");
  EXPECT_EQ(report.byColumn[0].rowsMissing, 0U);
  EXPECT_EQ(report.byColumn[1].rowsMissing, 1U);
  EXPECT_EQ(report.byColumn[2].rowsMissing, 1U);
  EXPECT_EQ(report.byColumn[3].rowsMissing, 1U);  // text column: empty field is missing
  // Only the requested columns count.
  EXPECT_EQ(selectCompleteCases(table, {"y", "sbp"}).rows, (std::vector<std::uint32_t>{1, 2, 3}));
}

TEST(Cohort, UnknownColumnIsAnInputError) {
  const Table table = tableOf("y,age\n1,2\n");
  EXPECT_THROW(selectCompleteCases(table, {"y", "weight"}), InputError);
  EXPECT_THROW(outcomeValues(table, {"dead", std::nullopt}, {0}), InputError);
}

TEST(Cohort, ZeroOneOutcome) {
  const Table table = tableOf("y,x\n1,5\n0,6\nNA,7\n1,8\n");
  const AnalysisRows selected = selectCompleteCases(table, {"y", "x"});
  EXPECT_EQ(outcomeValues(table, {"y", std::nullopt}, selected.rows),
            (std::vector<double>{1, 0, 1}));
}

TEST(Cohort, NonBinaryOutcomeNamesFileLineColumnAndValue) {
  EXPECT_EQ(outcomeError(tableOf("y\n0\n1\n2\n"), {"y", std::nullopt}),
            "study.csv:4: column 'y': outcome value '2' is not 0 or 1 (give the value that means "
            "an event)");
  EXPECT_EQ(outcomeError(tableOf("y\n0\n0.5\n"), {"y", std::nullopt}),
            "study.csv:3: column 'y': outcome value '0.5' is not 0 or 1 (give the value that "
            "means an event)");
  EXPECT_EQ(outcomeError(tableOf("y\n0\nyes\n"), {"y", std::nullopt}),
            "study.csv:3: column 'y': outcome value 'yes' is not 0 or 1 (give the value that "
            "means an event)");
}

TEST(Cohort, EventValueOnTextColumn) {
  const Table table = tableOf("status,x\nyes,1\nno,2\n,3\nyes,4\n");
  const AnalysisRows selected = selectCompleteCases(table, {"status"});
  EXPECT_EQ(outcomeValues(table, {"status", "yes"}, selected.rows), (std::vector<double>{1, 0, 1}));
  EXPECT_EQ(outcomeValues(table, {"status", "no"}, selected.rows), (std::vector<double>{0, 1, 0}));
}

TEST(Cohort, EventValueOnNumericColumn) {
  const Table table = tableOf("status\n1\n2\n2\n1\n");
  const std::vector<std::uint32_t> all{0, 1, 2, 3};
  EXPECT_EQ(outcomeValues(table, {"status", "2"}, all), (std::vector<double>{0, 1, 1, 0}));
  EXPECT_EQ(outcomeValues(table, {"status", "2.0"}, all), (std::vector<double>{0, 1, 1, 0}));
}

TEST(Cohort, TypoLevelIsNeverASilentNonEvent) {
  EXPECT_EQ(outcomeError(tableOf("status\nyes\nno\nyse\nno\n"), {"status", "yes"}),
            "study.csv: column 'status': expected exactly two distinct values (event 'yes' and "
            "one other); found 3: 'no' (2 rows, first on line 3), 'yes' (1 row, first on line 2), "
            "'yse' (1 row, first on line 4)");
  EXPECT_EQ(outcomeError(tableOf("status\nYes\nno\n"), {"status", "yes"}),
            "study.csv: column 'status': no value equals the event value 'yes'; found 2: 'Yes' (1 "
            "row, first on line 2), 'no' (1 row, first on line 3)");
  EXPECT_EQ(outcomeError(tableOf("status\n1\n1\n"), {"status", "1"}),
            "study.csv: column 'status': expected exactly two distinct values (event '1' and one "
            "other); found 1: '1' (2 rows, first on line 2)");
}

TEST(Cohort, SelectedRowWithMissingOutcomeIsRefused) {
  const Table table = tableOf("y,x\n1,2\nNA,3\n0,4\n");
  EXPECT_EQ(
      [&] {
        try {
          outcomeValues(table, {"y", std::nullopt}, {0, 1, 2});
        } catch (const InputError& error) {
          return std::string(error.what());
        }
        return std::string();
      }(),
      "study.csv:3: column 'y': the outcome is missing in a row selected for analysis "
      "(select complete cases over the outcome column too)");
}

}  // namespace
}  // namespace calivera
