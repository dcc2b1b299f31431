// The Model menu's tools on birthwt (r-cran-mass, tests/reference/data/birthwt.csv) with a model
// fitted there by core: the internal-validation dialog shows exactly core's optimism correction
// for the same seed and keeps its result on Cancel; the update dialog shows core's closed test
// and saves the chosen update, and logistic recalibration re-validated on the same patients
// gives calibration slope 1 and intercept 0.
#include <QAction>
#include <QCheckBox>
#include <QLabel>
#include <QLineEdit>
#include <QSpinBox>
#include <QTableView>
#include <QTemporaryDir>
#include <QtTest>

#include "core/data/csv_reader.h"
#include "core/fit/cohort_fit.h"
#include "core/metrics/validation_run.h"
#include "core/model/model_io.h"
#include "core/uncertainty/internal_validation.h"
#include "core/util/sha256.h"
#include "render/charts/chart_text.h"
#include "ui/async/background_job.h"
#include "ui/dialogs/fit_dialog.h"
#include "ui/dialogs/internal_validation_dialog.h"
#include "ui/dialogs/model_update_dialog.h"
#include "ui/main_window.h"

using namespace calivera;
using namespace calivera::ui;

namespace {

const QString kBirthwt = QStringLiteral(CALIVERA_SOURCE_DIR "/tests/reference/data/birthwt.csv");

template <class T>
T* child(QObject& root, const char* name) {
  T* found = root.findChild<T*>(QString::fromLatin1(name));
  if (found == nullptr) qFatal("no child named %s", name);
  return found;
}

QString cell(QObject& root, const char* table, int row, int column) {
  return child<QTableView>(root, table)->model()->index(row, column).data().toString();
}

ValidationRun validateOnBirthwt(const QString& modelPath) {
  ValidationRequest request;
  request.dataPath = kBirthwt.toStdString();
  request.outcome = OutcomeSpec{"low", std::nullopt};
  request.modelPath = modelPath.toStdString();
  return runValidation(request);
}

std::shared_ptr<const Table> birthwtTable() {
  return std::make_shared<const Table>(readCsvFile(kBirthwt.toStdString(), CsvOptions{}).table);
}

ImportSettings lowOutcome() {
  ImportSettings import;
  import.outcomeColumn = "low";
  return import;
}

FitSettings predictors(std::vector<std::string> names) {
  FitSettings settings;
  settings.predictors = std::move(names);
  return settings;
}

UpdateData dataOf(const MainWindow& w) {
  UpdateData data;
  data.table = w.controller().cohort()->table().get();
  data.rows = w.controller().cohort()->rows();
  data.outcome = w.controller().cohort()->outcome();
  data.dataSha256 = w.controller().study().data->sha256;
  data.dataName = "birthwt.csv";
  return data;
}

}  // namespace

class ModelToolsTest : public QObject {
  Q_OBJECT

 private slots:
  void initTestCase() {
    QVERIFY(dir_.isValid());
    const Table table = readCsvFile(kBirthwt.toStdString(), CsvOptions{}).table;
    CohortFitSpec spec;
    spec.outcome = OutcomeSpec{"low", std::nullopt};
    spec.predictors = {"age", "lwt", "race", "smoke", "ptl", "ht", "ui"};
    spec.modelName = "birthwt model";
    modelPath_ = dir_.filePath("fitted.json");
    Model fitted = fitCohortModel(table, spec).model;
    fitted.development.dataSha256 = sha256OfFile(kBirthwt.toStdString());  // as `calivera fit`
    writeModelFile(modelPath_.toStdString(), fitted);
    // The same coefficients without a record of their development data: a model from elsewhere.
    fitted.development.dataSha256.reset();
    fitted.development.analysedSha256.reset();
    publishedPath_ = dir_.filePath("published.json");
    writeModelFile(publishedPath_.toStdString(), fitted);
    ImportSettings import;
    import.outcomeColumn = "low";
    QVERIFY(window_.controller().openInputs(kBirthwt, modelPath_, import));
    QTRY_VERIFY_WITH_TIMEOUT(!window_.controller().job()->isRunning(), 60000);
    QVERIFY(window_.controller().study().result != nullptr);
    QVERIFY(window_.findChild<QAction*>("actionInternalValidation")->isEnabled());
    QVERIFY(window_.findChild<QAction*>("actionUpdateModel")->isEnabled());
  }

  void internalValidationShowsCoresOptimismCorrection() {
    InternalValidationDialog dialog(*window_.controller().study().model, window_.controller().cohort(),
                                    *window_.controller().study().data);
    child<QSpinBox>(dialog, "internalReplicates")->setValue(60);
    child<QSpinBox>(dialog, "internalSeed")->setValue(17);
    child<QCheckBox>(dialog, "internalIncludeIci")->setChecked(false);
    dialog.startRun();
    dialog.job()->waitForFinished();
    QVERIFY(dialog.result() != nullptr);

    OptimismOptions options;
    options.bootstrap.replicates = 60;
    options.bootstrap.seed = 17;
    options.includeIci = false;
    const InternalValidation core =
        internalValidation(*window_.controller().study().model, dataOf(window_), options);
    const auto& measures = core.optimism.measures;
    QCOMPARE(child<QTableView>(dialog, "internalTable")->model()->rowCount(),
             static_cast<int>(measures.size()));
    for (std::size_t i = 0; i < measures.size(); ++i) {
      const int row = static_cast<int>(i);
      QCOMPARE(cell(dialog, "internalTable", row, 0), QString::fromStdString(measures[i].measure));
      QCOMPARE(cell(dialog, "internalTable", row, 1), fixed(measures[i].apparent, 4));
      QCOMPARE(cell(dialog, "internalTable", row, 3), fixed(measures[i].corrected, 4));
    }
    // A model fitted on 189 patients with 9 coefficients is optimistic: the corrected AUC is
    // below the apparent one and the shrinkage factor below 1.
    QVERIFY(measures[0].corrected < measures[0].apparent);
    QVERIFY(core.optimism.shrinkageFactor < 1.0);
    QCOMPARE(dialog.result()->optimism.shrinkageFactor, core.optimism.shrinkageFactor);

    // The shrunk model is written in the background and its mean risk equals the event rate.
    QSignalSpy saved(&dialog, &InternalValidationDialog::modelSaved);
    const QString shrunkPath = dir_.filePath("shrunk.json");
    QVERIFY(dialog.startSaveShrunkModel(shrunkPath));
    dialog.job()->waitForFinished();
    QCOMPARE(saved.count(), 1);
    const ValidationRun run = validateOnBirthwt(shrunkPath);
    QVERIFY(std::abs(run.result.calibration.oeRatio - 1.0) < 1e-6);

    // Cancel keeps the result already shown.
    const double before = dialog.result()->optimism.shrinkageFactor;
    child<QSpinBox>(dialog, "internalReplicates")->setValue(100000);
    dialog.startRun();
    dialog.job()->cancel();
    dialog.job()->waitForFinished();
    QVERIFY(dialog.result() != nullptr);
    QCOMPARE(dialog.result()->optimism.shrinkageFactor, before);
    QVERIFY(child<QLabel>(dialog, "internalStatus")->text().contains("Cancelled"));
  }

  void updateDialogShowsTheClosedTestAndSavesTheChosenUpdate() {
    ModelUpdateDialog dialog(*window_.controller().study().model, window_.controller().cohort(), *window_.controller().study().data);
    dialog.startRun();
    dialog.job()->waitForFinished();
    QVERIFY(dialog.result() != nullptr);
    const ClosedTestResult core =
        closedTest(*window_.controller().study().model, dataOf(window_), 0.05, UpdateOptions{});
    QCOMPARE(child<QTableView>(dialog, "updateClosedTestTable")->model()->rowCount(),
             static_cast<int>(core.steps.size()));
    for (std::size_t i = 0; i < core.steps.size(); ++i) {
      QCOMPARE(cell(dialog, "updateClosedTestTable", static_cast<int>(i), 1),
               fixed(core.steps[i].lrStatistic, 3));
    }
    QCOMPARE(dialog.result()->closed.suggested, core.suggested);
    // The model was fitted on these patients: no update is needed.
    QCOMPARE(core.suggested, UpdateMethod::None);

    dialog.chooseMethod(UpdateMethod::Recalibrate);
    const QString path = dir_.filePath("recalibrated.json");
    QCOMPARE(dialog.saveChosenModel(path, false), QString());
    const Model updated = readModelFile(path.toStdString());
    QVERIFY(updated.provenance && updated.provenance->find("updated from") != std::string::npos);
    const ValidationRun run = validateOnBirthwt(path);
    QVERIFY(std::abs(run.result.calibration.slope - 1.0) < 1e-6);
    QVERIFY(std::abs(run.result.calibration.intercept) < 1e-6);
    // A file that cannot be written gives the reason and no signal.
    QSignalSpy saved(&dialog, &ModelUpdateDialog::modelSaved);
    QVERIFY(!dialog.saveChosenModel(dir_.filePath("no/such/folder/m.json"), false).isEmpty());
    QCOMPARE(saved.count(), 0);
  }

  // A model not developed on this cohort: internal validation is refused with the reason, and no
  // dialog opens; stating that the cohort is its development data lets it run.
  void internalValidationOfAModelFromElsewhereIsRefused() {
    MainWindow w;
    QVERIFY(w.controller().openInputs(kBirthwt, publishedPath_, lowOutcome()));
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 60000);
    w.findChild<QAction*>("actionInternalValidation")->trigger();
    QVERIFY2(w.messageText().contains("is for a model fitted on this cohort"),
             qPrintable(w.messageText()));
    QVERIFY(w.messageText().contains("records no development data"));
    QVERIFY(!internalValidationRefusal(*w.controller().study().model, w.controller().study().data->sha256, false).empty());
    QVERIFY(internalValidationRefusal(*w.controller().study().model, w.controller().study().data->sha256, true).empty());
  }

  // "Save and validate it here": the updated model on the patients it was updated on is apparent
  // performance everywhere (checkbox, run, Hosmer-Lemeshow on g - 2 df, the message says why),
  // and the study's bootstrap is run again for it instead of being dropped.
  void savedUpdateIsValidatedAsApparentWithTheStudysSettings() {
    MainWindow w;
    QVERIFY(w.controller().openInputs(kBirthwt, modelPath_, lowOutcome()));
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 60000);
    UncertaintySettings settings;
    settings.bootstrapReplicates = 20;
    settings.seed = 3;
    QVERIFY(w.controller().runUncertainty(settings));
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 60000);
    QVERIFY(w.controller().study().uncertainty && w.controller().study().uncertainty->bootstrap);

    const QString path = dir_.filePath("recalibrated_here.json");
    writeModelFile(
        path.toStdString(),
        updateModel(*w.controller().study().model, dataOf(w), UpdateMethod::Recalibrate, UpdateOptions{}).model);
    QVERIFY(w.controller().validateUpdatedModel(path));
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 60000);
    QVERIFY(w.controller().study().analysis.apparent);
    QVERIFY(w.findChild<QCheckBox*>("apparentCheck")->isChecked());
    QCOMPARE(w.controller().study().run->performance, std::string(kPerformanceApparent));
    QCOMPARE(w.controller().study().result->hosmerLemeshow.df, 8);
    QVERIFY(std::abs(w.controller().study().result->calibration.slope - 1.0) < 1e-6);
    QVERIFY2(w.messageText().contains("apparent performance"), qPrintable(w.messageText()));
    QVERIFY(w.controller().study().uncertainty && w.controller().study().uncertainty->bootstrap);
    QCOMPARE(w.controller().study().uncertainty->bootstrap->run.replicates, 20);
  }

  // The fit dialog with a spline: the coefficient table and the deviance of R's glm with the
  // same spline space (tests/reference/data/birthwt_spline.csv, R 4.2.2, splines::ns).
  void fitDialogFitsASplineAsRDoes() {
    FitDialog dialog(birthwtTable(), lowOutcome(), predictors({"age", "lwt", "race", "smoke"}));
    auto* splines = child<QLineEdit>(dialog, "fitSplines");
    splines->setText("age=9");
    dialog.startFit();
    QVERIFY(dialog.fitted() == nullptr);
    QVERIFY(child<QLabel>(dialog, "fitStatus")->text().contains("3 to 7 knots"));
    splines->setText("age=4");
    dialog.startFit();
    dialog.job()->waitForFinished();
    QVERIFY(dialog.fitted() != nullptr);
    QCOMPARE(dialog.fittedWith().splineKnots, (std::map<std::string, int>{{"age", 4}}));
    const Model& m = dialog.fitted()->model;
    QCOMPARE(m.terms[0].name, std::string("age spline 0"));
    QCOMPARE(m.terms[2].name, std::string("age spline 2"));
    QVERIFY(std::abs(dialog.fitted()->fit.deviance - 209.9751131607876) < 1e-7);
    // One row per coefficient: the intercept and every term.
    QCOMPARE(child<QTableView>(dialog, "fitCoefficientTable")->model()->rowCount(),
             static_cast<int>(m.terms.size()) + 1);
  }

  // Profile-likelihood columns in the fit dialog: R's exact profile of birthwt's
  // low ~ age + lwt + race + ftv (tests/reference/data/birthwt_profile.csv, R 4.2.2).
  void fitDialogShowsProfileIntervalsAsR() {
    FitDialog dialog(birthwtTable(), lowOutcome(), predictors({"age", "lwt", "race", "ftv"}));
    child<QCheckBox>(dialog, "fitProfile")->setChecked(true);
    dialog.startFit();
    dialog.job()->waitForFinished();
    QVERIFY(dialog.fitted() != nullptr && dialog.fitted()->profile.has_value());
    QVERIFY(dialog.fittedWith().profileIntervals);
    auto* view = child<QTableView>(dialog, "fitCoefficientTable");
    int lower = -1;
    for (int c = 0; c < view->model()->columnCount(); ++c) {
      if (view->model()->headerData(c, Qt::Horizontal).toString() == "Profile 95% lower") lower = c;
    }
    QVERIFY(lower > 0);
    // R: age -0.091648756 to 0.041266997 (row 1); race=white -1.990925118 to -0.022992169 (row 4).
    QCOMPARE(cell(dialog, "fitCoefficientTable", 1, lower), QString("-0.0916"));
    QCOMPARE(cell(dialog, "fitCoefficientTable", 1, lower + 1), QString("0.0413"));
    QCOMPARE(cell(dialog, "fitCoefficientTable", 4, lower), QString("-1.9909"));
    QCOMPARE(cell(dialog, "fitCoefficientTable", 4, lower + 1), QString("-0.0230"));
  }

  // With CALIVERA_SCREENSHOT_DIR set: both dialogs after a run, as PNG (docs/screenshots).
  void screenshots() {
    const QByteArray folder = qgetenv("CALIVERA_SCREENSHOT_DIR");
    if (folder.isEmpty()) QSKIP("CALIVERA_SCREENSHOT_DIR not set");
    InternalValidationDialog internal(*window_.controller().study().model, window_.controller().cohort(),
                                      *window_.controller().study().data);
    internal.startRun();
    internal.job()->waitForFinished();
    internal.show();
    QVERIFY(QTest::qWaitForWindowExposed(&internal));
    QVERIFY(internal.grab().save(QString::fromUtf8(folder) + "/internal_validation_dialog.png"));
    ModelUpdateDialog update(*window_.controller().study().model, window_.controller().cohort(), *window_.controller().study().data);
    update.startRun();
    update.job()->waitForFinished();
    update.show();
    QVERIFY(QTest::qWaitForWindowExposed(&update));
    QVERIFY(update.grab().save(QString::fromUtf8(folder) + "/model_update_dialog.png"));
    ImportSettings import;
    import.outcomeColumn = "low";
    FitSettings settings;
    settings.predictors = {"age", "lwt", "race", "smoke"};
    settings.splineKnots = {{"age", 4}};
    FitDialog fit(window_.controller().table(), import, settings);
    fit.startFit();
    fit.job()->waitForFinished();
    fit.show();
    QVERIFY(QTest::qWaitForWindowExposed(&fit));
    QVERIFY(fit.grab().save(QString::fromUtf8(folder) + "/fit_dialog.png"));
  }

 private:
  QTemporaryDir dir_;
  QString modelPath_;
  QString publishedPath_;
  MainWindow window_;
};

QTEST_MAIN(ModelToolsTest)
#include "model_tools_test.moc"
