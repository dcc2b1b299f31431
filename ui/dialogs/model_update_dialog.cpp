#include "ui/dialogs/model_update_dialog.h"

#include <QCheckBox>
#include <QComboBox>
#include <QDialogButtonBox>
#include <QDoubleSpinBox>
#include <QFileDialog>
#include <QFormLayout>
#include <QLabel>
#include <QPushButton>
#include <QTableView>
#include <QVBoxLayout>
#include <filesystem>

#include "core/model/model_io.h"
#include "core/report/model_tool_tables.h"
#include "core/util/errors.h"
#include "render/charts/chart_text.h"
#include "ui/async/background_job.h"
#include "ui/async/job_progress_row.h"
#include "ui/dialogs/model_tool_parts.h"
#include "ui/models/record_table_model.h"
#include "ui/models/result_tables.h"
#include "ui/views/result_table_view.h"

namespace calivera::ui {
namespace {

constexpr UpdateMethod kMethods[] = {UpdateMethod::Intercept, UpdateMethod::Recalibrate,
                                     UpdateMethod::Refit};

QString methodLabel(UpdateMethod method) {
  switch (method) {
    case UpdateMethod::None:
      return QObject::tr("keep the model as it is");
    case UpdateMethod::Intercept:
      return QObject::tr("intercept update (calibration in the large)");
    case UpdateMethod::Recalibrate:
      return QObject::tr("logistic recalibration (a + b × linear predictor)");
    case UpdateMethod::Refit:
      return QObject::tr("refit every coefficient on this cohort");
  }
  return {};
}

}  // namespace

ModelUpdateDialog::ModelUpdateDialog(Model model, std::shared_ptr<const CohortData> cohort,
                                     InputFileRecord data, QWidget* parent)
    : QDialog(parent),
      model_(std::move(model)),
      cohort_(std::move(cohort)),
      data_(std::move(data)) {
  setObjectName(QStringLiteral("modelUpdateDialog"));
  setWindowTitle(tr("Update the model on this cohort"));
  job_ = new BackgroundJob(this);
  auto* layout = new QVBoxLayout(this);

  addIntroText(
      layout,
      tr("Three updates of increasing extent are estimated on the analysed patients (Steyerberg "
         "et al. 2004; Janssen et al. 2008). Likelihood-ratio tests against the refit, in order, "
         "suggest the least update these data support (closed testing, Vergouwe et al. 2017). "
         "An updated model is a new model: validate it on other patients before relying on it."),
      QStringLiteral("updateIntro"));

  auto* form = new QFormLayout;
  alpha_ = new QDoubleSpinBox;
  alpha_->setObjectName(QStringLiteral("updateAlpha"));
  alpha_->setRange(0.001, 0.5);
  alpha_->setDecimals(3);
  alpha_->setSingleStep(0.01);
  alpha_->setValue(0.05);
  alpha_->setToolTip(tr("Family-wise type I error of the closed test"));
  form->addRow(tr("Test level (alpha):"), alpha_);
  firth_ = new QCheckBox(tr("Refit with Firth's penalized likelihood"));
  firth_->setObjectName(QStringLiteral("updateFirth"));
  form->addRow(QString(), firth_);
  layout->addLayout(form);
  run_ = new QPushButton(tr("&Estimate the updates"));
  run_->setObjectName(QStringLiteral("updateRun"));
  layout->addWidget(run_);
  layout->addWidget(new JobProgressRow(job_, QStringLiteral("update"), this));

  status_ = addJobStatus(layout, job_,
                         tr("Press Estimate to fit the three updates and run the closed test."),
                         QStringLiteral("updateStatus"));
  closedTable_ = new RecordTableModel(this);
  auto* closedView = makeResultTableView(QStringLiteral("updateClosedTestTable"), closedTable_);
  capTableHeight(closedView, 3);
  layout->addWidget(closedView);
  updatesTable_ = new RecordTableModel(this);
  auto* updatesView = makeResultTableView(QStringLiteral("updateMethodsTable"), updatesTable_);
  layout->addWidget(updatesView, 1);

  auto* choose = new QFormLayout;
  method_ = new QComboBox;
  method_->setObjectName(QStringLiteral("updateMethod"));
  for (const UpdateMethod m : kMethods) method_->addItem(methodLabel(m), static_cast<int>(m));
  choose->addRow(tr("Update to save:"), method_);
  layout->addLayout(choose);

  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close);
  buttons->setObjectName(QStringLiteral("updateButtons"));
  save_ = buttons->addButton(tr("&Save updated model…"), QDialogButtonBox::ActionRole);
  save_->setObjectName(QStringLiteral("updateSave"));
  saveAndUse_ = buttons->addButton(tr("Save and &validate it here…"), QDialogButtonBox::ActionRole);
  saveAndUse_->setObjectName(QStringLiteral("updateSaveAndUse"));
  saveAndUse_->setToolTip(
      tr("Saves the updated model and validates it on this cohort (apparent performance: the "
         "update was estimated on these patients)"));
  for (QPushButton* b : {save_, saveAndUse_}) b->setEnabled(false);
  layout->addWidget(buttons);

  connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
  connect(run_, &QPushButton::clicked, this, &ModelUpdateDialog::startRun);
  connect(save_, &QPushButton::clicked, this, [this]() { askAndSave(false); });
  connect(saveAndUse_, &QPushButton::clicked, this, [this]() { askAndSave(true); });
  connect(job_, &BackgroundJob::finished, this, [this]() {
    run_->setEnabled(true);
    for (QPushButton* b : {save_, saveAndUse_}) b->setEnabled(result_.has_value());
  });
  resize(820, 600);
}

UpdateMethod ModelUpdateDialog::chosenMethod() const {
  return static_cast<UpdateMethod>(method_->currentData().toInt());
}

void ModelUpdateDialog::chooseMethod(UpdateMethod method) {
  const int index = method_->findData(static_cast<int>(method));
  if (index >= 0) method_->setCurrentIndex(index);
}

void ModelUpdateDialog::startRun() {
  if (!cohort_ || !cohort_->table() || job_->isRunning()) return;
  const UpdateData data = updateDataOf(*cohort_);
  UpdateOptions options;
  options.firth = firth_->isChecked();
  const double alpha = alpha_->value();
  run_->setEnabled(false);
  status_->setText(tr("Fitting…"));
  std::function<ModelUpdateSet(const ProgressCallback&)> work =
      [model = model_, cohort = cohort_, data, options, alpha](const ProgressCallback& progress) {
        ModelUpdateSet set;
        reportProgress(progress, 0.0);
        set.closed = closedTest(model, data, alpha, options);
        reportProgress(progress, 0.4);
        for (std::size_t k = 0; k < std::size(kMethods); ++k) {
          set.updates.push_back(updateModel(model, data, kMethods[k], options));
          reportProgress(progress, 0.4 + 0.2 * static_cast<double>(k + 1));
        }
        return set;
      };
  std::function<void(ModelUpdateSet&)> done = [this](ModelUpdateSet& r) {
    result_ = std::move(r);
    showResult();
  };
  job_->start<ModelUpdateSet>(tr("Model updating"), work, done);
}

void ModelUpdateDialog::showResult() {
  using cells::count;
  using cells::number;
  using cells::text;
  showResultTable(*closedTable_, closedTestTable(result_->closed));
  std::vector<std::vector<TableCell>> updateRows;
  for (const UpdatedModel& u : result_->updates) {
    const bool refit = u.method == UpdateMethod::Refit;
    updateRows.push_back(
        {text(methodLabel(u.method)), refit ? text(tr("—")) : number(u.recalibrationIntercept, 4),
         refit ? text(tr("—")) : number(u.recalibrationSlope, 4), number(u.deviance, 2),
         count(static_cast<std::size_t>(u.estimatedParameters)), text(QString::fromStdString([&] {
           std::string joined;
           for (const auto& w : u.warnings) joined += (joined.empty() ? "" : "; ") + w;
           return joined;
         }()))});
  }
  updatesTable_->setTable(
      {tr("Update"), tr("a"), tr("b"), tr("Deviance"), tr("Parameters estimated"), tr("Warnings")},
      {QString(), tr("Recalibration intercept"), tr("Recalibration slope"),
       tr("-2 log likelihood on this cohort"), QString(), QString()},
      std::move(updateRows));
  const UpdateMethod suggested = result_->closed.suggested;
  QString status = tr("Closed test at alpha %1 suggests: <b>%2</b>.")
                       .arg(fixed(result_->closed.alpha, 3), methodLabel(suggested));
  if (suggested == UpdateMethod::None) {
    status +=
        tr(" The original model fits these patients as well as any update the data "
           "support; there is nothing to save.");
  }
  for (const std::string& w : result_->closed.warnings) {
    status += tr("<br><span style='color:#a04000'><b>Warning:</b> %1</span>")
                  .arg(QString::fromStdString(w).toHtmlEscaped());
  }
  status_->setText(status);
  chooseMethod(suggested == UpdateMethod::None ? UpdateMethod::Intercept : suggested);
}

void ModelUpdateDialog::askAndSave(bool useInStudy) {
  const QString path = QFileDialog::getSaveFileName(this, tr("Save the updated model"), QString(),
                                                    tr("Calivera model (*.json)"));
  if (path.isEmpty()) return;
  if (const QString error = saveChosenModel(path, useInStudy); !error.isEmpty()) {
    status_->setText(tr("<b>Not saved:</b> %1").arg(error.toHtmlEscaped()));
  }
}

QString ModelUpdateDialog::saveChosenModel(const QString& path, bool useInStudy) {
  if (!result_) return tr("estimate the updates first");
  const UpdateMethod method = chosenMethod();
  for (const UpdatedModel& u : result_->updates) {
    if (u.method != method) continue;
    try {
      // The update is already estimated: writing one small JSON file needs no background job.
      writeModelFile(path.toStdString(), u.model);
    } catch (const std::exception& e) {
      return QString::fromStdString(e.what());
    }
    status_->setText(status_->text() +
                     tr("<br>Saved %1 as %2.").arg(methodLabel(method), path.toHtmlEscaped()));
    emit modelSaved(path, useInStudy);
    if (useInStudy) accept();  // the window validates it once the dialog is closed
    return {};
  }
  return tr("no estimate for this update");
}

}  // namespace calivera::ui
