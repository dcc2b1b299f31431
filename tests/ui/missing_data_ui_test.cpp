// The workstation's missing-data handling (issue 17): the dialog, the study setting and the
// Missing data table page, on MASS::Pima.tr2 (Debian r-cran-mass; real missing values) with the
// model fitted on MASS::Pima.te (tests/reference/data). Copies imputed in the workstation and by
// `calivera validate --impute` give the same pooled JSON (one core path); the stacked copies made
// by mice (tests/reference/scripts/pima_imputation.R) are found by the dialog and pooled. Two
// routes of our own are compared here; the reference values are checked in
// tests/reference/pima_imputation_test.cpp.
#include <QAction>
#include <QComboBox>
#include <QLabel>
#include <QRadioButton>
#include <QSignalSpy>
#include <QSpinBox>
#include <QTabWidget>
#include <QTableView>
#include <QTemporaryDir>
#include <QtTest>
#include <nlohmann/json.hpp>

#include "core/data/csv_reader.h"
#include "core/report/validation_json.h"
#include "core/study/reproduce_command.h"
#include "core/study/study_file.h"
#include "core/util/sha256.h"
#include "tests/ui/open_study.h"
#include "ui/async/background_job.h"
#include "ui/dialogs/missing_data_dialog.h"
#include "ui/dialogs/report_export_dialog.h"
#include "ui/main_window.h"
#include "ui/study_controller.h"

using namespace calivera;
using namespace calivera::ui;

namespace {

const std::string kData = CALIVERA_SOURCE_DIR "/tests/reference/data/pima_tr2.csv";
const std::string kStacked = CALIVERA_SOURCE_DIR "/tests/reference/data/pima_tr2_imputed.csv";
const std::string kModel = CALIVERA_SOURCE_DIR "/tests/reference/data/pima_imputation_model.json";

StudyState pimaStudy(const std::string& data) {
  StudyState study;
  study.data = InputFileRecord{data, sha256OfFile(data)};
  study.import.outcomeColumn = "diabetic";
  study.modelSource = ModelSource::File;
  study.modelFile = InputFileRecord{kModel, sha256OfFile(kModel)};
  return study;
}

}  // namespace

class MissingDataUiTest : public QObject {
  Q_OBJECT

 private:
  QTemporaryDir dir_;

  std::string path(const char* name) const { return dir_.filePath(name).toStdString(); }

  void open(MainWindow& w, const StudyState& study, const char* name) {
    calivera::testing::openStudyAndWait(w, study, path(name));
  }

 private slots:
  void dialogOffersOnlyColumnsThatNumberCopies() {
    const Table stacked = readCsvFile(kStacked, CsvOptions{}).table;
    // .imp numbers the copies 0..5; .id (1..300) has no 0; the outcome is never offered.
    QCOMPARE(MissingDataDialog::imputationColumnCandidates(stacked, "diabetic"),
             std::vector<std::string>{".imp"});
    const Table plain = readCsvFile(kData, CsvOptions{}).table;
    QVERIFY(MissingDataDialog::imputationColumnCandidates(plain, "diabetic").empty());

    MissingDataSettings current;
    current.imputeCopies = 7;
    current.imputeIterations = 4;
    current.imputeSeed = 9;
    MissingDataDialog dialog(current, plain, "diabetic");
    QVERIFY(dialog.findChild<QRadioButton*>("imputeHereRadio")->isChecked());
    // No column numbers copies here: the stacked choice is offered but cannot be taken.
    QVERIFY(!dialog.findChild<QRadioButton*>("stackedCopiesRadio")->isEnabled());
    QVERIFY(dialog.findChild<QLabel*>("noImputationColumnNote")->isVisibleTo(&dialog));
    QCOMPARE(dialog.settings(), current);
    dialog.findChild<QRadioButton*>("completeCasesRadio")->setChecked(true);
    QVERIFY(!dialog.findChild<QSpinBox*>("imputeCopiesSpin")->isEnabled());
    QVERIFY(!dialog.settings().any());
  }

  void imputedHereAsOnTheCommandLineAndUndone() {
    MainWindow w;
    open(w, pimaStudy(kData), "pima.cvstudy");
    const auto* pooledBox = w.findChild<QWidget*>("pooledImputationsBox");
    QVERIFY(!pooledBox->isVisibleTo(&w));
    QVERIFY(w.findChild<QLabel*>("missingDataNote")->text().contains("Complete cases: 100 of 300"));
    QVERIFY(w.findChild<QAction*>("actionMissingData")->isEnabled());

    MissingDataSettings settings;
    settings.imputeCopies = 4;
    settings.imputeIterations = 5;
    settings.imputeSeed = 3;
    QVERIFY(w.controller().setMissingData(settings));
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 60000);
    const StudyState& study = w.controller().study();
    QVERIFY2(study.run && study.run->imputed, qPrintable(w.messageText()));
    QCOMPARE(study.missingData, settings);
    QCOMPARE(study.run->imputed->method, std::string("chained_equations"));
    // The complete cases stay the main result.
    QCOMPARE(study.result->cohort.n, std::size_t{200});
    const auto* pooled = w.findChild<QTableView*>("pooledImputationsTable");
    QCOMPARE(pooled->model()->rowCount(), 5);  // the five pooled measures
    QVERIFY(w.findChild<QLabel*>("missingDataNote")->text().contains("Pooled over 4 copies"));

    // The command line the study stands for gives the same pooled results.
    const std::string line = reproduceCommandLine(study);
    QVERIFY2(line.find("--impute 4 --impute-iterations 5 --seed 3") != std::string::npos,
             line.c_str());
    const ValidationRun cli = runValidation(studyRequests(study).validation);
    QVERIFY(cli.imputed != nullptr);
    const nlohmann::json a = nlohmann::json::parse(validationJsonText(*study.run));
    const nlohmann::json b = nlohmann::json::parse(validationJsonText(cli));
    QCOMPARE(a["pooled"].dump(), b["pooled"].dump());
    QCOMPARE(a["missing_data"].dump(), b["missing_data"].dump());

    // The workstation's report reads the same run: its missing-data part has the pooled results.
    ReportExportRequest report;
    report.title = "t";
    const AuditReportInput input = auditInputFromStudy(study, report);
    QVERIFY(input.imputed == study.run->imputed);

    // Saved and read back with the study.
    QVERIFY(w.controller().saveStudy(QString::fromStdString(path("imputed.cvstudy"))));
    QCOMPARE(readStudyFile(path("imputed.cvstudy")).missingData, settings);

    // One undoable step, through a run.
    QVERIFY(w.controller().undo());
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 60000);
    QVERIFY(!w.controller().study().missingData.any());
    QVERIFY(w.controller().study().run->imputed == nullptr);
    QVERIFY(!pooledBox->isVisibleTo(&w));
  }

  void stackedCopiesPooled() {
    MainWindow w;
    open(w, pimaStudy(kStacked), "stacked.cvstudy");
    MissingDataSettings settings;
    settings.imputationColumn = ".imp";
    QVERIFY(w.controller().setMissingData(settings));
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 60000);
    const StudyState& study = w.controller().study();
    QVERIFY2(study.run && study.run->imputed, qPrintable(w.messageText()));
    QCOMPARE(study.run->imputed->indices.size(), std::size_t{5});
    // The analysed cohort is the original data (index 0): Pima.tr2's 200 complete records.
    QCOMPARE(study.result->cohort.n, std::size_t{200});
    const ValidationRun cli = runValidation(studyRequests(study).validation);
    QCOMPARE(nlohmann::json::parse(validationJsonText(*study.run))["pooled"].dump(),
             nlohmann::json::parse(validationJsonText(cli))["pooled"].dump());
  }

  void cancelledImputationKeepsTheStudy() {
    MainWindow w;
    open(w, pimaStudy(kData), "cancel.cvstudy");
    const auto before = w.controller().study().run;
    MissingDataSettings settings;
    settings.imputeCopies = 1000;  // long enough to be running when cancelled
    settings.imputeIterations = 50;
    QSignalSpy cancelled(w.controller().job(), &BackgroundJob::cancelled);
    QVERIFY(w.controller().setMissingData(settings));
    QVERIFY(w.controller().job()->isRunning());
    QTest::qWait(100);
    w.controller().job()->cancel();
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 20000);
    QCOMPARE(cancelled.count(), 1);
    QVERIFY(!w.controller().study().missingData.any());
    QVERIFY(w.controller().study().run == before);
  }

  void refusedSettingsChangeNothing() {
    MainWindow w;
    open(w, pimaStudy(kData), "refused.cvstudy");
    MissingDataSettings both;
    both.imputeCopies = 5;
    both.imputationColumn = "npreg";
    QVERIFY(!both.isValid());
    QVERIFY(!w.controller().setMissingData(both));
    QVERIFY(w.messageText().contains("out of range"));
    // A column that does not number copies: the run fails with the reason, the study stays.
    MissingDataSettings wrong;
    wrong.imputationColumn = "npreg";
    QVERIFY(w.controller().setMissingData(wrong));
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 60000);
    QVERIFY(!w.controller().study().missingData.any());
    QVERIFY(w.controller().study().result != nullptr);
    QVERIFY2(w.messageText().contains("npreg"), qPrintable(w.messageText()));
  }

  // scripts/screenshots.sh: the dialog and the Missing data page after imputing here.
  void screenshots() {
    const QByteArray folder = qgetenv("CALIVERA_SCREENSHOT_DIR");
    if (folder.isEmpty()) QSKIP("CALIVERA_SCREENSHOT_DIR not set");
    MainWindow w;
    const QList<QByteArray> size = qgetenv("CALIVERA_SCREENSHOT_SIZE").split('x');
    w.resize(size.size() == 2 ? size[0].toInt() : 1366, size.size() == 2 ? size[1].toInt() : 768);
    w.show();
    open(w, pimaStudy(kData), "shots.cvstudy");
    MissingDataSettings settings;
    settings.imputeCopies = 20;
    QVERIFY(w.controller().setMissingData(settings));
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 60000);
    auto* tables = w.findChild<QTabWidget*>("tableTabs");
    tables->setCurrentWidget(w.findChild<QWidget*>("missingDataPage"));
    w.findChild<QTabWidget*>("mainTabs")->setCurrentWidget(tables);
    QVERIFY(QTest::qWaitForWindowExposed(&w));
    QTest::qWait(50);
    QVERIFY(w.grab().save(QString::fromUtf8(folder) + "/missing_data_page.png"));
    w.findChild<QTabWidget*>("mainTabs")->setCurrentWidget(w.findChild<QWidget*>("summaryPanel"));
    QTest::qWait(50);
    QVERIFY(w.grab().save(QString::fromUtf8(folder) + "/missing_data_summary.png"));
    MissingDataDialog dialog(w.controller().study().missingData, *w.controller().table(),
                             "diabetic", &w);
    dialog.show();
    QVERIFY(QTest::qWaitForWindowExposed(&dialog));
    QVERIFY(dialog.grab().save(QString::fromUtf8(folder) + "/missing_data_dialog.png"));
  }
};

QTEST_MAIN(MissingDataUiTest)
#include "missing_data_ui_test.moc"
