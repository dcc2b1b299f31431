#pragma once
// "Reproduce on the command line": the one command (core/study/reproduce_command.h) that gives
// every number the workstation shows for the current study, read-only, with a Copy button.

#include <QString>

class QWidget;

namespace calivera {
struct StudyState;
}

namespace calivera::ui {

// The command for `study`, or the reason there is none yet (no cohort, outcome or model).
QString reproduceCommandText(const StudyState& study, bool* ok = nullptr);

void showReproduceDialog(QWidget* parent, const StudyState& study);

}  // namespace calivera::ui
