#pragma once
// Runs one heavy computation off the UI thread (QtConcurrent::run + QFutureWatcher) with progress
// and cancellation through core's ProgressCallback. The worker never touches widgets: it returns a
// value, which is handed to `onSuccess` on the UI thread. Exceptions become a message (failed()),
// Cancelled becomes cancelled(); nothing the user entered is touched by a failing job.
//
// Progress is published through an atomic the UI polls every 50 ms, so a core loop may report as
// often as it likes without flooding the event queue.

#include <QFutureWatcher>
#include <QObject>
#include <QString>
#include <QTimer>
#include <QtConcurrent/QtConcurrentRun>
#include <atomic>
#include <exception>
#include <functional>
#include <memory>

#include "core/util/progress.h"
#include "core/util/sha256.h"

namespace calivera::ui {

class BackgroundJob : public QObject {
  Q_OBJECT

 public:
  explicit BackgroundJob(QObject* parent = nullptr);
  ~BackgroundJob() override;

  bool isRunning() const { return running_; }
  QString description() const { return description_; }

  // Starts `work` unless a job is already running (then returns false). `onSuccess` runs on the
  // UI thread with the result.
  template <class T>
  bool start(const QString& description, std::function<T(const ProgressCallback&)> work,
             std::function<void(T&)> onSuccess) {
    if (running_) return false;
    auto shared = beginRun(description);
    struct Outcome {
      std::shared_ptr<T> value;
      QString error;
      bool cancelled = false;
    };
    auto* watcher = new QFutureWatcher<std::shared_ptr<Outcome>>(this);
    connect(watcher, &QFutureWatcherBase::finished, this, [this, watcher, onSuccess]() {
      const std::shared_ptr<Outcome> outcome = watcher->result();
      watcher->deleteLater();
      endRun();
      if (outcome->cancelled) {
        emit cancelled();
      } else if (!outcome->error.isEmpty()) {
        emit failed(outcome->error);
      } else {
        try {
          onSuccess(*outcome->value);
        } catch (const std::exception& e) {
          emit failed(QString::fromStdString(e.what()));
        }
      }
      emit finished();
    });
    watcher->setFuture(QtConcurrent::run([work, shared]() {
      auto outcome = std::make_shared<Outcome>();
      const ProgressCallback progress = [shared](double fraction) {
        shared->permille.store(static_cast<int>(fraction * 1000.0));
        return !shared->cancelRequested.load();
      };
      try {
        outcome->value = std::make_shared<T>(work(progress));
      } catch (const Cancelled&) {
        outcome->cancelled = true;
      } catch (...) {
        outcome->error = describeCurrentException();
      }
      releaseThreadHashState();  // the pool thread may outlive OpenSSL at exit
      return outcome;
    }));
    return true;
  }

  // Blocks until the running job (if any) has delivered its result; for tests and shutdown.
  void waitForFinished();

 public slots:
  void cancel();

 signals:
  void started(const QString& description);
  void progressChanged(int permille);  // 0..1000
  void failed(const QString& message);
  void cancelled();
  void finished();  // after success, failure or cancellation

 private:
  struct Shared {
    std::atomic<int> permille{0};
    std::atomic<bool> cancelRequested{false};
  };
  std::shared_ptr<Shared> beginRun(const QString& description);
  void endRun();
  static QString describeCurrentException();

  std::shared_ptr<Shared> shared_;
  QTimer poll_;
  bool running_ = false;
  int lastPermille_ = -1;
  QString description_;
};

}  // namespace calivera::ui
