#pragma once
// The caution shown in the workstation banner (always visible, not dismissible) and in reports.

#include <QString>

namespace calivera::ui {

QString cautionText();

}  // namespace calivera::ui
