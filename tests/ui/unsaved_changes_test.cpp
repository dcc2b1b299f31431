// Unsaved changes are never lost silently (issue 12): the controller knows when the study differs
// from what was last opened or saved, the title bar marks it, and quitting, opening, New and Close
// ask first (Save, Discard or Cancel). Data: MASS::birthwt (Debian r-cran-mass), with a model
// fitted on it here; the checks compare the workstation with itself, no reference value.
#include <QAction>
#include <QSignalSpy>
#include <QTemporaryDir>
#include <QtTest>

#include "core/study/study_file.h"
#include "tests/unit/study_fixture.h"
#include "ui/async/background_job.h"
#include "ui/main_window.h"
#include "ui/study_controller.h"

using namespace calivera;
using namespace calivera::ui;

namespace {

const std::string kBirthwt = CALIVERA_SOURCE_DIR "/tests/reference/data/birthwt.csv";

}  // namespace

class UnsavedChangesTest : public QObject {
  Q_OBJECT

 private:
  QTemporaryDir dir_;
  QString study_;

  void open(StudyController& c) {
    QVERIFY(c.openStudy(study_));
    QTRY_VERIFY_WITH_TIMEOUT(!c.job()->isRunning(), 60000);
    QVERIFY(c.study().result != nullptr);
  }

  void trigger(MainWindow& w, const char* action) {
    auto* a = w.findChild<QAction*>(action);
    QVERIFY2(a != nullptr, action);
    a->trigger();
  }

 private slots:
  void initTestCase() {
    QVERIFY(dir_.isValid());
    study_ = QString::fromStdString(
        calivera::testing::writeBirthwtStudy(kBirthwt, dir_.path().toStdString()));
  }

  // Opened: clean. A setting the file records: modified, once. Back to the saved value: clean
  // again (the comparison is with the saved study, not a flag). Saved: clean.
  void controllerTracksChangesAgainstTheSavedStudy() {
    StudyController c;
    QVERIFY(!c.isModified());  // an empty study has nothing to lose
    open(c);
    QVERIFY(!c.isModified());
    QSignalSpy modified(&c, &StudyController::modifiedChanged);
    const double saved = c.study().analysis.threshold;
    c.setThreshold(0.25);
    QVERIFY(c.isModified());
    c.setGroups(7);
    QCOMPARE(modified.count(), 1);
    c.setGroups(8);  // the study's saved value (birthwtFileStudy)
    c.setThreshold(saved);
    QVERIFY(!c.isModified());
    QCOMPARE(modified.count(), 2);
    c.setApparent(true);
    QVERIFY(c.isModified());
    const QString copy = dir_.filePath("copy.cvstudy");
    QVERIFY(c.saveStudy(copy));
    QVERIFY(!c.isModified());
    QCOMPARE(c.studyPath(), copy);
    // New study: empty, no file, nothing to save.
    QVERIFY(c.newStudy());
    QVERIFY(!c.isModified());
    QVERIFY(c.study().result == nullptr && !c.study().data);
    QVERIFY(c.studyPath().isEmpty());
  }

  // A cohort imported into a new study has never been saved: modified.
  void importedCohortIsUnsaved() {
    StudyController c;
    ImportSettings import;
    import.outcomeColumn = "low";
    QVERIFY(c.openInputs(QString::fromStdString(kBirthwt), QString(), import));
    QTRY_VERIFY_WITH_TIMEOUT(!c.job()->isRunning(), 60000);
    QVERIFY(c.isModified());
  }

  // The window: the title marks unsaved changes; Cancel keeps everything (the window stays open,
  // the study stays), Discard lets New go ahead, Save writes the study first.
  void windowAsksBeforeLosingChanges() {
    MainWindow w;
    w.show();
    open(w.controller());
    QVERIFY(w.windowTitle().contains("[*]"));
    QVERIFY(!w.isWindowModified());
    w.controller().setThreshold(0.3);
    QVERIFY(w.isWindowModified());

    int asked = 0;
    QMessageBox::StandardButton answer = QMessageBox::Cancel;
    w.setUnsavedChangesPrompt([&](const QString& name) {
      ++asked;
      [&]() { QCOMPARE(name, QString("s.cvstudy")); }();
      return answer;
    });
    QVERIFY(!w.close());  // Cancel: the close is refused
    QCOMPARE(asked, 1);
    trigger(w, "actionNewStudy");
    QCOMPARE(asked, 2);
    QVERIFY(w.controller().study().result != nullptr);
    QVERIFY(w.isWindowModified());

    answer = QMessageBox::Save;  // the study has a file: saved there, no dialog
    trigger(w, "actionCloseStudy");
    QCOMPARE(asked, 3);
    QVERIFY(w.controller().study().result == nullptr);
    QVERIFY(!w.isWindowModified());
    const StudyState reread = readStudyFile(study_.toStdString());
    QCOMPARE(reread.analysis.threshold, 0.3);

    open(w.controller());
    w.controller().setThreshold(0.2);
    answer = QMessageBox::Discard;
    trigger(w, "actionNewStudy");
    QCOMPARE(asked, 4);
    QVERIFY(w.controller().study().result == nullptr);
    QCOMPARE(readStudyFile(study_.toStdString()).analysis.threshold, 0.3);  // not written
    QVERIFY(w.close());  // nothing unsaved: no question
    QCOMPARE(asked, 4);
  }
};

QTEST_MAIN(UnsavedChangesTest)
#include "unsaved_changes_test.moc"
