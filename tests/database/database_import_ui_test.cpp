// The workstation's database source (issue 16): the import dialog reads a PostgreSQL table in the
// background and previews its first rows, refuses a URI with a password, and a study saved with
// the source reopens by reconnecting, with the results of the command line on the same source.
// Runs against the throwaway PostgreSQL 15 server of tests/database/with_postgres.sh (MASS
// Pima.tr loaded from tests/reference/data/pima_tr.csv); without it every test is skipped.
#include <QComboBox>
#include <QDialogButtonBox>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>
#include <QTableWidget>
#include <QTemporaryDir>
#include <QtTest>
#include <cstdlib>
#include <nlohmann/json.hpp>

#include "core/report/validation_json.h"
#include "core/study/reproduce_command.h"
#include "core/study/study_file.h"
#include "core/util/sha256.h"
#include "tests/ui/open_study.h"
#include "ui/async/background_job.h"
#include "ui/dialogs/import_dialog.h"
#include "ui/main_window.h"
#include "ui/study_controller.h"
#include "ui/views/summary_html.h"

using namespace calivera;
using namespace calivera::ui;

namespace {

const std::string kModel = CALIVERA_SOURCE_DIR "/tests/reference/data/pima_imputation_model.json";

QString adminUri() {
  return QString::fromLocal8Bit(std::getenv("CALIVERA_PG_ADMIN_URI"));
}

}  // namespace

class DatabaseImportUiTest : public QObject {
  Q_OBJECT

 private:
  QTemporaryDir dir_;

 private slots:
  void init() {
    if (adminUri().isEmpty()) {
      QSKIP("no PostgreSQL test server: run through tests/database/with_postgres.sh (ctest does)");
    }
  }

  void importDialogReadsATableInTheBackground() {
    ImportDialog dialog;
    dialog.setPath(adminUri());
    auto* kind = dialog.findChild<QComboBox*>("importDatabaseKind");
    auto* text = dialog.findChild<QLineEdit*>("importDatabaseText");
    QVERIFY(kind->isEnabled() && text->isEnabled());
    QVERIFY(!dialog.findChild<QComboBox*>("importDelimiter")->isEnabled());
    QVERIFY(dialog.summaryText().contains("Give a table or a query"));
    text->setText("pima_tr");
    emit text->editingFinished();
    QTRY_VERIFY_WITH_TIMEOUT(dialog.loadedTable() != nullptr, 30000);
    QCOMPARE(dialog.loadedTable()->rowCount, std::size_t{200});
    QVERIFY(dialog.loadedTable()->database != nullptr);
    const auto* preview = dialog.findChild<QTableWidget*>("importPreview");
    QCOMPARE(preview->rowCount(), ImportDialog::kPreviewRows);
    QCOMPARE(preview->columnCount(), 8);
    QCOMPARE(preview->item(0, 1)->text(), QStringLiteral("86"));  // glu of the first row
    QVERIFY(dialog.findChild<QLabel*>("importPreviewNote")->text().contains("calivera_test"));
    const std::optional<DatabaseSelection> selection = dialog.databaseSelection();
    QVERIFY(selection.has_value());
    QCOMPARE(selection->table, std::string("pima_tr"));
    QCOMPARE(dialog.settings().delimiter, char(0));
    if (qEnvironmentVariableIsSet("CALIVERA_SCREENSHOT_DIR")) {
      dialog.findChild<QComboBox*>("importOutcome")->setCurrentText("diabetic");
      dialog.resize(1000, 680);
      dialog.show();
      QTest::qWait(200);
      dialog.grab().save(qEnvironmentVariable("CALIVERA_SCREENSHOT_DIR") + "/import_database.png");
    }

    // A password in the URI: refused with the reason, nothing to import.
    dialog.setPath(adminUri().replace("calivera_admin@", "calivera_admin:pw-here@"));
    QTRY_VERIFY_WITH_TIMEOUT(dialog.summaryText().contains("carries a password"), 30000);
    QVERIFY(!dialog.summaryText().contains("pw-here"));
    QVERIFY(dialog.loadedTable() == nullptr);
    QVERIFY(!dialog.findChild<QDialogButtonBox*>("importButtons")
                 ->button(QDialogButtonBox::Ok)
                 ->isEnabled());
  }

  void studyWithADatabaseSourceReopensAsTheCommandLineRunsIt() {
    MainWindow w;
    ImportSettings settings;
    settings.outcomeColumn = "diabetic";
    QVERIFY(w.controller().importCohort(adminUri(), settings, nullptr,
                                        DatabaseSelection{"pima_tr", ""}));
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 30000);
    QVERIFY(w.controller().loadModelFile(QString::fromStdString(kModel)));
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 30000);
    const StudyState& study = w.controller().study();
    QVERIFY2(study.run != nullptr, qPrintable(w.messageText()));
    QVERIFY(study.run->database != nullptr);
    QCOMPARE(study.data->sha256, study.run->database->resultSha256);
    QVERIFY(summaryHtml(study).contains("table pima_tr (PostgreSQL)"));
    const std::string line = reproduceCommandLine(study);
    QVERIFY2(line.find("--table pima_tr") != std::string::npos, line.c_str());

    // The command line on the study's request: the same JSON, source included.
    const ValidationRun cli = runValidation(studyRequests(study).validation);
    const nlohmann::json a = nlohmann::json::parse(validationJsonText(*study.run));
    const nlohmann::json b = nlohmann::json::parse(validationJsonText(cli));
    QCOMPARE(a["inputs"]["source"].get<std::string>(), std::string("postgresql"));
    for (const char* key : {"discrimination", "calibration", "overall", "cohort", "inputs"}) {
      QCOMPARE(a[key].dump(), b[key].dump());
    }

    // Saved and reopened: it reconnects and reads the table again.
    const std::string path = dir_.filePath("db.cvstudy").toStdString();
    MainWindow again;
    calivera::testing::openStudyAndWait(again, study, path);
    const StudyState& reopened = again.controller().study();
    QVERIFY(reopened.data->database.has_value());
    QCOMPARE(reopened.result->cohort.n, study.result->cohort.n);
    QCOMPARE(reopened.result->discrimination.auc, study.result->discrimination.auc);
    QCOMPARE(reopened.data->sha256, study.data->sha256);
  }
};

QTEST_MAIN(DatabaseImportUiTest)
#include "database_import_ui_test.moc"
