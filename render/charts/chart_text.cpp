#include "render/charts/chart_text.h"

#include <algorithm>
#include <cmath>

namespace calivera {

QString fixed(double value, int decimals) {
  if (std::isnan(value)) return QStringLiteral("not defined");
  if (std::isinf(value)) return value > 0 ? QStringLiteral("∞") : QStringLiteral("−∞");
  QString text = QString::number(value, 'f', decimals);
  // A tiny negative number rounds to "-0.000", which reads as a sign that means something.
  if (text.startsWith(QLatin1Char('-')) &&
      std::all_of(text.begin() + 1, text.end(), [](QChar c) { return c == '0' || c == '.'; })) {
    text.remove(0, 1);
  }
  return text;
}

QString withInterval(double value, double lo, double hi, int decimals) {
  return QStringLiteral("%1 (%2 to %3)")
      .arg(fixed(value, decimals), fixed(lo, decimals), fixed(hi, decimals));
}

}  // namespace calivera
