// Restricted cubic spline basis against values computed in R from Harrell's published formula
// (tests/reference/scripts/rcs_basis.R; an independent implementation of the formula, since
// Hmisc is not installed).
#include <gtest/gtest.h>

#include "core/model/linear_predictor.h"
#include "tests/reference/reference_csv.h"
#include "tests/unit/table_fixture.h"

namespace calivera {
namespace {

TEST(SplineReference, BasisMatchesHarrellFormulaInR) {
  auto columns = testing::readColumns(testing::referencePath("rcs_basis.csv"));
  const std::size_t n = columns["x"].size();
  ASSERT_EQ(n, 33u);
  for (const bool scaled : {true, false}) {
    for (std::size_t i = 0; i < n; ++i) {
      Model model;
      Term spline;
      spline.name = "s";
      spline.variable = "x";
      spline.kind = TransformKind::Spline;
      spline.knots = {23, 41.5, 55, 68, 82};
      spline.basisIndex = std::stoi(columns["basis"][i]);
      spline.splineScaled = scaled;
      spline.estimate.coefficient = 1.0;
      model.terms = {spline};
      const Table table =
          testing::makeTable({testing::numericColumn("x", {std::stod(columns["x"][i])})});
      const double value = linearPredictor(model, table, {0})[0];
      const double expected = std::stod(columns[scaled ? "scaled" : "unscaled"][i]);
      EXPECT_NEAR(value, expected, 1e-12 * std::max(1.0, std::abs(expected))) << i;
    }
  }
}

}  // namespace
}  // namespace calivera
