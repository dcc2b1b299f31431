#include "ui/settings_history.h"

#include "ui/study_controller.h"

namespace calivera::ui {

StudySettings settingsOf(const StudyState& study) {
  StudySettings s;
  s.threshold = study.analysis.threshold;
  s.reasonableLo = study.analysis.reasonableLo;
  s.reasonableHi = study.analysis.reasonableHi;
  s.groups = study.analysis.groups;
  s.apparent = study.analysis.apparent;
  s.predictorView = study.predictorView;
  s.heldValues = study.heldValues;
  s.columnMapping = study.columnMapping;
  s.levelMapping = study.levelMapping;
  s.missingData = study.missingData;
  return s;
}

void applySettings(const StudySettings& settings, StudyState& study) {
  study.analysis.threshold = settings.threshold;
  study.analysis.reasonableLo = settings.reasonableLo;
  study.analysis.reasonableHi = settings.reasonableHi;
  study.analysis.groups = settings.groups;
  study.analysis.apparent = settings.apparent;
  study.predictorView = settings.predictorView;
  study.heldValues = settings.heldValues;
  study.columnMapping = settings.columnMapping;
  study.levelMapping = settings.levelMapping;
  study.missingData = settings.missingData;
}

SettingsCommand::SettingsCommand(StudyController* controller, StudySettings before,
                                 StudySettings after, const QString& text, Kind kind)
    : controller_(controller),
      before_(std::move(before)),
      after_(std::move(after)),
      kind_(kind),
      when_(std::chrono::steady_clock::now()) {
  setText(text);
}

void SettingsCommand::undo() {
  controller_->restoreSettings(before_);
}

void SettingsCommand::redo() {
  if (!pushed_) {
    pushed_ = true;  // pushed after the change was made
    return;
  }
  controller_->restoreSettings(after_);
}

bool SettingsCommand::mergeWith(const QUndoCommand* other) {
  const auto* next = dynamic_cast<const SettingsCommand*>(other);
  if (next == nullptr || kind_ != Threshold || next->kind_ != Threshold) return false;
  if (next->when_ - when_ > std::chrono::milliseconds(kThresholdMergeMs)) return false;
  after_ = next->after_;
  when_ = next->when_;
  setText(next->text());
  return true;
}

}  // namespace calivera::ui
