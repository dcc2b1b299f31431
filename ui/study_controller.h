#pragma once
// The workstation's one owner of the study: its settings and inputs (StudyState), the loaded
// table and analysed cohort of the current run, the threshold, and the background job that
// replaces them. Every change goes through here; the window and its views only observe:
//   resultsChanged()     the study, its run, its uncertainty results or its reasonable range
//                        changed — rebuild every view, at the current threshold;
//   thresholdChanged()   only the threshold moved — update the linked views' markers;
//   studyPathChanged()   the study now lives in a file (opened or saved);
//   modifiedChanged()    the study differs from (or again equals) what was last opened or saved:
//                        any setting, input or choice the study file records, the threshold too;
//   message()            something to tell the user (error or note), cleared by messageCleared().
//
// No widgets: the controller can be driven and checked without a window. Heavy work runs on the
// job's worker thread through core's runPipeline / computeUncertainty, the same functions the
// command line calls (core/study/study_pipeline.h); a failing or cancelled run leaves the current
// study untouched.

#include <QObject>
#include <QString>
#include <QUndoStack>
#include <map>
#include <memory>
#include <string>
#include <vector>

#include "core/report/audit_report.h"
#include "core/study/study.h"
#include "core/study/study_pipeline.h"
#include "core/study/threshold_state.h"
#include "ui/settings_history.h"

namespace calivera::ui {

class BackgroundJob;

// What a successful run does to the settings' undo history: a run on new inputs starts a new
// history; a mapping change is one undoable step from `before`.
struct RunHistory {
  bool clear = true;
  std::optional<StudySettings> before;
  QString text;  // the undo step's name (with `before`)
};

class StudyController : public QObject {
  Q_OBJECT

 public:
  explicit StudyController(QObject* parent = nullptr);
  ~StudyController() override;

  // Each starts a background run and returns false when refused (a job is running, an input is
  // missing or unreadable), with a message() saying why. The result arrives asynchronously
  // (job()->finished()).
  bool openStudy(const QString& path);
  // Cohort and model in one run (the command line's --data/--model); model may be empty.
  bool openInputs(const QString& data, const QString& model, const ImportSettings& settings);
  // `database`: the table or query when `path` is a PostgreSQL URI (kept as given, not made a
  // file path).
  bool importCohort(const QString& path, const ImportSettings& settings,
                    std::shared_ptr<const Table> loaded = nullptr,
                    const std::optional<DatabaseSelection>& database = std::nullopt);
  bool loadModelFile(const QString& path);
  // A model file saved by the update dialog, validated on the same patients: marked apparent,
  // with the study's uncertainty settings run again for it.
  bool validateUpdatedModel(const QString& path);
  bool useFittedModel(const FitSettings& fit, const Model& model,
                      const std::vector<std::string>& warnings);
  // Model variable -> cohort column, and model variable -> (cohort level -> model level).
  bool setColumnMapping(const std::map<std::string, std::string>& mapping,
                        const std::map<std::string, std::map<std::string, std::string>>& levels);
  bool runValidation();
  // How missing values are handled (complete cases, stacked copies, copies imputed here): a run
  // with the new settings, one undoable step; a failing run keeps the current ones.
  bool setMissingData(const MissingDataSettings& settings);
  // Bootstrap intervals and bands, comparison and subgroups on the current run. Success replaces
  // study().uncertainty and study().uncertaintySettings; cancel or failure keeps the previous
  // results, with a message.
  bool runUncertainty(const UncertaintySettings& settings);

  // Synchronous; false with a message when the file cannot be written.
  bool saveStudy(const QString& path);
  // An empty study: no inputs, default settings, no file. Refused while a job runs.
  bool newStudy();
  // True when saving would write something other than the study as last opened or saved (an
  // empty study is never modified; one with inputs but never saved always is).
  bool isModified() const { return modified_; }
  // The study file with its SHA-256 when the study is saved and unchanged since (what a report
  // may name as its study); empty otherwise.
  std::optional<FileFingerprint> savedStudyFile() const;

  // Settings that take effect at once (threshold, reasonable range, predictor-view choices) or at
  // the next run (groups, the development-data statement).
  void setThreshold(double threshold);
  // Moves the threshold by `steps` steps of its grid; false when it cannot move.
  bool nudgeThreshold(int steps);
  void setReasonableRange(double lo, double hi);
  void setGroups(int groups);
  void setApparent(bool apparent);
  // What the report export dialog last wrote; saved with the study for `calivera run --pdf`.
  void setReportSettings(const ReportSettings& report);
  void setPredictorViewChoices(const std::vector<std::string>& chosen,
                               const std::map<std::string, std::string>& held);

  // Edit → Undo / Redo of the settings (settings_history.h). Refused with a message while a job
  // runs (an undone mapping starts a run). The stack is cleared when the inputs change.
  QUndoStack* undoStack() const { return undoStack_; }
  bool undo();
  bool redo();
  // Puts `settings` in place (SettingsCommand calls this): at once for the threshold and the
  // settings used at the next run, through a run for a changed mapping.
  void restoreSettings(const StudySettings& settings);

  const StudyState& study() const { return study_; }
  const ThresholdState& thresholdState() const { return threshold_; }
  std::shared_ptr<const CohortData> cohort() const { return cohort_; }
  std::shared_ptr<const Table> table() const { return table_; }
  BackgroundJob* job() const { return job_; }
  QString studyPath() const { return studyPath_; }

 signals:
  void resultsChanged();
  void thresholdChanged(double threshold);
  void studyPathChanged(const QString& path);
  void modifiedChanged(bool modified);
  void message(const QString& text, bool error);
  void messageCleared();

 private:
  // `leadNote` is said before the run's own notes when it succeeds.
  bool startPipeline(PipelineRequest request, const QString& description,
                     const QString& studyPathOnSuccess, const QString& leadNote = {},
                     RunHistory history = RunHistory{});
  // Pushes the change from `before` to the current settings (nothing when equal or restoring).
  void recordSettings(const StudySettings& before, const QString& text,
                      SettingsCommand::Kind kind = SettingsCommand::Other);
  void applyPipeline(PipelineOutput& output, const QString& studyPathOnSuccess,
                     const QString& leadNote);
  bool refuseWhileBusy();
  // The study as its file would record it (empty for a study without inputs).
  std::string snapshot() const;
  // Compares with the last opened or saved snapshot; emits modifiedChanged on a change.
  void updateModified();
  void markSaved();

  StudyState study_;
  QString studyPath_;
  std::shared_ptr<const Table> table_;
  std::shared_ptr<const CohortData> cohort_;
  ThresholdState threshold_;
  BackgroundJob* job_ = nullptr;
  std::string savedSnapshot_;
  bool modified_ = false;
  QUndoStack* undoStack_ = nullptr;
  bool restoring_ = false;
};

}  // namespace calivera::ui
