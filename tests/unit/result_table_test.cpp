// The result tables as data (core/report/result_table.h): the CSV that --csv-dir writes keeps its
// columns in place (later additions come last), an interval is two CSV columns, and every value
// is the run's own, carried at full precision. Data: a real run on MASS::birthwt (Debian
// r-cran-mass); no reference value is involved, the run's own results are compared.
#include "core/report/result_table.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <sstream>
#include <string>
#include <vector>

#include "core/report/validation_tables.h"
#include "tests/unit/birthwt_run.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

std::vector<std::string> csvLines(const std::string& text) {
  std::vector<std::string> lines;
  std::istringstream in(text);
  for (std::string line; std::getline(in, line);) lines.push_back(line);
  return lines;
}

std::vector<std::string> fields(const std::string& line) {
  std::vector<std::string> out;
  std::istringstream in(line);
  for (std::string f; std::getline(in, f, ',');) out.push_back(f);
  if (!line.empty() && line.back() == ',') out.emplace_back();
  return out;
}

class ResultTables : public ::testing::Test {
 protected:
  void SetUp() override {
    testing::writeBirthwtModel(dir_.file("m.json"), {"age", "lwt", "smoke", "ht"}, "four terms");
    run_ = testing::birthwtRun(dir_.file("m.json"));
  }
  testing::TempDir dir_{"result_tables"};
  ValidationRun run_;
};

TEST_F(ResultTables, ThresholdCsvKeepsItsColumnsAndCarriesTheRunsValues) {
  const ResultTable table = thresholdTable(run_.result);
  const std::vector<std::string> lines = csvLines(tableCsv(table));
  ASSERT_EQ(lines.size(), run_.result.thresholds.size() + 1);
  // The columns --csv-dir has always written, in their place; flagged and net_benefit were added
  // at the end.
  EXPECT_EQ(lines[0],
            "threshold,tp,fp,tn,fn,sensitivity,sensitivity_lo,sensitivity_hi,specificity,"
            "specificity_lo,specificity_hi,ppv,ppv_lo,ppv_hi,npv,npv_lo,npv_hi,flagged_per_1000,"
            "events_caught_per_1000,events_missed_per_1000,flagged_without_event_per_1000,"
            "flagged,net_benefit");
  // One screen column per interval, two CSV columns.
  std::size_t intervals = 0;
  for (const TableColumn& c : table.columns) intervals += c.kind == TableColumnKind::Interval;
  EXPECT_EQ(intervals, 4u);
  EXPECT_EQ(fields(lines[0]).size(), table.columns.size() + intervals);

  // The screen order is a permutation of the columns, starting with the threshold.
  std::vector<std::size_t> order = table.shownOrder;
  ASSERT_EQ(order.size(), table.columns.size());
  EXPECT_EQ(order.front(), 0u);
  std::sort(order.begin(), order.end());
  for (std::size_t k = 0; k < order.size(); ++k) EXPECT_EQ(order[k], k);

  for (std::size_t i = 0; i < run_.result.thresholds.size(); i += 17) {
    const ThresholdRow& r = run_.result.thresholds[i];
    const std::vector<std::string> f = fields(lines[i + 1]);
    ASSERT_EQ(f.size(), 23u) << lines[i + 1];
    EXPECT_NEAR(std::stod(f[0]), r.threshold, 1e-12);
    EXPECT_EQ(std::stoul(f[1]), r.tp);
    EXPECT_EQ(std::stoul(f[4]), r.fn);
    EXPECT_NEAR(std::stod(f[5]), r.sensitivity, 1e-9);
    EXPECT_NEAR(std::stod(f[7]), r.sensitivityCi.hi, 1e-9);
    EXPECT_EQ(std::stoul(f[21]), r.tp + r.fp);
    EXPECT_NEAR(std::stod(f[22]), run_.result.decisionCurve[i].netBenefit, 1e-9);
  }
}

TEST_F(ResultTables, GroupCsvIsTheFileValidateWrites) {
  const ResultTable groups = hosmerLemeshowTable(run_.result.hosmerLemeshow);
  EXPECT_EQ(groups.rows.size(), run_.result.hosmerLemeshow.groups.size());
  bool found = false;
  for (const auto& [name, text] : validationTables(run_)) {
    if (name == groups.fileName) {
      found = true;
      EXPECT_EQ(text, tableCsv(groups));
      EXPECT_EQ(csvLines(text)[0],
                "group,n,observed,expected,mean_risk,observed_proportion,observed_lo,"
                "observed_hi,risk_min,risk_max");
    }
  }
  EXPECT_TRUE(found);
}

TEST(ResultTableCsv, UndefinedIsAnEmptyFieldAndTextIsNeutralised) {
  ResultTable t;
  t.columns = {{"name", {}, "Name", {}, TableColumnKind::Text, 0},
               {"value", {}, "Value", {}, TableColumnKind::Number, 3},
               {"lo", "hi", "95% CI", {}, TableColumnKind::Interval, 3}};
  t.rows = {{TableValue::of(std::string("=1+1")), TableValue::of(std::nan("")),
             TableValue::of(Interval{0.25, 0.5})}};
  EXPECT_EQ(tableCsv(t), "name,value,lo,hi\n\"'=1+1\",,0.25,0.5\n");
}

// The printed table (tableText): the screen's labels and order, aligned (text left, numbers
// right), rounded as on screen, "not defined" for NaN, the p floor, "lo to hi" intervals, and a
// name from a file with its control characters written out.
TEST(ResultTableText, AlignedRoundedAndSafe) {
  ResultTable t;
  t.columns = {{"name", {}, "Name", {}, TableColumnKind::Text, 0},
               {"value", {}, "Value", {}, TableColumnKind::Number, 3},
               {"lo", "hi", "95% CI", {}, TableColumnKind::Interval, 2},
               {"p", {}, "p", {}, TableColumnKind::PValue, 3}};
  t.shownOrder = {0, 1, 3, 2};
  t.rows = {{TableValue::of(std::string("a")), TableValue::of(0.12345),
             TableValue::of(Interval{-0.414, -0.166}), TableValue::of(0.00001)},
            {TableValue::of(std::string("bad\x1b[2Jname")), TableValue::of(std::nan("")),
             TableValue::of(Interval{0.5, 0.75}), TableValue::of(0.2)}};
  const std::string text = tableText(t, "");
  std::vector<std::string> lines = csvLines(text);
  ASSERT_EQ(lines.size(), 3u);
  // The escape character is shown, not sent to the terminal.
  EXPECT_EQ(text.find('\x1b'), std::string::npos);
  EXPECT_NE(lines[0].find("Name"), std::string::npos);
  EXPECT_LT(lines[0].find("Value"), lines[0].find("p"));
  EXPECT_LT(lines[0].find("  p"), lines[0].find("95% CI"));  // the shown order, not the CSV's
  EXPECT_NE(lines[1].find("0.123"), std::string::npos);
  EXPECT_NE(lines[1].find("< 0.001"), std::string::npos);
  EXPECT_NE(lines[1].find("-0.41 to -0.17"), std::string::npos);
  EXPECT_NE(lines[2].find("not defined"), std::string::npos);
  // Right-aligned numbers: each column ends at the same place on every line.
  const auto endOf = [](const std::string& line, const std::string& cell) {
    return line.find(cell) + cell.size();
  };
  EXPECT_EQ(endOf(lines[1], "0.123"), endOf(lines[2], "not defined"));
  EXPECT_EQ(endOf(lines[1], "< 0.001"), endOf(lines[2], "0.200"));
}

}  // namespace
}  // namespace calivera
