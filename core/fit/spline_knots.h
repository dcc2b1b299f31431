#pragma once
// Default knots of a restricted cubic spline fitted by Calivera: the sample quantiles (type 7,
// Hyndman & Fan 1996) of the predictor at the probabilities Harrell recommends for k knots
// (Harrell, Regression Modeling Strategies, 2nd ed. 2015, section 2.4.6; the table is quoted
// from memory, common practice):
//   k = 3: .10 .50 .90            k = 4: .05 .35 .65 .95
//   k = 5: .05 .275 .50 .725 .95  k = 6: .05 .23 .41 .59 .77 .95
//   k = 7: .025 .1833 .3417 .50 .6583 .8167 .975
// Unlike some implementations, no special rule applies to small samples.
//
// Edge cases: k outside 3..7 -> InputError; fewer distinct knots than k (heavily tied values)
// -> AnalysisError naming the column, since the spline's basis would be degenerate.

#include <string>
#include <vector>

namespace calivera {

inline constexpr int kMinSplineKnots = 3;
inline constexpr int kMaxSplineKnots = 7;

std::vector<double> defaultSplineKnots(std::vector<double> values, int knots,
                                       const std::string& column);

}  // namespace calivera
