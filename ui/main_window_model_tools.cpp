// The Model menu's tools that work on the study's model and its analysed patients: internal
// validation (bootstrap optimism) and model updating. Each runs in its own dialog with its own
// background job; a model file they save can be validated in the study straight away.
#include "core/uncertainty/internal_validation.h"
#include "ui/dialogs/internal_validation_dialog.h"
#include "ui/dialogs/model_update_dialog.h"
#include "ui/main_window.h"
#include "ui/study_controller.h"

namespace calivera::ui {

void MainWindow::onInternalValidation() {
  if (!study().model || !controller_->cohort() || !study().data) return;
  // Refused before the dialog opens, with the reason: optimism correction of a model that was
  // not developed on this cohort would report "corrected" figures that mean nothing.
  if (const std::string refusal = internalValidationRefusal(
          *study().model, study().data->sha256, controller_->cohort()->run->request.developmentData,
          controller_->cohort()->run->analysedSha256);
      !refusal.empty()) {
    showMessage(tr("Internal validation not run: %1.").arg(QString::fromStdString(refusal)), true);
    return;
  }
  InternalValidationDialog dialog(*study().model, controller_->cohort(), *study().data, this);
  connect(&dialog, &InternalValidationDialog::modelSaved, this, [this](const QString& path) {
    showMessage(tr("Shrunk model saved as %1. Load it (Model → Load model file) to validate it "
                   "on other patients.")
                    .arg(path),
                false);
  });
  dialog.exec();
}

void MainWindow::onUpdateModel() {
  if (!study().model || !controller_->cohort() || !study().data) return;
  ModelUpdateDialog dialog(*study().model, controller_->cohort(), *study().data, this);
  QString toValidate;
  connect(&dialog, &ModelUpdateDialog::modelSaved, this,
          [this, &toValidate](const QString& path, bool useInStudy) {
            if (useInStudy) toValidate = path;
            showMessage(tr("Updated model saved as %1.").arg(path), false);
          });
  dialog.exec();
  // After the dialog closes, so its job is done and the window's own job can start.
  if (!toValidate.isEmpty()) controller_->validateUpdatedModel(toValidate);
}

}  // namespace calivera::ui
