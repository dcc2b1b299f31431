#pragma once
// The caution shown in the workstation banner (always visible, not dismissible) and in reports.

#include <QString>

class QLabel;
class QWidget;

namespace calivera::ui {

QString cautionText();

// The banner every workstation window shows at its top: always visible, never dismissible.
QLabel* makeCautionBanner(QWidget* parent);

}  // namespace calivera::ui
