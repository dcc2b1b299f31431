#include "ui/async/background_job.h"

#include <QCoreApplication>
#include <QEventLoop>

#include "core/util/errors.h"

namespace calivera::ui {

BackgroundJob::BackgroundJob(QObject* parent) : QObject(parent) {
  poll_.setInterval(50);
  connect(&poll_, &QTimer::timeout, this, [this]() {
    const int value = shared_ ? shared_->permille.load() : 0;
    if (value != lastPermille_) {
      lastPermille_ = value;
      emit progressChanged(value);
    }
  });
}

BackgroundJob::~BackgroundJob() {
  // A worker may still run; ask it to stop. Its watcher dies with us, so no callback fires.
  if (shared_) shared_->cancelRequested.store(true);
}

std::shared_ptr<BackgroundJob::Shared> BackgroundJob::beginRun(const QString& description) {
  shared_ = std::make_shared<Shared>();
  running_ = true;
  lastPermille_ = -1;
  description_ = description;
  poll_.start();
  emit started(description);
  emit progressChanged(0);
  return shared_;
}

void BackgroundJob::endRun() {
  poll_.stop();
  running_ = false;
  emit progressChanged(1000);
}

void BackgroundJob::cancel() {
  if (shared_) shared_->cancelRequested.store(true);
}

void BackgroundJob::waitForFinished() {
  if (!running_) return;
  QEventLoop loop;
  connect(this, &BackgroundJob::finished, &loop, &QEventLoop::quit);
  if (running_) loop.exec();
}

QString BackgroundJob::describeCurrentException() {
  try {
    throw;
  } catch (const InputError& e) {
    return QStringLiteral("Input problem: %1").arg(QString::fromStdString(e.what()));
  } catch (const AnalysisError& e) {
    return QStringLiteral("The analysis could not be completed: %1")
        .arg(QString::fromStdString(e.what()));
  } catch (const std::bad_alloc&) {
    return QStringLiteral("Out of memory while computing.");
  } catch (const std::exception& e) {
    return QStringLiteral("Unexpected error: %1").arg(QString::fromStdString(e.what()));
  } catch (...) {
    return QStringLiteral("Unexpected error of unknown type.");
  }
}

}  // namespace calivera::ui
