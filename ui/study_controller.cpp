#include "ui/study_controller.h"

#include <exception>
#include <filesystem>
#include <functional>
#include <utility>

#include "core/study/study_file.h"
#include "core/study/study_uncertainty.h"
#include "core/util/sha256.h"
#include "ui/async/background_job.h"

namespace calivera::ui {

namespace {

QString toQ(const std::string& s) {
  return QString::fromStdString(s);
}

std::string absolutePath(const QString& path) {
  return std::filesystem::absolute(path.toStdString()).string();
}

}  // namespace

StudyController::StudyController(QObject* parent) : QObject(parent) {
  setObjectName(QStringLiteral("studyController"));
  job_ = new BackgroundJob(this);
  job_->setObjectName(QStringLiteral("backgroundJob"));
  undoStack_ = new QUndoStack(this);
  undoStack_->setObjectName(QStringLiteral("settingsUndoStack"));
}

StudyController::~StudyController() {
  // The stack is deleted with this object and says its index changed as it clears; its
  // listeners (the window, which owns this controller) are already being destroyed.
  undoStack_->blockSignals(true);
}

bool StudyController::refuseWhileBusy() {
  if (!job_->isRunning()) return false;
  emit message(tr("Another computation is still running; wait for it or cancel it."), true);
  return true;
}

std::string StudyController::snapshot() const {
  // A fixed study path: only equality matters, and relative paths must not change the text.
  return study_.data || study_.model ? studyToJson(study_, "/snapshot.cvstudy") : std::string();
}

void StudyController::updateModified() {
  const bool now = snapshot() != savedSnapshot_;
  if (now == modified_) return;
  modified_ = now;
  emit modifiedChanged(modified_);
}

void StudyController::markSaved() {
  savedSnapshot_ = snapshot();
  updateModified();
}

bool StudyController::startPipeline(PipelineRequest request, const QString& description,
                                    const QString& studyPathOnSuccess, const QString& leadNote,
                                    RunHistory history) {
  if (refuseWhileBusy()) return false;
  std::function<PipelineOutput(const ProgressCallback&)> work =
      [request = std::move(request)](const ProgressCallback& progress) {
        return runPipeline(request, progress);
      };
  std::function<void(PipelineOutput&)> done = [this, studyPathOnSuccess, leadNote,
                                               history](PipelineOutput& out) {
    if (history.clear) undoStack_->clear();
    applyPipeline(out, studyPathOnSuccess, leadNote);
    if (history.before) {
      recordSettings(*history.before, history.text);
    }
  };
  return job_->start<PipelineOutput>(description, work, done);
}

void StudyController::applyPipeline(PipelineOutput& output, const QString& studyPathOnSuccess,
                                    const QString& leadNote) {
  study_ = std::move(output.study);
  table_ = output.table;
  cohort_ = output.cohort;
  if (cohort_) {
    threshold_.setData(cohort_->risk(), cohort_->outcome());
  } else {
    threshold_.clear();
  }
  threshold_.setThreshold(study_.analysis.threshold);
  if (!studyPathOnSuccess.isEmpty()) {
    studyPath_ = studyPathOnSuccess;
    savedSnapshot_ = snapshot();  // as opened: recorded fingerprints refreshed by the run
    emit studyPathChanged(studyPath_);
  }
  updateModified();
  emit resultsChanged();

  QString text = leadNote;
  const auto add = [&text](const QString& line) { text += (text.isEmpty() ? "" : "\n") + line; };
  for (const auto& w : output.inputWarnings) add(toQ(w));
  if (!output.inputWarnings.empty()) {
    add(tr("Results are recomputed from the files as they are now."));
  }
  for (const auto& p : output.problems) add(toQ(p));
  for (const auto& n : output.notes) add(toQ(n));
  if (!text.isEmpty()) {
    emit message(text, !output.inputWarnings.empty() || !output.problems.empty());
  } else if (study_.result) {
    emit messageCleared();
  }
}

bool StudyController::openStudy(const QString& path) {
  StudyState candidate;
  try {
    candidate = readStudyFile(path.toStdString());
  } catch (const std::exception& e) {
    emit message(tr("Could not open the study: %1").arg(toQ(e.what())), true);
    return false;
  }
  PipelineRequest request;
  request.study = std::move(candidate);
  request.withUncertainty = true;      // recompute what the study's uncertainty settings ask for
  request.checkRecordedInputs = true;  // hashed on the worker, reported with the results
  return startPipeline(std::move(request), tr("Opening study"), path);
}

bool StudyController::saveStudy(const QString& path) {
  try {
    writeStudyFile(path.toStdString(), study_);
  } catch (const std::exception& e) {
    emit message(tr("Could not save the study: %1").arg(toQ(e.what())), true);
    return false;
  }
  studyPath_ = path;
  markSaved();
  emit studyPathChanged(studyPath_);
  emit message(tr("Study saved to %1").arg(path), false);
  return true;
}

std::optional<FileFingerprint> StudyController::savedStudyFile() const {
  if (studyPath_.isEmpty() || modified_) return std::nullopt;
  try {
    return FileFingerprint{studyPath_.toStdString(), sha256OfFile(studyPath_.toStdString())};
  } catch (const std::exception&) {
    return std::nullopt;  // moved or deleted since: the report names no study file
  }
}

bool StudyController::newStudy() {
  if (refuseWhileBusy()) return false;
  study_ = StudyState{};
  studyPath_.clear();
  table_.reset();
  cohort_.reset();
  threshold_.clear();
  threshold_.setThreshold(study_.analysis.threshold);
  savedSnapshot_.clear();
  undoStack_->clear();
  updateModified();
  emit studyPathChanged(studyPath_);
  emit resultsChanged();
  emit messageCleared();
  return true;
}

bool StudyController::importCohort(const QString& path, const ImportSettings& settings,
                                   std::shared_ptr<const Table> loaded,
                                   const std::optional<DatabaseSelection>& database) {
  PipelineRequest request;
  request.study = study_;
  request.study.data = database ? InputFileRecord{path.toStdString(), {}, database}
                                : InputFileRecord{absolutePath(path), {}};
  request.study.import = settings;
  request.table = std::move(loaded);
  if (request.study.modelSource == ModelSource::Fitted) {
    request.study.modelSource = ModelSource::None;  // a fit belongs to its own cohort
    request.study.model.reset();
  }
  return startPipeline(std::move(request), tr("Reading cohort"), {});
}

bool StudyController::openInputs(const QString& data, const QString& model,
                                 const ImportSettings& settings) {
  PipelineRequest request;
  request.study.data = InputFileRecord{absolutePath(data), {}};
  request.study.import = settings;
  if (!model.isEmpty()) {
    request.study.modelSource = ModelSource::File;
    request.study.modelFile = InputFileRecord{model.toStdString(), {}};
  }
  return startPipeline(std::move(request), tr("Opening cohort and model"), {});
}

bool StudyController::loadModelFile(const QString& path) {
  if (!study_.data) {
    emit message(tr("Import a cohort first (File → Import cohort), then load the model."), true);
    return false;
  }
  PipelineRequest request;
  request.study = study_;
  request.study.modelSource = ModelSource::File;
  request.study.modelFile = InputFileRecord{path.toStdString(), {}};
  request.study.model.reset();
  request.study.columnMapping.clear();
  request.table = table_;
  return startPipeline(std::move(request), tr("Loading model and validating"), {});
}

bool StudyController::validateUpdatedModel(const QString& path) {
  if (!study_.data) return false;
  // The updated model is judged on the patients it was updated on: apparent performance, said in
  // every view and the report (the development-data statement), with the study's bootstrap,
  // comparison and subgroups recomputed for it rather than dropped.
  PipelineRequest request;
  request.study = study_;
  request.study.modelSource = ModelSource::File;
  request.study.modelFile = InputFileRecord{path.toStdString(), {}};
  request.study.model.reset();
  request.study.columnMapping.clear();  // the updated model file carries the mapping it used
  request.study.analysis.apparent = true;
  request.table = table_;
  request.withUncertainty = true;
  const QString why =
      tr("The updated model is shown on the patients it was updated on: this is apparent "
         "performance (\"Cohort is the development data\" is ticked), optimistic by "
         "construction; a recalibration has slope 1 and intercept 0 here. Validate it on other "
         "patients before relying on it.");
  return startPipeline(std::move(request), tr("Validating the updated model"), {}, why);
}

bool StudyController::useFittedModel(const FitSettings& fit, const Model& model,
                                     const std::vector<std::string>& warnings) {
  PipelineRequest request;
  request.study = study_;
  request.study.modelSource = ModelSource::Fitted;
  request.study.fit = fit;
  request.study.model = model;
  request.study.modelWarnings = warnings;
  request.study.modelFile.reset();
  request.study.columnMapping.clear();
  request.table = table_;
  return startPipeline(std::move(request), tr("Validating the fitted model"), {});
}

bool StudyController::setColumnMapping(
    const std::map<std::string, std::string>& mapping,
    const std::map<std::string, std::map<std::string, std::string>>& levels) {
  PipelineRequest request;
  request.study = study_;
  request.study.columnMapping = mapping;
  request.study.levelMapping = levels;
  request.table = table_;
  return startPipeline(std::move(request), tr("Validating"), {}, {},
                       RunHistory{false, settingsOf(study_), tr("Variable mapping")});
}

bool StudyController::setMissingData(const MissingDataSettings& settings) {
  if (!settings.isValid()) {
    emit message(tr("The missing-data settings are out of range."), true);
    return false;
  }
  if (!study_.data) {
    emit message(tr("Import a cohort first (File → Import cohort)."), true);
    return false;
  }
  PipelineRequest request;
  request.study = study_;
  request.study.missingData = settings;
  request.table = table_;
  return startPipeline(std::move(request),
                       settings.imputesHere() ? tr("Imputing and validating") : tr("Validating"),
                       {}, {}, RunHistory{false, settingsOf(study_), tr("missing-data handling")});
}

bool StudyController::runValidation() {
  if (!study_.data) {
    emit message(tr("Import a cohort first (File → Import cohort)."), true);
    return false;
  }
  PipelineRequest request;
  request.study = study_;
  request.table = table_;
  return startPipeline(std::move(request), tr("Validating"), {}, {}, RunHistory{false, {}, {}});
}

bool StudyController::runUncertainty(const UncertaintySettings& settings) {
  if (refuseWhileBusy()) return false;
  if (!study_.result || !cohort_) {
    emit message(tr("Run the validation first (Analysis → Run validation)."), true);
    return false;
  }
  std::function<UncertaintyResults(const ProgressCallback&)> work =
      [cohort = cohort_, result = study_.result, settings](const ProgressCallback& progress) {
        return computeUncertainty(*cohort, *result, settings, progress);
      };
  std::function<void(UncertaintyResults&)> done =
      [this, settings, basis = validationBasis(study_)](UncertaintyResults& results) {
        study_.uncertaintySettings = withComparedHashes(settings, results);
        study_.uncertaintyBasis = basis;
        study_.uncertainty = std::make_shared<const UncertaintyResults>(std::move(results));
        updateModified();
        emit resultsChanged();
        emit messageCleared();
      };
  return job_->start<UncertaintyResults>(tr("Intervals, comparison and subgroups"), work, done);
}

void StudyController::setThreshold(double threshold) {
  const StudySettings before = settingsOf(study_);
  threshold_.setThreshold(threshold);
  study_.analysis.threshold = threshold_.threshold();
  updateModified();
  emit thresholdChanged(threshold_.threshold());
  recordSettings(before, tr("threshold %1").arg(study_.analysis.threshold, 0, 'f', 3),
                 SettingsCommand::Threshold);
}

bool StudyController::nudgeThreshold(int steps) {
  if (!threshold_.nudge(steps)) return false;
  setThreshold(threshold_.threshold());
  return true;
}

void StudyController::setReasonableRange(double lo, double hi) {
  const StudySettings before = settingsOf(study_);
  study_.analysis.reasonableLo = lo;
  study_.analysis.reasonableHi = hi;
  updateModified();
  emit resultsChanged();
  recordSettings(before, tr("reasonable range"));
}

void StudyController::setGroups(int groups) {
  const StudySettings before = settingsOf(study_);
  study_.analysis.groups = groups;
  updateModified();
  recordSettings(before, tr("risk groups %1").arg(groups));
}

void StudyController::setApparent(bool apparent) {
  const StudySettings before = settingsOf(study_);
  study_.analysis.apparent = apparent;
  updateModified();
  recordSettings(before, tr("development-data statement"));
}

void StudyController::setReportSettings(const ReportSettings& report) {
  study_.report = report;
  updateModified();
}

void StudyController::setPredictorViewChoices(const std::vector<std::string>& chosen,
                                              const std::map<std::string, std::string>& held) {
  const StudySettings before = settingsOf(study_);
  study_.predictorView = chosen;
  study_.heldValues = held;
  updateModified();
  recordSettings(before, tr("predictor-space choices"));
}

void StudyController::recordSettings(const StudySettings& before, const QString& text,
                                     SettingsCommand::Kind kind) {
  if (restoring_) return;
  StudySettings after = settingsOf(study_);
  if (after == before) return;
  undoStack_->push(new SettingsCommand(this, before, std::move(after), text, kind));
}

bool StudyController::undo() {
  if (refuseWhileBusy() || !undoStack_->canUndo()) return false;
  undoStack_->undo();
  return true;
}

bool StudyController::redo() {
  if (refuseWhileBusy() || !undoStack_->canRedo()) return false;
  undoStack_->redo();
  return true;
}

void StudyController::restoreSettings(const StudySettings& settings) {
  const StudySettings now = settingsOf(study_);
  if (settings.columnMapping != now.columnMapping || settings.levelMapping != now.levelMapping ||
      settings.missingData != now.missingData) {
    // A mapping decides which columns are analysed, the missing-data handling what is pooled:
    // restore them through a run, keeping the history (this is the history moving).
    PipelineRequest request;
    request.study = study_;
    applySettings(settings, request.study);
    request.table = table_;
    startPipeline(std::move(request), tr("Validating"), {}, {}, RunHistory{false, {}, {}});
    return;
  }
  StudySettings thresholdOnly = now;
  thresholdOnly.threshold = settings.threshold;
  restoring_ = true;
  applySettings(settings, study_);
  threshold_.setThreshold(study_.analysis.threshold);
  study_.analysis.threshold = threshold_.threshold();
  updateModified();
  if (thresholdOnly == settings) {
    emit thresholdChanged(threshold_.threshold());
  } else {
    emit resultsChanged();
  }
  restoring_ = false;
}

}  // namespace calivera::ui
