#include "ui/dialogs/internal_validation_dialog.h"

#include <QCheckBox>
#include <QDialogButtonBox>
#include <QFileDialog>
#include <QFormLayout>
#include <QHBoxLayout>
#include <QLabel>
#include <QPushButton>
#include <QSpinBox>
#include <QTableView>
#include <QVBoxLayout>
#include <filesystem>

#include "core/model/model_io.h"
#include "core/report/model_tool_tables.h"
#include "core/study/limits.h"
#include "render/charts/chart_text.h"
#include "ui/async/background_job.h"
#include "ui/async/job_progress_row.h"
#include "ui/dialogs/model_tool_parts.h"
#include "ui/models/record_table_model.h"
#include "ui/models/result_tables.h"
#include "ui/views/result_table_view.h"

namespace calivera::ui {

InternalValidationDialog::InternalValidationDialog(Model model,
                                                   std::shared_ptr<const CohortData> cohort,
                                                   InputFileRecord data, QWidget* parent)
    : QDialog(parent),
      model_(std::move(model)),
      cohort_(std::move(cohort)),
      data_(std::move(data)) {
  setObjectName(QStringLiteral("internalValidationDialog"));
  setWindowTitle(tr("Internal validation by bootstrap optimism correction"));
  job_ = new BackgroundJob(this);
  auto* layout = new QVBoxLayout(this);

  addIntroText(
      layout,
      tr("For a model fitted on this cohort: each bootstrap replicate refits the model's terms on "
         "a resample and measures how much better it looks on that resample than on the original "
         "patients. Apparent minus the mean of that optimism estimates performance on new "
         "patients from the same population (Efron 1983; Harrell, Lee & Mark 1996)."),
      QStringLiteral("internalIntro"));

  auto* form = new QFormLayout;
  replicates_ = new QSpinBox;
  replicates_->setObjectName(QStringLiteral("internalReplicates"));
  replicates_->setRange(10, 100000);
  replicates_->setValue(200);
  replicates_->setToolTip(tr("Bootstrap resamples; 200 is common practice for optimism"));
  form->addRow(tr("Replicates:"), replicates_);
  seed_ = new QSpinBox;
  seed_->setObjectName(QStringLiteral("internalSeed"));
  seed_->setRange(0, 2147483647);
  seed_->setValue(1);
  seed_->setToolTip(tr("The same seed gives the same result for any number of threads"));
  form->addRow(tr("Seed:"), seed_);
  threads_ = new QSpinBox;
  threads_->setObjectName(QStringLiteral("internalThreads"));
  threads_->setRange(0, static_cast<int>(kThreadsLimit.max));
  threads_->setSpecialValueText(tr("all cores"));
  form->addRow(tr("Threads:"), threads_);
  ici_ = new QCheckBox(tr("Include ICI (a smoothed calibration curve per replicate; slower)"));
  ici_->setObjectName(QStringLiteral("internalIncludeIci"));
  ici_->setChecked(true);
  form->addRow(QString(), ici_);
  firth_ = new QCheckBox(tr("Refit with Firth's penalized likelihood"));
  firth_->setObjectName(QStringLiteral("internalFirth"));
  if (fittedWithFirth(model_)) {
    // The refits must repeat every modelling step, so a Firth fit is refitted with Firth.
    firth_->setChecked(true);
    firth_->setEnabled(false);
    firth_->setToolTip(tr("The model was fitted with Firth's method, so every refit uses it"));
  }
  form->addRow(QString(), firth_);
  layout->addLayout(form);

  run_ = new QPushButton(tr("&Run the bootstrap"));
  run_->setObjectName(QStringLiteral("internalRun"));
  layout->addWidget(run_);
  layout->addWidget(new JobProgressRow(job_, QStringLiteral("internal"), this));

  status_ = addJobStatus(layout, job_, tr("Set the replicates and press Run."),
                         QStringLiteral("internalStatus"));
  table_ = new RecordTableModel(this);
  layout->addWidget(makeResultTableView(QStringLiteral("internalTable"), table_), 1);

  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close);
  buttons->setObjectName(QStringLiteral("internalButtons"));
  save_ = buttons->addButton(tr("Save &shrunk model…"), QDialogButtonBox::ActionRole);
  save_->setObjectName(QStringLiteral("internalSaveShrunk"));
  save_->setEnabled(false);
  layout->addWidget(buttons);

  connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
  connect(run_, &QPushButton::clicked, this, &InternalValidationDialog::startRun);
  connect(save_, &QPushButton::clicked, this, [this]() {
    const QString path = QFileDialog::getSaveFileName(this, tr("Save the shrunk model"), QString(),
                                                      tr("Calivera model (*.json)"));
    if (!path.isEmpty()) startSaveShrunkModel(path);
  });
  connect(job_, &BackgroundJob::finished, this, [this]() {
    run_->setEnabled(true);
    save_->setEnabled(result_ && result_->optimism.shrinkageFactor > 0.0);
  });
  resize(760, 560);
}

void InternalValidationDialog::startRun() {
  if (!cohort_ || !cohort_->table() || job_->isRunning()) return;
  OptimismOptions options;
  options.bootstrap.replicates = replicates_->value();
  options.bootstrap.seed = static_cast<std::uint64_t>(seed_->value());
  options.bootstrap.threads = static_cast<unsigned>(threads_->value());
  options.includeIci = ici_->isChecked();
  options.fit.firth = firth_->isChecked();
  run_->setEnabled(false);
  save_->setEnabled(false);
  status_->setText(tr("Refitting on %1 resamples…").arg(options.bootstrap.replicates));
  std::function<InternalValidation(const ProgressCallback&)> work =
      [model = model_, cohort = cohort_, data = updateDataOf(*cohort_), options,
       statedDevelopmentData =
           cohort_->run->request.developmentData](const ProgressCallback& progress) mutable {
        options.bootstrap.progress = progress;
        return internalValidation(model, data, options, statedDevelopmentData);
      };
  std::function<void(InternalValidation&)> done = [this](InternalValidation& r) {
    result_ = std::move(r);
    showResult();
  };
  job_->start<InternalValidation>(tr("Internal validation"), work, done);
}

void InternalValidationDialog::showResult() {
  showResultTable(*table_, optimismTable(result_->optimism));
  const BootstrapSummary& run = result_->optimism.run;
  QString status =
      tr("%1 replicates (seed %2, %3 threads), %4 failed and left out%5. Shrinkage factor "
         "(the calibration slope on new patients): <b>%6</b>.")
          .arg(run.replicates)
          .arg(run.seed)
          .arg(run.threads)
          .arg(run.failed)
          .arg(result_->firth ? tr(", refitted with Firth") : QString())
          .arg(fixed(result_->optimism.shrinkageFactor, 3));
  for (const std::string& w : result_->warnings) {
    status += tr("<br><span style='color:#a04000'><b>Warning:</b> %1</span>")
                  .arg(QString::fromStdString(w).toHtmlEscaped());
  }
  status_->setText(status);
}

bool InternalValidationDialog::startSaveShrunkModel(const QString& path) {
  if (!result_ || job_->isRunning()) return false;
  const double factor = result_->optimism.shrinkageFactor;
  const bool firth = result_->firth;
  run_->setEnabled(false);
  save_->setEnabled(false);
  std::function<bool(const ProgressCallback&)> work =
      [model = model_, cohort = cohort_, data = updateDataOf(*cohort_), factor, firth,
       file = path.toStdString()](const ProgressCallback&) {
        writeModelFile(file, shrunkModel(model, data, factor, firth));
        return true;
      };
  std::function<void(bool&)> done = [this, path](bool&) {
    status_->setText(status_->text() +
                     tr("<br>Shrunk model saved as %1.").arg(path.toHtmlEscaped()));
    emit modelSaved(path);
  };
  return job_->start<bool>(tr("Saving the shrunk model"), work, done);
}

}  // namespace calivera::ui
