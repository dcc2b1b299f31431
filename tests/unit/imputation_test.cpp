// Rubin's rules (core/imputation/rubin_rules.h) on a case worked by hand, and the checks on
// stacked imputed copies (core/imputation/stacked_imputations.h) with invented tables that each
// break one rule (the reference check on real data is tests/reference/pima_imputation_test.cpp).
#include <gtest/gtest.h>

#include <cmath>

#include "core/data/csv_reader.h"
#include "core/imputation/missing_patterns.h"
#include "core/imputation/rubin_rules.h"
#include "core/imputation/stacked_imputations.h"
#include "core/util/errors.h"

namespace calivera {
namespace {

Table table(const std::string& text) {
  return parseCsv(text, "stack.csv", {}).table;
}

std::string splitError(const std::string& text) {
  try {
    splitStackedImputations(table(text), "imp", "y");
  } catch (const InputError& error) {
    return error.what();
  }
  return "(no InputError)";
}

TEST(RubinRules, WorkedByHand) {
  // Q = 1, 2, 3 and U = 1, 1, 1 (computed by hand): mean 2, W = 1, B = 1, T = 1 + 4/3 = 7/3,
  // r = 4/3, lambda = 4/7, df_old = 2 / (4/7)^2 = 6.125; with nu_com = 1e12 the Barnard-Rubin df
  // is df_old to 1e-9; fmi = (r + 2 / (df + 3)) / (r + 1).
  const RubinPooled p = poolByRubin({1, 2, 3}, {1, 1, 1}, 1e12);
  EXPECT_DOUBLE_EQ(p.estimate, 2.0);
  EXPECT_DOUBLE_EQ(p.withinVariance, 1.0);
  EXPECT_DOUBLE_EQ(p.betweenVariance, 1.0);
  EXPECT_DOUBLE_EQ(p.totalVariance, 7.0 / 3.0);
  EXPECT_DOUBLE_EQ(p.relativeIncrease, 4.0 / 3.0);
  EXPECT_NEAR(p.df, 6.125, 1e-9);
  EXPECT_NEAR(p.fractionMissingInformation, (4.0 / 3.0 + 2.0 / 9.125) / (7.0 / 3.0), 1e-12);
  // The interval: symmetric around the estimate and wider than the normal one (t, 6.125 df).
  EXPECT_NEAR(p.ci.lo + p.ci.hi, 4.0, 1e-12);
  EXPECT_GT(p.ci.hi - 2.0, 1.96 * std::sqrt(7.0 / 3.0));
}

TEST(RubinRules, IdenticalCopiesGiveTheCompleteDataAnswer) {
  // B = 0: T = W, fmi near 0, and mice's floor lambda = 1e-4 keeps df finite, close to nu_com.
  const RubinPooled p = poolByRubin({0.5, 0.5, 0.5}, {0.04, 0.04, 0.04}, 100);
  EXPECT_DOUBLE_EQ(p.totalVariance, 0.04);
  EXPECT_LT(p.fractionMissingInformation, 0.05);
  EXPECT_GT(p.df, 90.0);
  EXPECT_LT(p.df, 100.0);
}

TEST(StackedImputations, SplitsTheOriginalAndTheCopies) {
  const Table stacked = table("imp,y,x\n0,1,\n0,0,2\n1,1,5\n1,0,2\n2,1,7\n2,0,2\n");
  const StackedImputations s = splitStackedImputations(stacked, "imp", "y");
  EXPECT_EQ(s.originalRows, (std::vector<std::uint32_t>{0, 1}));
  ASSERT_EQ(s.copyRows.size(), 2u);
  EXPECT_EQ(s.indices, (std::vector<long long>{1, 2}));
  const Table second = tableRows(stacked, s.copyRows[1]);
  EXPECT_EQ(second.require("x").numbers[0], 7.0);
  // Rows keep their place in the file for messages: the second copy's first row is line 6.
  EXPECT_EQ(second.placeOfRow(0), "stack.csv:6");
  EXPECT_EQ(tableRows(stacked, s.originalRows).require("x").missingCount, 1u);
}

TEST(StackedImputations, BadStacksAreClearErrors) {
  EXPECT_NE(splitError("imp,y,x\n1,1,1\n1,0,2\n").find("single value 1"), std::string::npos);
  EXPECT_NE(splitError("imp,y,x\n0,1,\n0,0,2\n1,1,5\n1,0,2\n").find("one imputed copy only"),
            std::string::npos);
  EXPECT_NE(splitError("imp,y,x\n1,1,1\n2,1,1\n").find("no rows with index 0"), std::string::npos);
  EXPECT_NE(splitError("imp,y,x\n0,1,\n0,0,2\n1,1,5\n1,0,2\n2,1,7\n")
                .find("imputation 2 has 1 rows, the original data (index 0) 2"),
            std::string::npos);
  EXPECT_NE(splitError("imp,y,x\n0,1,\n0,0,2\n1,1,5\n1,0,2\n2,1,7\n2,1,2\n")
                .find("stack.csv:7: outcome 'y' is '1' in imputation 2 but '0'"),
            std::string::npos);
  EXPECT_NE(splitError("imp,y,x\n0,1,\n0,0,2\n1,1,5\n1,,2\n2,1,7\n2,0,2\n")
                .find("stack.csv:5: outcome 'y' is missing in imputation 1"),
            std::string::npos);
  EXPECT_NE(splitError("imp,y,x\n0,1,\n0,,2\n1,1,5\n1,0,2\n2,1,7\n2,0,2\n")
                .find("the outcome was imputed"),
            std::string::npos);
  EXPECT_NE(splitError("imp,y,x\n0,1,1\n0.5,0,2\n").find("not a whole number"), std::string::npos);
  EXPECT_NE(splitError("imp,y,x\n0,1,1\n,0,2\n").find("stack.csv:3: imputation column"),
            std::string::npos);
}

TEST(MissingPatterns, CountsRowsAndEventsPerPattern) {
  const Table t = table("y,a,b\n1,,1\n0,,1\n1,1,\n0,1,1\n1,1,1\n0,,\n,1,1\n");
  const MissingPatternReport r = missingPatterns(t, {"y", "a", "b"}, {"y", {}});
  ASSERT_EQ(r.patterns.size(), 5u);
  EXPECT_TRUE(r.patterns[0].missingColumns.empty());  // 2 complete rows: first by count
  EXPECT_EQ(r.patterns[0].rows, 2u);
  EXPECT_EQ(r.patterns[0].events, 1u);
  EXPECT_EQ(r.patterns[1].missingColumns, (std::vector<std::string>{"a"}));
  EXPECT_EQ(r.patterns[1].rows, 2u);
  EXPECT_EQ(r.patterns[1].events, 1u);
  // The row without an outcome is a pattern of its own, with no known outcome.
  bool found = false;
  for (const MissingPattern& p : r.patterns) {
    if (p.missingColumns == std::vector<std::string>{"y"}) {
      found = true;
      EXPECT_EQ(p.outcomeKnown, 0u);
    }
  }
  EXPECT_TRUE(found);
}

}  // namespace
}  // namespace calivera
