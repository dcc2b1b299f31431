#include "ui/views/caution_text.h"

#include <QCoreApplication>

namespace calivera::ui {

QString cautionText() {
  return QCoreApplication::translate(
      "calivera",
      "Caution: these results describe how the model performs on this cohort only. "
      "They do not replace clinical judgment. Any use in patient care is a decision "
      "for local clinical governance and licensed practice under local regulations.");
}

}  // namespace calivera::ui
