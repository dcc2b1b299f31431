// Typing a threshold in the workstation (issue 12): "15%" and "1:9" are read as 0.15 and 0.10;
// "15" is refused with a message naming the percentage form, and the threshold stays where it
// was (it used to be clamped silently to 1.0000). Data: MASS::birthwt (Debian r-cran-mass).
#include <QLabel>
#include <QLineEdit>
#include <QTemporaryDir>
#include <QtTest>

#include "core/data/csv_reader.h"
#include "core/fit/cohort_fit.h"
#include "core/model/model_io.h"
#include "ui/async/background_job.h"
#include "ui/main_window.h"
#include "ui/views/threshold_spin_box.h"

using namespace calivera;
using namespace calivera::ui;

class ThresholdEntryUiTest : public QObject {
  Q_OBJECT

 private:
  static void type(ThresholdSpinBox* box, const QString& text) {
    auto* edit = box->findChild<QLineEdit*>();  // the spin box's own line edit
    QVERIFY(edit != nullptr);
    box->setFocus();
    edit->selectAll();
    QTest::keyClicks(edit, text);
    QTest::keyClick(edit, Qt::Key_Return);
    box->clearFocus();  // editing finished: an unreadable entry is refused here
  }

 private slots:
  void typedFormsAndRefusal() {
    QTemporaryDir dir;
    QVERIFY(dir.isValid());
    const std::string data = CALIVERA_SOURCE_DIR "/tests/reference/data/birthwt.csv";
    CohortFitSpec spec;
    spec.outcome = OutcomeSpec{"low", std::nullopt};
    spec.predictors = {"age", "lwt", "smoke"};
    const QString model = dir.filePath("m.json");
    writeModelFile(model.toStdString(),
                   fitCohortModel(readCsvFile(data, CsvOptions{}).table, spec).model);
    MainWindow w;
    w.show();
    ImportSettings import;
    import.outcomeColumn = "low";
    QVERIFY(w.controller().openInputs(QString::fromStdString(data), model, import));
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 60000);
    auto* box = w.findChild<ThresholdSpinBox*>("thresholdSpin");
    QVERIFY(box != nullptr);

    type(box, "15%");
    QCOMPARE(w.controller().thresholdState().threshold(), 0.15);
    type(box, "1:9");
    QCOMPARE(w.controller().thresholdState().threshold(), 0.10);
    type(box, "15");
    QCOMPARE(w.controller().thresholdState().threshold(), 0.10);  // unchanged, not clamped to 1
    QVERIFY2(w.messageText().contains("15%"), qPrintable(w.messageText()));

    // The panel's calibration sentence: a model fitted by maximum likelihood on these patients
    // has O/E exactly 1, so it says the risks agree, and gives the flagged patients' rates from
    // the same index as the counts.
    auto* note = w.findChild<QLabel*>("calibrationAtThresholdText");
    QVERIFY(note != nullptr && note->isVisible());
    QVERIFY2(note->text().contains("agree"), qPrintable(note->text()));
    const ThresholdSnapshot s = w.controller().thresholdState().snapshot();
    QVERIFY2(note->text().contains(QString("Among the %1 flagged patients")
                                       .arg(s.counts.tp + s.counts.fp)),
             qPrintable(note->text()));
  }
};

QTEST_MAIN(ThresholdEntryUiTest)
#include "threshold_entry_ui_test.moc"
