// The Model menu's tools that work on the study's model and its analysed patients: internal
// validation (bootstrap optimism) and model updating. Each runs in its own dialog with its own
// background job; a model file they save can be validated in the study straight away.
#include "ui/dialogs/internal_validation_dialog.h"
#include "ui/dialogs/model_update_dialog.h"
#include "ui/main_window.h"

namespace calivera::ui {

void MainWindow::onInternalValidation() {
  if (!study_.model || !cohort_ || !study_.data) return;
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
  if (!toValidate.isEmpty()) loadModelFile(toValidate);
}

}  // namespace calivera::ui
