// The Model menu's tools that work on the study's model and its analysed patients: internal
// validation (bootstrap optimism) and model updating. Each runs in its own dialog with its own
// background job; a model file they save can be validated in the study straight away.
#include "core/uncertainty/internal_validation.h"
#include "ui/async/background_job.h"
#include "ui/dialogs/internal_validation_dialog.h"
#include "ui/dialogs/model_update_dialog.h"
#include "ui/main_window.h"

namespace calivera::ui {

void MainWindow::onInternalValidation() {
  if (!study_.model || !cohort_ || !study_.data) return;
  // Refused before the dialog opens, with the reason: optimism correction of a model that was
  // not developed on this cohort would report "corrected" figures that mean nothing.
  if (const std::string refusal = internalValidationRefusal(*study_.model, study_.data->sha256,
                                                            cohort_->run->request.developmentData);
      !refusal.empty()) {
    showMessage(tr("Internal validation not run: %1.").arg(QString::fromStdString(refusal)), true);
    return;
  }
  InternalValidationDialog dialog(*study_.model, cohort_, *study_.data, this);
  connect(&dialog, &InternalValidationDialog::modelSaved, this, [this](const QString& path) {
    showMessage(tr("Shrunk model saved as %1. Load it (Model → Load model file) to validate it "
                   "on other patients.")
                    .arg(path),
                false);
  });
  dialog.exec();
}

void MainWindow::onUpdateModel() {
  if (!study_.model || !cohort_ || !study_.data) return;
  ModelUpdateDialog dialog(*study_.model, cohort_, *study_.data, this);
  QString toValidate;
  connect(&dialog, &ModelUpdateDialog::modelSaved, this,
          [this, &toValidate](const QString& path, bool useInStudy) {
            if (useInStudy) toValidate = path;
            showMessage(tr("Updated model saved as %1.").arg(path), false);
          });
  dialog.exec();
  // After the dialog closes, so its job is done and the window's own job can start.
  if (!toValidate.isEmpty()) validateUpdatedModel(toValidate);
}

bool MainWindow::validateUpdatedModel(const QString& path) {
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
  const bool started = startPipeline(request, tr("Validating the updated model"), {});
  if (started) {
    const QString why =
        tr("The updated model is shown on the patients it was updated on: this is apparent "
           "performance (\"Cohort is the development data\" is ticked), optimistic by "
           "construction; a recalibration has slope 1 and intercept 0 here. Validate it on other "
           "patients before relying on it.");
    connect(
        job_, &BackgroundJob::finished, this,
        [this, why]() {
          showMessage(why + (messageText().isEmpty() ? QString() : "\n" + messageText()), false);
        },
        Qt::SingleShotConnection);
  }
  return started;
}

}  // namespace calivera::ui
