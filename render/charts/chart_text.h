#pragma once
// Number formatting shared by chart titles, tooltips, panels and tables: fixed decimals, and
// "not defined" for NaN (a proportion with a zero denominator).

#include <QString>

namespace calivera {

QString fixed(double value, int decimals);
// "0.812 (0.771 to 0.848)"
QString withInterval(double value, double lo, double hi, int decimals);

}  // namespace calivera
