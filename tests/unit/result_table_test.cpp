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

}  // namespace
}  // namespace calivera
