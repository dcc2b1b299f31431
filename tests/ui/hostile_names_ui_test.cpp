// Names from files in the workstation (issue 11): markup in a model name is shown as text, a
// right-to-left override is written out instead of reversing what follows, and a 400-character
// name is cut (full name in the tooltip) instead of widening the window.
// Data: MASS::birthwt (Debian r-cran-mass).
#include <QComboBox>
#include <QFile>
#include <QLabel>
#include <QTableView>
#include <QTemporaryDir>
#include <QtTest>

#include "core/data/csv_reader.h"
#include "core/fit/cohort_fit.h"
#include "core/model/model_io.h"
#include "tests/ui/birthwt_variant.h"
#include "ui/async/background_job.h"
#include "ui/main_window.h"
#include "ui/views/chart_panel.h"
#include "ui/views/predictor_view.h"

using namespace calivera;
using namespace calivera::ui;

class HostileNamesUiTest : public QObject {
  Q_OBJECT

 private:
  // A model fitted on `data` (outcome `low`) with `predictors`, written into `dir`.
  static QString writeModel(const QTemporaryDir& dir, const QString& data,
                            const std::vector<std::string>& predictors) {
    CohortFitSpec spec;
    spec.outcome = OutcomeSpec{"low", std::nullopt};
    spec.predictors = predictors;
    const QString model = dir.filePath("m.json");
    writeModelFile(model.toStdString(),
                   fitCohortModel(readCsvFile(data.toStdString(), CsvOptions{}).table, spec).model);
    return model;
  }

  // The window at the smallest common laptop size, with the cohort and model validated.
  static void openInWindow(MainWindow& w, const QString& data, const QString& model) {
    w.resize(1366, 768);
    w.show();
    ImportSettings import;
    import.outcomeColumn = "low";
    QVERIFY(w.controller().openInputs(data, model, import));
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 60000);
  }

 private slots:
  void namesShowPlainVisibleAndShort() {
    QTemporaryDir dir;
    QVERIFY(dir.isValid());
    const std::string data = CALIVERA_SOURCE_DIR "/tests/reference/data/birthwt.csv";
    CohortFitSpec spec;
    spec.outcome = OutcomeSpec{"low", std::nullopt};
    spec.predictors = {"age", "lwt"};
    spec.modelName = "<b>bold</b> gnp\u202Eexe.png " + std::string(400, 'x');
    const QString model = dir.filePath("m.json");
    writeModelFile(model.toStdString(),
                   fitCohortModel(readCsvFile(data, CsvOptions{}).table, spec).model);
    MainWindow w;
    w.resize(1366, 768);
    w.show();
    ImportSettings import;
    import.outcomeColumn = "low";
    QVERIFY(w.controller().openInputs(QString::fromStdString(data), model, import));
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 60000);
    auto* status = w.findChild<QLabel*>("studyStatus");
    QVERIFY(status != nullptr);
    QCOMPARE(status->textFormat(), Qt::PlainText);
    QVERIFY2(status->text().contains("<b>bold</b>"), qPrintable(status->text()));
    QVERIFY(status->text().contains("gnp[U+202E]exe.png"));
    QVERIFY(!status->text().contains(QChar(0x202E)));
    QVERIFY(!status->text().contains(QString(400, 'x')));
    QVERIFY(status->toolTip().contains(QString(400, 'x')));
    QVERIFY2(w.width() <= 1366 && w.minimumSizeHint().width() < 1366,
             qPrintable(QString::number(w.minimumSizeHint().width())));
  }

  // A subgroup column named with markup and a 300-character level: the note shows the markup as
  // text, the table cell is cut with the whole level in its tooltip, the window keeps its width.
  void subgroupNamesAreEscapedAndCut() {
    QTemporaryDir dir;
    QVERIFY(dir.isValid());
    const QByteArray longLevel = "L" + QByteArray(300, 'v');
    const QString data =
        calivera::testing::writeBirthwtVariant(dir.filePath("hostile.csv"), [&](QByteArray& text) {
          text.replace("race,", "<i>group</i>,");  // the header's column name
          text.replace(",black,", "," + longLevel + ",");
        });
    MainWindow w;
    openInWindow(w, data, writeModel(dir, data, {"age", "lwt"}));
    UncertaintySettings settings;
    settings.subgroupColumns = {"<i>group</i>"};
    QVERIFY(w.controller().runUncertainty(settings));
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 60000);
    QVERIFY2(w.controller().study().uncertainty &&
                 !w.controller().study().uncertainty->subgroups.empty(),
             qPrintable(w.messageText()));
    auto* view = w.findChild<QWidget*>("subgroupView");
    QVERIFY(view != nullptr);
    bool noteShowsMarkup = false;
    for (auto* label : view->findChildren<QLabel*>()) {
      if (label->text().contains("&lt;i&gt;group&lt;/i&gt;")) noteShowsMarkup = true;
    }
    QVERIFY(noteShowsMarkup);
    auto* table = view->findChild<QTableView*>();
    QVERIFY(table != nullptr);
    bool cut = false;
    for (int r = 0; r < table->model()->rowCount(); ++r) {
      const QModelIndex index = table->model()->index(r, 0);
      const QString tip = index.data(Qt::ToolTipRole).toString();
      if (tip.contains(QString(longLevel))) {
        cut = index.data().toString().size() < 80;
      }
    }
    QVERIFY(cut);
    QVERIFY(w.minimumSizeHint().width() < 1366);
  }
  // A predictor named with a right-to-left override and 300 more characters: the Predictor space
  // view's choices and held-values table show it written out and cut (whole in the tooltip), and
  // choosing it still draws its curve (the view computes with the whole name).
  void predictorNamesAreCutButStillWork() {
    QTemporaryDir dir;
    QVERIFY(dir.isValid());
    const std::string longName = "lwt\u202E" + std::string(300, 'y');
    const QString data =
        calivera::testing::writeBirthwtVariant(dir.filePath("hostile.csv"), [&](QByteArray& text) {
          text.replace(",lwt,", QByteArray(",") + QByteArray::fromStdString(longName) + ",");
        });
    MainWindow w;
    openInWindow(w, data, writeModel(dir, data, {"age", longName}));
    auto* first = w.findChild<QComboBox*>("predictorFirst");
    QVERIFY(first != nullptr);
    const int at = first->findData(QString::fromStdString(longName));
    QVERIFY(at >= 0);
    QVERIFY(!first->itemText(at).contains(QChar(0x202E)));
    QVERIFY(first->itemText(at).contains("[U+202E]"));
    QVERIFY(first->itemText(at).size() < 60);
    QVERIFY(first->itemData(at, Qt::ToolTipRole).toString().contains(QString(300, 'y')));
    auto* view = w.findChild<PredictorView*>("predictorView");
    view->choose(QString::fromStdString(longName), QString());
    QCOMPARE(first->currentIndex(), at);
    QVERIFY(view->chartPanels().front()->linkedChart() != nullptr);
    QVERIFY(w.minimumSizeHint().width() < 1366);
  }
};

QTEST_MAIN(HostileNamesUiTest)
#include "hostile_names_ui_test.moc"
