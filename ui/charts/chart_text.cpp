#include "ui/charts/chart_text.h"

#include <cmath>

namespace calivera::ui {

QString fixed(double value, int decimals) {
  if (std::isnan(value)) return QStringLiteral("not defined");
  if (std::isinf(value)) return value > 0 ? QStringLiteral("∞") : QStringLiteral("−∞");
  return QString::number(value, 'f', decimals);
}

QString withInterval(double value, double lo, double hi, int decimals) {
  return QStringLiteral("%1 (%2 to %3)")
      .arg(fixed(value, decimals), fixed(lo, decimals), fixed(hi, decimals));
}

}  // namespace calivera::ui
