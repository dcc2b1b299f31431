// The import dialog on a CSV and on SAS, Stata and SPSS files (issue 16): the preview of a
// statistical-package file shows value labels with their codes and the columns no analysis may
// use, the delimiter is off for such files, and the background read gives the table every
// command reads. Data: MASS::birthwt (Debian r-cran-mass) written by R's haven
// (tests/reference/scripts/package_files.R).
#include "ui/dialogs/import_dialog.h"

#include <QComboBox>
#include <QHeaderView>
#include <QLabel>
#include <QTableWidget>
#include <QtTest>

#include "ui/async/background_job.h"

using namespace calivera;
using namespace calivera::ui;

namespace {

QString packagePath(const char* name) {
  return QStringLiteral(CALIVERA_SOURCE_DIR "/tests/reference/data/package/") +
         QString::fromLatin1(name);
}

void waitForRead(ImportDialog& dialog) {
  QTRY_VERIFY_WITH_TIMEOUT(!dialog.job()->isRunning(), 20000);
}

int columnOf(const QTableWidget& table, const QString& name) {
  for (int c = 0; c < table.columnCount(); ++c) {
    if (table.horizontalHeaderItem(c)->text().startsWith(name + "\n")) return c;
  }
  return -1;
}

}  // namespace

class ImportDialogTest : public QObject {
  Q_OBJECT

 private slots:
  void statisticalPackageFilesShowLabelsAndRefusedColumns() {
    for (const char* name : {"birthwt.sav", "birthwt.dta"}) {
      ImportDialog dialog;
      dialog.setPath(packagePath(name));
      auto* preview = dialog.findChild<QTableWidget*>("importPreview");
      auto* delimiter = dialog.findChild<QComboBox*>("importDelimiter");
      auto* note = dialog.findChild<QLabel*>("importPreviewNote");
      QVERIFY(preview && delimiter && note);
      QVERIFY(!delimiter->isEnabled());
      QCOMPARE(preview->rowCount(), ImportDialog::kPreviewRows);
      const int race = columnOf(*preview, "race");
      QVERIFY(race >= 0);
      QVERIFY(preview->horizontalHeaderItem(race)->text().contains("labelled categories"));
      QCOMPARE(preview->item(0, race)->text(), QStringLiteral("black = 2"));  // record 1: race 2
      const int visit = columnOf(*preview, "visit");
      QVERIFY(visit >= 0);
      QVERIFY(preview->horizontalHeaderItem(visit)->toolTip().contains("dates or times"));
      QVERIFY2(note->text().contains("visit"), qPrintable(note->text()));
      waitForRead(dialog);
      QVERIFY(dialog.loadedTable() != nullptr);
      QCOMPARE(dialog.loadedTable()->rowCount, std::size_t(189));
      QCOMPARE(dialog.settings().delimiter, char(0));
      auto* outcome = dialog.findChild<QComboBox*>("importOutcome");
      outcome->setCurrentIndex(outcome->findText("low"));
      QVERIFY2(dialog.summaryText().contains("189"), qPrintable(dialog.summaryText()));
    }
  }

  void aBrokenFileNamesTheProblem() {
    QTemporaryDir dir;
    const QString path = dir.filePath("broken.sav");
    QFile file(path);
    QVERIFY(file.open(QIODevice::WriteOnly));
    file.write("not an SPSS file");
    file.close();
    ImportDialog dialog;
    dialog.setPath(path);
    auto* note = dialog.findChild<QLabel*>("importPreviewNote");
    QVERIFY2(note->text().contains("not a readable SPSS file"), qPrintable(note->text()));
    waitForRead(dialog);
    QVERIFY(dialog.loadedTable() == nullptr);
    QVERIFY2(dialog.summaryText().contains("cannot be imported"), qPrintable(dialog.summaryText()));
  }

  void csvKeepsTheDelimiterChoice() {
    ImportDialog dialog;
    dialog.setPath(QStringLiteral(CALIVERA_SOURCE_DIR "/tests/reference/data/birthwt.csv"));
    QVERIFY(dialog.findChild<QComboBox*>("importDelimiter")->isEnabled());
    waitForRead(dialog);
    QCOMPARE(dialog.loadedTable()->rowCount, std::size_t(189));
  }

  // Skipped unless CALIVERA_SCREENSHOT_DIR is set: the dialog on a Stata file.
  void screenshots() {
    const QByteArray dir = qgetenv("CALIVERA_SCREENSHOT_DIR");
    if (dir.isEmpty()) QSKIP("CALIVERA_SCREENSHOT_DIR not set");
    ImportDialog dialog;
    const QList<QByteArray> size = qgetenv("CALIVERA_SCREENSHOT_SIZE").split('x');
    if (size.size() == 2 && size[1].toInt() < 900) dialog.resize(900, size[1].toInt() - 80);
    dialog.show();
    dialog.setPath(packagePath("birthwt.dta"));
    waitForRead(dialog);
    auto* outcome = dialog.findChild<QComboBox*>("importOutcome");
    outcome->setCurrentIndex(outcome->findText("low"));
    QVERIFY(QTest::qWaitForWindowExposed(&dialog));
    QVERIFY(dialog.grab().toImage().save(QString::fromLocal8Bit(dir) + "/import_dialog.png"));
  }
};

QTEST_MAIN(ImportDialogTest)
#include "import_dialog_test.moc"
