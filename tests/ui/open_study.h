#pragma once
// Workstation tests: write a study file, open it in a window and wait for its run.

#include <QtTest>
#include <string>

#include "core/study/study_file.h"
#include "ui/async/background_job.h"
#include "ui/main_window.h"
#include "ui/study_controller.h"

namespace calivera::testing {

inline void openStudyAndWait(ui::MainWindow& w, const StudyState& study, const std::string& path) {
  writeStudyFile(path, study);
  QVERIFY(w.controller().openStudy(QString::fromStdString(path)));
  QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 60000);
  QVERIFY2(w.controller().study().result != nullptr, qPrintable(w.messageText()));
}

}  // namespace calivera::testing
