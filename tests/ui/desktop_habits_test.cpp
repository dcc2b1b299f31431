// Desktop habits of issue 12 that remained: Edit → Undo / Redo of the settings, context menus on
// tables and charts (copy, export), and File → Print report. Data: MASS::birthwt (Debian
// r-cran-mass) with a model fitted on it here. The checks compare the workstation with itself
// (the printed report with the exported PDF, the copied table with the exported CSV), so no
// reference value is involved.
#include <QAction>
#include <QClipboard>
#include <QFile>
#include <QMenu>
#include <QPrinter>
#include <QTableView>
#include <QTemporaryDir>
#include <QtTest>
#include <cstdlib>
#include <memory>

#include "core/study/study_file.h"
#include "tests/ui/pdf_text.h"
#include "tests/unit/study_fixture.h"
#include "ui/async/background_job.h"
#include "ui/dialogs/help_dialog.h"
#include "ui/dialogs/report_export_dialog.h"
#include "ui/dialogs/report_print.h"
#include "ui/main_window.h"
#include "ui/models/table_export.h"
#include "ui/study_controller.h"
#include "ui/views/chart_panel.h"
#include "ui/views/table_context_menu.h"

using namespace calivera;
using namespace calivera::ui;

namespace {

const std::string kBirthwt = CALIVERA_SOURCE_DIR "/tests/reference/data/birthwt.csv";

}  // namespace

class DesktopHabitsTest : public QObject {
  Q_OBJECT

 private:
  QTemporaryDir dir_;
  QString study_;

  void waitForJob(StudyController& c) { QTRY_VERIFY_WITH_TIMEOUT(!c.job()->isRunning(), 60000); }
  void showStudy(MainWindow& w) {
    w.resize(1366, 768);
    w.show();
    QVERIFY(w.controller().openStudy(study_));
    waitForJob(w.controller());
  }
  void open(StudyController& c) {
    QVERIFY(c.openStudy(study_));
    waitForJob(c);
    QVERIFY(c.study().result != nullptr);
  }

 private slots:
  void initTestCase() {
    QVERIFY(dir_.isValid());
    study_ = QString::fromStdString(
        calivera::testing::writeBirthwtStudy(kBirthwt, dir_.path().toStdString()));
  }

  // A drag of the threshold is one step; each other setting is its own step; undo and redo walk
  // the steps in order and say what they change; nothing is recorded when a value is set again.
  void undoAndRedoWalkTheSettings() {
    StudyController c;
    open(c);
    QUndoStack* history = c.undoStack();
    QVERIFY(!history->canUndo());
    const double original = c.study().analysis.threshold;
    const int originalGroups = c.study().analysis.groups;
    c.setThreshold(0.20);
    c.setThreshold(0.22);
    c.setThreshold(0.25);  // one gesture: within the merge interval
    QCOMPARE(history->count(), 1);
    QVERIFY(history->undoText().contains(QStringLiteral("0.250")));
    c.setGroups(originalGroups);  // unchanged: no step
    QCOMPARE(history->count(), 1);
    c.setGroups(5);
    c.setApparent(!c.study().analysis.apparent);
    QCOMPARE(history->count(), 3);

    QVERIFY(c.undo());
    QVERIFY(c.undo());
    QCOMPARE(c.study().analysis.groups, originalGroups);
    QVERIFY(c.undo());
    QCOMPARE(c.study().analysis.threshold, original);
    QCOMPARE(c.thresholdState().threshold(), original);
    QVERIFY(!c.undo());
    QVERIFY(c.redo());
    QCOMPARE(c.study().analysis.threshold, 0.25);
    QVERIFY(c.redo());
    QCOMPARE(c.study().analysis.groups, 5);
    QVERIFY(!c.isModified() == false);

    // Moves further apart than the merge interval are separate steps.
    history->clear();
    c.setThreshold(0.30);
    QTest::qWait(kThresholdMergeMs + 200);
    c.setThreshold(0.35);
    QCOMPARE(history->count(), 2);
  }

  // A mapping is undone through a run; new inputs start a new history.
  void mappingIsUndoneThroughARunAndNewInputsClearTheHistory() {
    StudyController c;
    open(c);
    const double auc = c.study().result->discrimination.auc;
    QVERIFY(c.setColumnMapping({{"lwt", "bwt"}}, {}));
    waitForJob(c);
    QCOMPARE(c.study().columnMapping.at("lwt"), std::string("bwt"));
    QVERIFY(c.study().result->discrimination.auc != auc);
    QCOMPARE(c.undoStack()->count(), 1);
    QVERIFY(c.undo());
    waitForJob(c);
    QVERIFY(c.study().columnMapping.empty());
    QCOMPARE(c.study().result->discrimination.auc, auc);
    QVERIFY(c.redo());
    waitForJob(c);
    QCOMPARE(c.study().columnMapping.at("lwt"), std::string("bwt"));

    c.setThreshold(0.3);
    QVERIFY(c.undoStack()->canUndo());
    open(c);
    QVERIFY(!c.undoStack()->canUndo());
  }

  // The window's Edit menu names the step and puts the threshold back on screen.
  void windowUndoActionNamesTheStepAndRestoresTheView() {
    MainWindow w;
    showStudy(w);
    auto* undo = w.findChild<QAction*>(QStringLiteral("actionUndo"));
    auto* redo = w.findChild<QAction*>(QStringLiteral("actionRedo"));
    QVERIFY(undo != nullptr && redo != nullptr);
    QVERIFY(!undo->isEnabled());
    const double original = w.controller().study().analysis.threshold;
    w.controller().setThreshold(0.31);
    QVERIFY(undo->isEnabled());
    QVERIFY2(undo->text().contains(QStringLiteral("threshold 0.310")), qPrintable(undo->text()));
    // Help → Keyboard lists the action under a fixed name, with both Redo keys.
    const QString keys = helpKeyboardHtml(w);
    QVERIFY(keys.contains(QStringLiteral("Undo the last change of a setting")));
    QVERIFY(!keys.contains(QStringLiteral("threshold 0.310")));
    QVERIFY(keys.contains(QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_Z)
                              .toString(QKeySequence::NativeText)
                              .toHtmlEscaped()));
    undo->trigger();
    QCOMPARE(w.controller().study().analysis.threshold, original);
    QVERIFY(redo->isEnabled());
    QVERIFY(!undo->isEnabled());
  }

  // Right-click on a table: copy the whole table as shown (the header and every row) or the
  // selected rows; the export item is there. On a chart: the copied image carries the footer.
  void contextMenusCopyTablesAndCharts() {
    MainWindow w;
    showStudy(w);
    auto* table = w.findChild<QTableView*>(QStringLiteral("thresholdTable"));
    QVERIFY(table != nullptr);
    std::unique_ptr<QMenu> menu(buildTableContextMenu(table, nullptr));
    auto* copyAll = menu->findChild<QAction*>(QStringLiteral("tableMenuCopyAll"));
    auto* copyRows = menu->findChild<QAction*>(QStringLiteral("tableMenuCopyRows"));
    QVERIFY(copyAll != nullptr && copyRows != nullptr);
    QVERIFY(menu->findChild<QAction*>(QStringLiteral("tableMenuExport")) != nullptr);
    QVERIFY(!copyRows->isEnabled() || !table->selectionModel()->selectedIndexes().isEmpty());
    copyAll->trigger();
    const QString copied = QGuiApplication::clipboard()->text();
    QCOMPARE(copied, tableToTsv(*table->model(), {}));
    QCOMPARE(copied.count(QLatin1Char('\n')), table->model()->rowCount() + 1);
    QCOMPARE(suggestedCsvName(*table), QStringLiteral("thresholds.csv"));

    table->selectRow(2);
    std::unique_ptr<QMenu> selected(buildTableContextMenu(table, nullptr));
    auto* rows = selected->findChild<QAction*>(QStringLiteral("tableMenuCopyRows"));
    QVERIFY(rows->isEnabled());
    rows->trigger();
    QCOMPARE(QGuiApplication::clipboard()->text().count(QLatin1Char('\n')), 2);

    auto* roc = w.findChild<ChartPanel*>(QStringLiteral("rocView"));
    QVERIFY(roc != nullptr);
    const QStringList footer = {QStringLiteral("caution line"), QStringLiteral("fingerprints")};
    QVERIFY(roc->copyImage());
    const int plain = QGuiApplication::clipboard()->image().height();
    QVERIFY(roc->copyImage(footer));
    const QImage withFooter = QGuiApplication::clipboard()->image();
    QVERIFY(!withFooter.isNull());
    QVERIFY(withFooter.height() > plain);  // the footer band below the chart
  }

  // File → Print lays out the same document as the PDF export: printed to a PDF file, its text
  // equals the exported report's page for page (one timestamp for both).
  void printedReportIsTheExportedReport() {
    qputenv("SOURCE_DATE_EPOCH", "1780000000");
    StudyController c;
    open(c);
    const QString exported = dir_.filePath("exported.pdf");
    const QFuture<QString> written =
        exportReport(c.study(), exportRequestFor(c.study(), exported.toStdString()));
    QTRY_VERIFY_WITH_TIMEOUT(written.isFinished(), 60000);
    QCOMPARE(written.result(), QString());

    auto printer = std::make_shared<QPrinter>(QPrinter::HighResolution);
    const QString printed = dir_.filePath("printed.pdf");
    printer->setOutputFormat(QPrinter::PdfFormat);
    printer->setOutputFileName(printed);
    const QFuture<QString> done = printReport(c.study(), printer);
    QTRY_VERIFY_WITH_TIMEOUT(done.isFinished(), 60000);
    QCOMPARE(done.result(), QString());
    printer.reset();  // the spool is closed when painting ends
    const QString printedText = calivera::testing::pdfText(printed);
    const QString exportedText = calivera::testing::pdfText(exported);
    QVERIFY(exportedText.count(QLatin1Char('\f')) >= 4);
    QCOMPARE(printedText.count(QLatin1Char('\f')), exportedText.count(QLatin1Char('\f')));
    QCOMPARE(printedText, exportedText);
    qunsetenv("SOURCE_DATE_EPOCH");
  }
};

QTEST_MAIN(DesktopHabitsTest)
#include "desktop_habits_test.moc"
