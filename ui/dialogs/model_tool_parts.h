#pragma once
// Pieces shared by the Model menu's tool dialogs (internal validation, model updating): the
// analysed patients as core's UpdateData, the explanatory text at the top, and a status line
// that reports a failed or cancelled background job.

#include <QString>

#include "core/study/study_analysis.h"
#include "core/uncertainty/model_update.h"

class QBoxLayout;
class QLabel;

namespace calivera::ui {

class BackgroundJob;

// A word-wrapped paragraph added to `layout`.
QLabel* addIntroText(QBoxLayout* layout, const QString& text, const QString& objectName);

// A selectable, word-wrapped status label added to `layout` that says why `job` stopped.
QLabel* addJobStatus(QBoxLayout* layout, BackgroundJob* job, const QString& initialText,
                     const QString& objectName);

}  // namespace calivera::ui
