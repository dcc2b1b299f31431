#pragma once
// Edit → Undo / Redo for the study's settings: the threshold, the reasonable range, the number of
// risk groups, the development-data statement, the predictor-space choices and the variable
// mapping. Inputs (cohort, model, a fit, an update) are not undone: changing one starts a new
// history, as opening or starting a study does, because the earlier settings may not apply to
// the new inputs (a mapping names the old model's variables).
//
// Threshold moves within kThresholdMergeMs of each other (a drag, held arrow keys) are one step,
// so Undo goes back to where the threshold was before the gesture, not one pixel.

#include <QString>
#include <QUndoCommand>
#include <chrono>
#include <map>
#include <string>
#include <vector>

#include "core/study/study.h"

namespace calivera::ui {

class StudyController;

// The undoable settings of a study, as one value.
struct StudySettings {
  double threshold = 0.0;
  double reasonableLo = 0.0;
  double reasonableHi = 0.0;
  int groups = 0;
  bool apparent = false;
  std::vector<std::string> predictorView;
  std::map<std::string, std::string> heldValues;
  std::map<std::string, std::string> columnMapping;
  std::map<std::string, std::map<std::string, std::string>> levelMapping;
  MissingDataSettings missingData;

  bool operator==(const StudySettings&) const = default;
};

StudySettings settingsOf(const StudyState& study);
// `study` with `settings` in place of its own.
void applySettings(const StudySettings& settings, StudyState& study);

inline constexpr int kThresholdMergeMs = 1500;

// One change on the undo stack. The change has already been made when it is pushed: the first
// redo() (QUndoStack::push calls it) does nothing.
class SettingsCommand : public QUndoCommand {
 public:
  enum Kind { Threshold = 1, Other = 2 };
  SettingsCommand(StudyController* controller, StudySettings before, StudySettings after,
                  const QString& text, Kind kind);
  void undo() override;
  void redo() override;
  int id() const override { return kind_ == Threshold ? Threshold : -1; }
  bool mergeWith(const QUndoCommand* other) override;

 private:
  StudyController* controller_;
  StudySettings before_;
  StudySettings after_;
  Kind kind_;
  bool pushed_ = false;
  std::chrono::steady_clock::time_point when_;
};

}  // namespace calivera::ui
