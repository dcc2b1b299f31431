// The command line's fit releases the cohort's values column by column while it builds the
// design matrix (issue 13). On birthwt (MASS::birthwt from Debian r-cran-mass) with a spline
// (one column read by several terms), a categorical predictor and plain linear terms, the
// releasing fit must give exactly the model of the fit that keeps the table: the same
// coefficients, standard errors and analysed-data fingerprint, bit for bit.

#include <gtest/gtest.h>

#include "core/data/csv_reader.h"
#include "core/fit/cohort_fit.h"
#include "tests/unit/birthwt_run.h"

namespace calivera {
namespace {

TEST(ReleasedFit, GivesExactlyTheModelOfTheFitThatKeepsTheTable) {
  CohortFitSpec spec;
  spec.outcome.column = "low";
  spec.predictors = {"age", "lwt", "race", "smoke", "ptl"};
  spec.categorical = {"race"};
  spec.splineKnots = {{"age", 4}};
  const Table table = readCsvFile(testing::birthwtPath(), CsvOptions{}).table;
  const CohortFit kept = fitCohortModel(table, spec);

  Table owned = readCsvFile(testing::birthwtPath(), CsvOptions{}).table;
  const CohortFit released = fitCohortModel(std::move(owned), spec);

  ASSERT_EQ(kept.model.terms.size(), released.model.terms.size());
  EXPECT_EQ(kept.model.intercept.coefficient, released.model.intercept.coefficient);
  for (std::size_t j = 0; j < kept.model.terms.size(); ++j) {
    EXPECT_EQ(kept.model.terms[j].name, released.model.terms[j].name);
    EXPECT_EQ(kept.model.terms[j].estimate.coefficient,
              released.model.terms[j].estimate.coefficient)
        << kept.model.terms[j].name;
    EXPECT_EQ(kept.model.terms[j].estimate.se, released.model.terms[j].estimate.se);
  }
  ASSERT_TRUE(kept.model.development.analysedSha256.has_value());
  EXPECT_EQ(kept.model.development.analysedSha256, released.model.development.analysedSha256);
  EXPECT_EQ(kept.fit.deviance, released.fit.deviance);
  // The spline's three terms all read 'age': it was still there for the last of them.
  EXPECT_EQ(kept.model.terms.size(), 3u + 1u + 2u + 1u + 1u);
}

}  // namespace
}  // namespace calivera
