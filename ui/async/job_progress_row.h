#pragma once
// A progress bar with a Cancel button for one BackgroundJob, for dialogs that run their own
// long computation (the bootstrap of internal validation, the fits of model updating). Hidden
// while the job is idle.

#include <QWidget>

class QProgressBar;
class QPushButton;

namespace calivera::ui {

class BackgroundJob;

class JobProgressRow : public QWidget {
  Q_OBJECT

 public:
  // `namePrefix` makes the objectNames (PREFIXProgress, PREFIXCancel) unique per dialog.
  JobProgressRow(BackgroundJob* job, const QString& namePrefix, QWidget* parent = nullptr);

 private:
  QProgressBar* bar_ = nullptr;
  QPushButton* cancel_ = nullptr;
};

}  // namespace calivera::ui
