#include "ui/views/caution_text.h"

#include <QCoreApplication>

#include "core/present/caution.h"

namespace calivera::ui {

QString cautionText() {
  return QCoreApplication::translate("calivera", "Caution: %1")
      .arg(QString::fromUtf8(kCautionText));
}

}  // namespace calivera::ui
