// The workstation's controller (ui/study_controller.h) on its own, without a window: it owns the
// study, the run and the threshold, tells observers through signals, refuses what it cannot do
// with a message, and leaves the current study untouched when a run fails.
// Data: MASS::birthwt (Debian r-cran-mass), with a model fitted on it here.
#include "ui/study_controller.h"

#include <QComboBox>
#include <QFile>
#include <QSignalSpy>
#include <QTemporaryDir>
#include <QtTest>

#include "core/data/csv_reader.h"
#include "core/fit/cohort_fit.h"
#include "core/model/model_io.h"
#include "core/study/study_file.h"
#include "tests/ui/birthwt_variant.h"
#include "tests/unit/study_fixture.h"
#include "ui/async/background_job.h"
#include "ui/dialogs/mapping_dialog.h"

using namespace calivera;
using namespace calivera::ui;

namespace {

const std::string kBirthwt = CALIVERA_SOURCE_DIR "/tests/reference/data/birthwt.csv";

}  // namespace

class StudyControllerTest : public QObject {
  Q_OBJECT

 private:
  QTemporaryDir dir_;
  QString model_;

  void openBirthwt(StudyController& c) {
    ImportSettings import;
    import.outcomeColumn = "low";
    QVERIFY(c.openInputs(QString::fromStdString(kBirthwt), model_, import));
    QTRY_VERIFY_WITH_TIMEOUT(!c.job()->isRunning(), 60000);
  }

 private slots:
  void initTestCase() {
    QVERIFY(dir_.isValid());
    model_ = dir_.filePath("m.json");
    calivera::testing::writeBirthwtModel(kBirthwt, {"age", "lwt", "smoke"}, model_.toStdString());
  }

  void runReplacesTheStudyAndSaysSoOnce() {
    StudyController c;
    QSignalSpy results(&c, &StudyController::resultsChanged);
    openBirthwt(c);
    QCOMPARE(results.count(), 1);
    QVERIFY(c.study().result != nullptr);
    QCOMPARE(c.study().result->cohort.n, std::size_t{189});  // birthwt has 189 births
    QCOMPARE(c.study().result->cohort.events, std::size_t{59});
    QVERIFY(c.cohort() != nullptr);
    QVERIFY(c.thresholdState().hasData());
    QCOMPARE(c.thresholdState().threshold(), c.study().analysis.threshold);
  }

  void thresholdMovesOnlyTheThreshold() {
    StudyController c;
    openBirthwt(c);
    QSignalSpy results(&c, &StudyController::resultsChanged);
    QSignalSpy moved(&c, &StudyController::thresholdChanged);
    c.setThreshold(0.3);
    QCOMPARE(results.count(), 0);
    QCOMPARE(moved.count(), 1);
    QCOMPARE(moved.at(0).at(0).toDouble(), 0.3);
    QCOMPARE(c.study().analysis.threshold, 0.3);  // saved with the study
    // The snapshot counts the patients at or above the threshold, straight from the cohort.
    std::size_t flagged = 0;
    for (double r : c.cohort()->risk()) flagged += r >= 0.3 ? 1 : 0;
    const ThresholdSnapshot s = c.thresholdState().snapshot();
    QCOMPARE(s.counts.tp + s.counts.fp, flagged);
    QVERIFY(c.nudgeThreshold(2));
    QCOMPARE(moved.count(), 2);
    QVERIFY(c.thresholdState().threshold() > 0.3);
  }

  void settingsWaitForTheNextRun() {
    StudyController c;
    openBirthwt(c);
    QSignalSpy results(&c, &StudyController::resultsChanged);
    c.setGroups(5);
    c.setApparent(true);
    QCOMPARE(results.count(), 0);
    QCOMPARE(c.study().result->hosmerLemeshow.groups.size(), std::size_t{10});
    QVERIFY(c.runValidation());
    QTRY_VERIFY_WITH_TIMEOUT(!c.job()->isRunning(), 60000);
    QCOMPARE(results.count(), 1);
    QCOMPARE(c.study().result->hosmerLemeshow.groups.size(), std::size_t{5});
    QCOMPARE(c.study().result->hosmerLemeshow.df, 3.0);  // apparent: g - 2
  }

  void reasonableRangeRebuildsTheViews() {
    StudyController c;
    openBirthwt(c);
    QSignalSpy results(&c, &StudyController::resultsChanged);
    c.setReasonableRange(0.1, 0.4);
    QCOMPARE(results.count(), 1);
    QCOMPARE(c.study().analysis.reasonableLo, 0.1);
    QCOMPARE(c.study().analysis.reasonableHi, 0.4);
  }

  void refusalsComeWithAMessage() {
    StudyController c;
    QSignalSpy messages(&c, &StudyController::message);
    QVERIFY(!c.runValidation());  // no cohort yet
    QCOMPARE(messages.count(), 1);
    QVERIFY(messages.at(0).at(1).toBool());
    QVERIFY(!c.loadModelFile(model_));
    QCOMPARE(messages.count(), 2);
    QVERIFY(!c.runUncertainty(UncertaintySettings{}));
    QCOMPARE(messages.count(), 3);

    openBirthwt(c);
    messages.clear();
    QVERIFY(c.runValidation());
    QVERIFY(!c.runValidation());  // one job at a time
    QCOMPARE(messages.count(), 1);
    QVERIFY(messages.at(0).at(0).toString().contains("still running"));
    QTRY_VERIFY_WITH_TIMEOUT(!c.job()->isRunning(), 60000);
  }

  void aFailingRunKeepsTheStudy() {
    StudyController c;
    openBirthwt(c);
    const auto before = c.study().result;
    QSignalSpy results(&c, &StudyController::resultsChanged);
    QSignalSpy failed(c.job(), &BackgroundJob::failed);
    QVERIFY(c.loadModelFile(dir_.filePath("missing.json")));
    QTRY_VERIFY_WITH_TIMEOUT(!c.job()->isRunning(), 60000);
    QCOMPARE(failed.count(), 1);
    QVERIFY(failed.at(0).at(0).toString().contains("missing.json"));
    QCOMPARE(results.count(), 0);
    QCOMPARE(c.study().result, before);

    QSignalSpy messages(&c, &StudyController::message);
    QVERIFY(!c.openStudy(dir_.filePath("absent.cvstudy")));
    QCOMPARE(messages.count(), 1);
    QVERIFY(messages.at(0).at(1).toBool());
    QCOMPARE(c.study().result, before);
  }

  // A cohort that spells a category differently: the run stops with the unknown level named, the
  // cohort and model stay loaded, the mapping dialog offers the level, and the mapped run gives the
  // original file's numbers; the study saves the mapping and `calivera run` repeats it.
  void unknownLevelsAreMappedThroughTheMappingStep() {
    const QString model = dir_.filePath("race.json");
    calivera::testing::writeBirthwtModel(kBirthwt, {"age", "lwt", "race", "smoke"},
                                         model.toStdString());
    const QString respelled = calivera::testing::writeBirthwtVariant(
        dir_.filePath("respelled.csv"),
        [](QByteArray& text) { text.replace(",black,", ",Black,"); });

    StudyController original;
    ImportSettings import;
    import.outcomeColumn = "low";
    QVERIFY(original.openInputs(QString::fromStdString(kBirthwt), model, import));
    QTRY_VERIFY_WITH_TIMEOUT(!original.job()->isRunning(), 60000);
    QVERIFY(original.study().result != nullptr);

    StudyController c;
    QSignalSpy messages(&c, &StudyController::message);
    QVERIFY(c.openInputs(respelled, model, import));
    QTRY_VERIFY_WITH_TIMEOUT(!c.job()->isRunning(), 60000);
    QVERIFY(c.study().result == nullptr);
    QVERIFY(c.study().model.has_value());  // kept, so the mapping step can open
    QVERIFY(c.table() != nullptr);
    QVERIFY(!messages.isEmpty());
    QVERIFY(messages.last().at(1).toBool());  // shown as an error
    QVERIFY2(messages.last().at(0).toString().contains("'Black' (26 rows)"),
             qPrintable(messages.last().at(0).toString()));

    MappingDialog dialog(*c.study().model, *c.table(), {}, {});
    auto* combo = dialog.findChild<QComboBox*>("levelMap_race_Black");
    QVERIFY(combo != nullptr);
    combo->setCurrentIndex(combo->findText("black"));
    const auto levels = dialog.levelMapping();
    QCOMPARE(levels.at("race").at("Black"), std::string("black"));
    QVERIFY(c.setColumnMapping(dialog.mapping(), levels));
    QTRY_VERIFY_WITH_TIMEOUT(!c.job()->isRunning(), 60000);
    QVERIFY(c.study().result != nullptr);
    QCOMPARE(c.study().result->discrimination.auc, original.study().result->discrimination.auc);
    QCOMPARE(c.study().result->calibration.slope, original.study().result->calibration.slope);

    const QString saved = dir_.filePath("mapped.cvstudy");
    QVERIFY(c.saveStudy(saved));
    QCOMPARE(readStudyFile(saved.toStdString()).levelMapping, levels);
  }

  void savingTellsThePath() {
    StudyController c;
    openBirthwt(c);
    QSignalSpy path(&c, &StudyController::studyPathChanged);
    const QString file = dir_.filePath("s.cvstudy");
    QVERIFY(c.saveStudy(file));
    QCOMPARE(path.count(), 1);
    QCOMPARE(c.studyPath(), file);
    StudyController reopened;
    QVERIFY(reopened.openStudy(file));
    QTRY_VERIFY_WITH_TIMEOUT(!reopened.job()->isRunning(), 60000);
    QCOMPARE(reopened.studyPath(), file);
    QCOMPARE(reopened.study().result->cohort.n, c.study().result->cohort.n);
    QCOMPARE(reopened.study().result->discrimination.auc, c.study().result->discrimination.auc);
  }
};

QTEST_MAIN(StudyControllerTest)
#include "study_controller_test.moc"
