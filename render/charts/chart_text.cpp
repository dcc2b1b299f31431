#include "render/charts/chart_text.h"

#include "core/present/number_text.h"

namespace calivera {

QString fixed(double value, int decimals) {
  return QString::fromStdString(formatNumber(value, decimals));  // core/present/number_text.h
}

QString withInterval(double value, double lo, double hi, int decimals) {
  return QStringLiteral("%1 (%2 to %3)")
      .arg(fixed(value, decimals), fixed(lo, decimals), fixed(hi, decimals));
}

}  // namespace calivera
