#pragma once
// "Reproduce on the command line": the one command (core/study/reproduce_command.h) that gives
// every number the workstation shows for the current study, and the command for the Predictor
// space view's curve or boundary, each read-only with a Copy button.

#include <QString>

class QWidget;

namespace calivera {
struct StudyState;
}

namespace calivera::ui {

// The command for `study`, or the reason there is none yet (no cohort, outcome or model).
QString reproduceCommandText(const StudyState& study, bool* ok = nullptr);

// The `calivera predictor-space ...` line of the study's Predictor space view; empty when there
// is none (no predictor chosen yet, a risk column, no model).
QString predictorSpaceCommandText(const StudyState& study);

void showReproduceDialog(QWidget* parent, const StudyState& study);

}  // namespace calivera::ui
