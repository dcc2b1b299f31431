#pragma once
// The fit dialog's spline field as text: "age=4, bmi=3" <-> {age: 4, bmi: 3}, the same
// COLUMN=KNOTS form as `calivera fit --spline`. Plain functions, testable without widgets.

#include <map>
#include <string>

namespace calivera {

// Throws InputError naming the item that is not COLUMN=KNOTS with 3 to 7 knots, or a column
// given twice. Empty text: no splines.
std::map<std::string, int> parseSplineList(const std::string& text);
std::string formatSplineList(const std::map<std::string, int>& splines);

}  // namespace calivera
