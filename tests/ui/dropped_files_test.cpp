// Files dropped on the workstation's window open by kind (issue 12): a study opens, a model file
// loads into the current study (a .json study file is told from a model by its format id), and
// anything else is refused with a message naming the file. The drop itself (QMimeData with one
// local URL) goes through the same function. Data: MASS::birthwt (Debian r-cran-mass).
#include <QDragEnterEvent>
#include <QDropEvent>
#include <QFile>
#include <QMimeData>
#include <QTemporaryDir>
#include <QUrl>
#include <QtTest>

#include "core/study/study_file.h"
#include "tests/unit/study_fixture.h"
#include "ui/async/background_job.h"
#include "ui/main_window.h"

using namespace calivera;
using namespace calivera::ui;

namespace {

const std::string kBirthwt = CALIVERA_SOURCE_DIR "/tests/reference/data/birthwt.csv";

}  // namespace

class DroppedFilesTest : public QObject {
  Q_OBJECT

 private:
  QTemporaryDir dir_;
  std::string model_;
  std::string other_;

 private slots:
  void initTestCase() {
    QVERIFY(dir_.isValid());
    model_ = dir_.filePath("m.json").toStdString();
    other_ = dir_.filePath("other.json").toStdString();
    calivera::testing::writeBirthwtModel(kBirthwt, {"age", "lwt", "smoke"}, model_);
    calivera::testing::writeBirthwtModel(kBirthwt, {"age", "lwt"}, other_);
  }

  void studyThenModelThenRefusal() {
    MainWindow w;
    // A study saved as .json is still a study.
    const QString study = dir_.filePath("s.json");
    writeStudyFile(study.toStdString(), calivera::testing::birthwtFileStudy(kBirthwt, model_));
    QVERIFY(w.openDroppedFile(study));
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 60000);
    QVERIFY(w.controller().study().result != nullptr);
    QCOMPARE(w.controller().study().model->terms.size(), std::size_t{3});

    // A model file: validated on the study's cohort in place of the first.
    QVERIFY(w.openDroppedFile(QString::fromStdString(other_)));
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 60000);
    QCOMPARE(w.controller().study().model->terms.size(), std::size_t{2});

    // Anything else: refused, named, nothing changed.
    const QString picture = dir_.filePath("scan <1>.png");
    QFile file(picture);
    QVERIFY(file.open(QIODevice::WriteOnly));
    file.write("not a picture");
    file.close();
    QVERIFY(!w.openDroppedFile(picture));
    QVERIFY(w.messageText().contains("scan <1>.png"));
    QCOMPARE(w.controller().study().model->terms.size(), std::size_t{2});
  }

  // The drop event: one local file is taken (after the event returns); the unsaved-changes
  // question is asked before a dropped study replaces a modified one.
  void dropEventOpensAfterTheQuestion() {
    MainWindow w;
    w.show();
    const QString study = dir_.filePath("drop.cvstudy");
    writeStudyFile(study.toStdString(), calivera::testing::birthwtFileStudy(kBirthwt, model_));
    QVERIFY(w.openDroppedFile(study));
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 60000);
    w.controller().setThreshold(0.3);
    int asked = 0;
    w.setUnsavedChangesPrompt([&asked](const QString&) {
      ++asked;
      return QMessageBox::Cancel;
    });
    QMimeData mime;
    mime.setUrls({QUrl::fromLocalFile(study)});
    // Qt delivers a drop to the widget that accepted the drag's entry.
    QDragEnterEvent enter(QPoint(10, 10), Qt::CopyAction, &mime, Qt::LeftButton, Qt::NoModifier);
    QCoreApplication::sendEvent(&w, &enter);
    QVERIFY(enter.isAccepted());
    QDropEvent drop(QPointF(10, 10), Qt::CopyAction, &mime, Qt::LeftButton, Qt::NoModifier);
    QCoreApplication::sendEvent(&w, &drop);
    QTRY_COMPARE(asked, 1);
    QCOMPARE(w.controller().study().analysis.threshold, 0.3);  // Cancel: the study stays
  }
};

QTEST_MAIN(DroppedFilesTest)
#include "dropped_files_test.moc"
