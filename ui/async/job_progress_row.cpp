#include "ui/async/job_progress_row.h"

#include <QHBoxLayout>
#include <QProgressBar>
#include <QPushButton>

#include "ui/async/background_job.h"

namespace calivera::ui {

JobProgressRow::JobProgressRow(BackgroundJob* job, const QString& namePrefix, QWidget* parent)
    : QWidget(parent) {
  setObjectName(namePrefix + QStringLiteral("ProgressRow"));
  auto* layout = new QHBoxLayout(this);
  layout->setContentsMargins(0, 0, 0, 0);
  bar_ = new QProgressBar;
  bar_->setObjectName(namePrefix + QStringLiteral("Progress"));
  bar_->setRange(0, 1000);
  bar_->setTextVisible(false);
  cancel_ = new QPushButton(tr("Cancel"));
  cancel_->setObjectName(namePrefix + QStringLiteral("Cancel"));
  layout->addWidget(bar_, 1);
  layout->addWidget(cancel_);
  setVisible(false);
  connect(cancel_, &QPushButton::clicked, job, &BackgroundJob::cancel);
  connect(job, &BackgroundJob::started, this, [this]() {
    bar_->setValue(0);
    setVisible(true);
  });
  connect(job, &BackgroundJob::progressChanged, bar_, &QProgressBar::setValue);
  connect(job, &BackgroundJob::finished, this, [this]() { setVisible(false); });
}

}  // namespace calivera::ui
