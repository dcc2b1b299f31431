// Drives the real main window offscreen through objectNames: open a study, run the validation,
// move the threshold, and check that every linked view and the threshold table agree with core's
// results at that threshold; bad files leave the study intact; save -> reopen round trip; exports.
//
// The cohort is simulated here (a property check: the views must agree with core, whatever the
// numbers); the sample study under resources/ is opened too when the sample data exists.
#include "ui/main_window.h"

#include <QAction>
#include <QComboBox>
#include <QDialogButtonBox>
#include <QDoubleSpinBox>
#include <QFile>
#include <QImage>
#include <QLabel>
#include <QLineEdit>
#include <QListWidget>
#include <QProgressBar>
#include <QPushButton>
#include <QScrollBar>
#include <QSlider>
#include <QSortFilterProxyModel>
#include <QSpinBox>
#include <QTabWidget>
#include <QTableView>
#include <QTableWidget>
#include <QTemporaryDir>
#include <QTextBrowser>
#include <QTimer>
#include <QtCharts/QAreaSeries>
#include <QtCharts/QLineSeries>
#include <QtTest>
#include <cmath>
#include <fstream>
#include <functional>
#include <random>

#include "core/data/csv_reader.h"
#include "core/fit/cohort_fit.h"
#include "core/metrics/threshold_index.h"
#include "core/metrics/validation_run.h"
#include "core/model/model_io.h"
#include "core/study/study_file.h"
#include "core/uncertainty/uncertainty_run.h"
#include "core/util/sha256.h"
#include "render/charts/calibration_chart.h"
#include "render/charts/decision_curve_chart.h"
#include "render/charts/distribution_chart.h"
#include "render/charts/predictor_charts.h"
#include "render/charts/roc_chart.h"
#include "ui/async/background_job.h"
#include "ui/dialogs/help_dialog.h"
#include "ui/dialogs/report_export_dialog.h"
#include "ui/dialogs/reproduce_dialog.h"
#include "ui/dialogs/uncertainty_dialog.h"
#include "ui/models/table_export.h"
#include "ui/views/caution_text.h"
#include "ui/views/chart_panel.h"
#include "ui/views/forest_widget.h"
#include "ui/views/predictor_view.h"
#include "ui/views/sites_view.h"
#include "ui/views/subgroup_view.h"

using namespace calivera;
using namespace calivera::ui;

namespace {

constexpr double kIntercept = -6.5, kAge = 0.07, kMale = 0.45, kMarker = 0.3;

// Simulated cohort: age (years), sex (text), marker; outcome "yes"/"no"; a few ages missing.
void writeCohort(const QString& path, int n, unsigned seed) {
  std::mt19937 rng(seed);
  std::normal_distribution<double> age(62, 11), marker(1.5, 0.8);
  std::uniform_real_distribution<double> u(0, 1);
  std::ofstream out(path.toStdString());
  out << "age,sex,marker,died\n";
  for (int i = 0; i < n; ++i) {
    const double a = age(rng), m = marker(rng);
    const bool male = u(rng) < 0.5;
    const double lp = kIntercept + kAge * a + kMale * male + kMarker * m;
    const bool died = u(rng) < 1 / (1 + std::exp(-lp));
    if (i % 97 == 5) {
      out << "NA";
    } else {
      out << std::round(a * 10) / 10;
    }
    out << ',' << (male ? "male" : "female") << ',' << std::round(m * 100) / 100 << ','
        << (died ? "yes" : "no") << '\n';
  }
}

Model demoModel() {
  Model m;
  m.name = "Simulated mortality model";
  m.outcome = "died";
  m.intercept.coefficient = kIntercept;
  Term age;
  age.name = "age";
  age.variable = "age";
  age.unit = "years";
  age.estimate.coefficient = kAge;
  Term male;
  male.name = "sex=male";
  male.variable = "sex";
  male.kind = TransformKind::Indicator;
  male.level = "male";
  male.estimate.coefficient = kMale;
  Term marker;
  marker.name = "marker";
  marker.variable = "marker";
  marker.estimate.coefficient = kMarker;
  m.terms = {age, male, marker};
  return m;
}

std::string sha256OfFileForTest(const QString& p) {
  return sha256OfFile(p.toStdString());
}

void waitForJob(MainWindow& w) {
  QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 60000);
}

template <class T>
T* child(QObject& root, const char* name) {
  T* found = root.findChild<T*>(QString::fromLatin1(name));
  if (found == nullptr) qFatal("no child named %s", name);
  return found;
}

QString text(QObject& root, const char* name) {
  return child<QLabel>(root, name)->text();
}

bool appendTo(const QString& path, const char* text) {
  QFile f(path);
  return f.open(QIODevice::Append) && f.write(text) > 0;
}

QString cellText(QTableView* view, int row, int column) {
  return view->model()->index(row, column).data().toString();
}

int columnOf(QTableView* view, const QString& header) {
  for (int c = 0; c < view->model()->columnCount(); ++c) {
    if (view->model()->headerData(c, Qt::Horizontal).toString() == header) return c;
  }
  qFatal("no column %s", qPrintable(header));
  return -1;
}

const QString kSampleStudy = QStringLiteral(CALIVERA_SOURCE_DIR "/resources/sample_study.cvstudy");
const QString kSampleCohort = QStringLiteral(CALIVERA_SOURCE_DIR "/sample_data/local_cohort.csv");
const QString kSampleModel =
    QStringLiteral(CALIVERA_SOURCE_DIR "/sample_data/published_model.json");

// A chart's band holds the finite bootstrap bounds, in order: upper = ci.hi, lower = ci.lo.
void compareBand(QAreaSeries* area, const std::vector<BandPoint>& band) {
  QVERIFY(area != nullptr);
  std::vector<BandPoint> finite;
  for (const BandPoint& p : band) {
    if (std::isfinite(p.ci.lo) && std::isfinite(p.ci.hi)) finite.push_back(p);
  }
  QVERIFY(!finite.empty());
  const QList<QPointF> upper = area->upperSeries()->points();
  const QList<QPointF> lower = area->lowerSeries()->points();
  QCOMPARE(static_cast<std::size_t>(upper.size()), finite.size());
  QCOMPARE(static_cast<std::size_t>(lower.size()), finite.size());
  for (std::size_t i = 0; i < finite.size(); ++i) {
    const auto k = static_cast<qsizetype>(i);
    QCOMPARE(upper[k].x(), finite[i].x);
    QCOMPARE(upper[k].y(), finite[i].ci.hi);
    QCOMPARE(lower[k].y(), finite[i].ci.lo);
  }
}

// Both bootstraps' intervals, replicate for replicate the same seed: bit-identical.
void compareBootstrap(const ValidationBootstrap& a, const ValidationBootstrap& b) {
  QCOMPARE(a.run.replicates, b.run.replicates);
  QCOMPARE(a.run.failed, b.run.failed);
  for (auto m :
       {&ValidationBootstrap::auc, &ValidationBootstrap::brier, &ValidationBootstrap::brierScaled,
        &ValidationBootstrap::calibrationIntercept, &ValidationBootstrap::calibrationSlope,
        &ValidationBootstrap::oeRatio, &ValidationBootstrap::ici, &ValidationBootstrap::e90}) {
    QCOMPARE((a.*m).ci.lo, (b.*m).ci.lo);
    QCOMPARE((a.*m).ci.hi, (b.*m).ci.hi);
  }
  QCOMPARE(a.calibrationCurve.size(), b.calibrationCurve.size());
  for (std::size_t i = 0; i < a.calibrationCurve.size(); ++i) {
    QCOMPARE(a.calibrationCurve[i].ci.lo, b.calibrationCurve[i].ci.lo);
    QCOMPARE(a.calibrationCurve[i].ci.hi, b.calibrationCurve[i].ci.hi);
  }
  QCOMPARE(a.netBenefit.size(), b.netBenefit.size());
  for (std::size_t i = 0; i < a.netBenefit.size(); ++i) {
    QCOMPARE(a.netBenefit[i].ci.lo, b.netBenefit[i].ci.lo);
    QCOMPARE(a.netBenefit[i].ci.hi, b.netBenefit[i].ci.hi);
  }
}

}  // namespace

class MainWindowTest : public QObject {
  Q_OBJECT

 private:
  QTemporaryDir dir_;
  QString cohort_, model_, study_;

  QString path(const QString& name) const { return dir_.filePath(name); }

  QString secondModel_;

  // A second model for the sample data to compare with: refitted on the sample cohort with
  // fewer predictors (demo input only; the checks compare the window with core on it).
  QString secondModel() {
    if (!secondModel_.isEmpty()) return secondModel_;
    const Table table = readCsvFile(kSampleCohort.toStdString(), CsvOptions{}).table;
    CohortFitSpec spec;
    spec.outcome = OutcomeSpec{"complication_30d", std::nullopt};
    spec.predictors = {"age", "urgency", "reserve"};
    spec.modelName = "Refit: age, urgency, reserve";
    const CohortFit fit = fitCohortModel(table, spec);
    secondModel_ = path("refit_model.json");
    writeModelFile(secondModel_.toStdString(), fit.model);
    return secondModel_;
  }

  UncertaintySettings sampleSettings() {
    UncertaintySettings s;
    s.bootstrapReplicates = 50;
    s.seed = 7;
    s.threads = 2;
    s.compareModels = {InputFileRecord{secondModel().toStdString(), {}}};
    s.subgroupColumns = {"site"};
    s.clusterColumn = "site";
    return s;
  }

  // The sample study's validation as the command line's core computes it.
  static ValidationRun sampleRun() {
    ValidationRequest request;
    request.dataPath = kSampleCohort.toStdString();
    request.outcome = OutcomeSpec{"complication_30d", std::nullopt};
    request.modelPath = kSampleModel.toStdString();
    return runValidation(request);
  }

  void openSample(MainWindow& w) {
    QVERIFY(w.controller().openStudy(kSampleStudy));
    waitForJob(w);
    QVERIFY2(w.controller().study().result != nullptr, qPrintable(w.messageText()));
  }

  void runUncertainty(MainWindow& w, const UncertaintySettings& s) {
    QVERIFY(w.controller().runUncertainty(s));
    waitForJob(w);
    QVERIFY2(w.controller().study().uncertainty != nullptr, qPrintable(w.messageText()));
    QVERIFY2(
        w.controller().study().uncertainty->bootstrap.has_value() == (s.bootstrapReplicates > 0),
        qPrintable(w.messageText()));
  }

  // Opens the simulated study and waits for the validation.
  void openStudy(MainWindow& w) {
    QVERIFY(w.controller().openStudy(study_));
    waitForJob(w);
    QVERIFY2(w.controller().study().result != nullptr, qPrintable(w.messageText()));
  }

 private slots:
  void initTestCase() {
    QVERIFY(dir_.isValid());
    cohort_ = path("cohort.csv");
    model_ = path("model.json");
    study_ = path("simulated.cvstudy");
    writeCohort(cohort_, 3000, 11);
    writeModelFile(model_.toStdString(), demoModel());
    StudyState s;
    s.data = InputFileRecord{cohort_.toStdString(), sha256OfFileForTest(cohort_)};
    s.import.outcomeColumn = "died";
    s.import.eventValue = "yes";
    s.modelSource = ModelSource::File;
    s.modelFile = InputFileRecord{model_.toStdString(), sha256OfFileForTest(model_)};
    writeStudyFile(study_.toStdString(), s);
  }

  void bannerIsAlwaysShown() {
    MainWindow w;
    w.show();
    QLabel* banner = child<QLabel>(w, "cautionBanner");
    QVERIFY(banner->isVisible());
    QVERIFY(banner->text().contains("do not replace clinical judgment"));
    QVERIFY(banner->text().contains("local clinical governance"));
    openStudy(w);
    QVERIFY(banner->isVisible());
  }

  void everyViewFollowsTheThreshold_data() {
    QTest::addColumn<double>("threshold");
    QTest::newRow("grid 0.10") << 0.10;
    QTest::newRow("grid 0.25") << 0.25;
    QTest::newRow("grid 0.50") << 0.50;
  }

  void everyViewFollowsTheThreshold() {
    QFETCH(double, threshold);
    MainWindow w;
    w.show();
    openStudy(w);
    const ValidationResult& r = *w.controller().study().result;
    child<QDoubleSpinBox>(w, "thresholdSpin")->setValue(threshold);
    QCOMPARE(w.controller().thresholdState().threshold(), threshold);

    // Core's own threshold table row (computed by validate(), not by the UI's index).
    const auto row = std::find_if(
        r.thresholds.begin(), r.thresholds.end(),
        [&](const ThresholdRow& t) { return std::abs(t.threshold - threshold) < 1e-12; });
    QVERIFY(row != r.thresholds.end());
    QCOMPARE(text(w, "confusionTp"), QString::number(row->tp));
    QCOMPARE(text(w, "confusionFp"), QString::number(row->fp));
    QCOMPARE(text(w, "confusionTn"), QString::number(row->tn));
    QCOMPARE(text(w, "confusionFn"), QString::number(row->fn));
    QCOMPARE(text(w, "confusionFlagged"), QString::number(row->tp + row->fp));
    QCOMPARE(text(w, "confusionTotal"), QString::number(r.cohort.n));

    auto* roc = dynamic_cast<charts::RocChart*>(child<ChartPanel>(w, "rocView")->linkedChart());
    QVERIFY(roc != nullptr);
    QCOMPARE(roc->operatingPoint().x(), 1.0 - row->specificity);
    QCOMPARE(roc->operatingPoint().y(), row->sensitivity);
    auto* cal = dynamic_cast<charts::CalibrationChart*>(
        child<ChartPanel>(w, "calibrationView")->linkedChart());
    QCOMPARE(cal->markedThreshold(), threshold);
    auto* dca = dynamic_cast<charts::DecisionCurveChart*>(
        child<ChartPanel>(w, "decisionCurveView")->linkedChart());
    QCOMPARE(dca->markedThreshold(), threshold);
    auto* dist = dynamic_cast<charts::DistributionChart*>(
        child<ChartPanel>(w, "distributionView")->linkedChart());
    QCOMPARE(dist->markedThreshold(), threshold);

    // Natural frequencies: core's per-1000 figures, rounded as the panel shows them.
    const QString nf = text(w, "naturalFrequencyText");
    QVERIFY2(nf.contains(QString("%1 are flagged").arg(std::lround(row->flaggedPer1000))),
             qPrintable(nf));
    QVERIFY(
        nf.contains(QString("%1 events are caught").arg(std::lround(row->eventsCaughtPer1000))));
    QVERIFY(
        nf.contains(QString("%1 events are missed").arg(std::lround(row->eventsMissedPer1000))));
    QVERIFY(nf.contains(
        QString("%1 are flagged without").arg(std::lround(row->flaggedWithoutEventPer1000))));

    // Net benefit: core's decision curve at the same threshold.
    const auto dc = std::find_if(
        r.decisionCurve.begin(), r.decisionCurve.end(),
        [&](const DecisionCurvePoint& p) { return std::abs(p.threshold - threshold) < 1e-12; });
    QVERIFY(dc != r.decisionCurve.end());
    QVERIFY(text(w, "netBenefitText").contains(QString::number(dc->netBenefit, 'f', 4)));

    // The highlighted row of the threshold table is this threshold.
    auto* table = child<QTableView>(w, "thresholdTable");
    const QModelIndex current = table->selectionModel()->currentIndex();
    QVERIFY(current.isValid());
    QCOMPARE(table->model()->index(current.row(), 0).data().toString(),
             QString::number(threshold, 'f', 3));
    int tpColumn = -1;
    for (int c = 0; c < table->model()->columnCount(); ++c) {
      if (table->model()->headerData(c, Qt::Horizontal).toString() == "TP") tpColumn = c;
    }
    QVERIFY(tpColumn > 0);
    QCOMPARE(table->model()->index(current.row(), tpColumn).data().toString(),
             QString::number(row->tp));
  }

  void offGridThresholdMatchesBruteForce() {
    MainWindow w;
    w.show();
    openStudy(w);
    const double t = 0.1372;
    child<QDoubleSpinBox>(w, "thresholdSpin")->setValue(t);
    const auto cohort = w.controller().cohort();
    std::size_t tp = 0, fp = 0;
    for (std::size_t i = 0; i < cohort->risk().size(); ++i) {
      if (cohort->risk()[i] >= t) (cohort->outcome()[i] > 0.5 ? tp : fp)++;
    }
    QCOMPARE(text(w, "confusionTp"), QString::number(tp));
    QCOMPARE(text(w, "confusionFp"), QString::number(fp));
    QCOMPARE(child<QSlider>(w, "thresholdSlider")->value(), 137);
  }

  void keyboardAndSliderMoveTheThreshold() {
    MainWindow w;
    w.show();
    openStudy(w);
    w.controller().setThreshold(0.2);
    auto* roc = child<ChartPanel>(w, "rocView");
    roc->setFocus();
    QTest::keyClick(roc, Qt::Key_Right);
    QCOMPARE(w.controller().thresholdState().threshold(), 0.205);
    QTest::keyClick(roc, Qt::Key_Left);
    QTest::keyClick(roc, Qt::Key_Left);
    QCOMPARE(w.controller().thresholdState().threshold(), 0.195);
    child<QSlider>(w, "thresholdSlider")->setValue(300);
    QCOMPARE(w.controller().thresholdState().threshold(), 0.3);
    QCOMPARE(child<QDoubleSpinBox>(w, "thresholdSpin")->value(), 0.3);
  }

  void clickingTheDecisionCurveSetsTheThreshold() {
    MainWindow w;
    w.show();
    openStudy(w);
    QVERIFY(QTest::qWaitForWindowExposed(&w));
    auto* panel = child<ChartPanel>(w, "decisionCurveView");
    auto* chart = panel->linkedChart();
    const QPointF scene = chart->mapToPosition(QPointF(0.3, 0.0), chart->series().last());
    const QPoint pos = panel->mapFromScene(scene);
    QTest::mouseClick(panel->viewport(), Qt::LeftButton, {}, pos);
    QVERIFY2(std::abs(w.controller().thresholdState().threshold() - 0.3) < 0.01,
             qPrintable(QString::number(w.controller().thresholdState().threshold())));
    auto* rocPanel = child<ChartPanel>(w, "rocView");
    auto* roc = dynamic_cast<charts::RocChart*>(rocPanel->linkedChart());
    const RocPoint& p = w.controller()
                            .study()
                            .result->discrimination
                            .roc[w.controller().study().result->discrimination.roc.size() / 2];
    const QPoint rocPos =
        rocPanel->mapFromScene(roc->mapToPosition(QPointF(p.fpr, p.tpr), roc->series().last()));
    QTest::mouseClick(rocPanel->viewport(), Qt::LeftButton, {}, rocPos);
    // The nearest ROC point to the click may be a neighbour of p on screen; its threshold is close.
    QVERIFY(std::abs(w.controller().thresholdState().threshold() -
                     std::clamp(p.threshold, 0.0, 1.0)) < 0.05);
  }

  // A click on a threshold-table row moves the threshold to that row's threshold, also when the
  // table is sorted (the row is mapped through the sort).
  void clickingAThresholdRowSetsTheThreshold() {
    MainWindow w;
    w.show();
    openStudy(w);
    auto* table = child<QTableView>(w, "thresholdTable");
    child<QTabWidget>(w, "tableTabs")->setCurrentWidget(table);
    child<QTabWidget>(w, "mainTabs")->setCurrentWidget(child<QTabWidget>(w, "tableTabs"));
    QVERIFY(QTest::qWaitForWindowExposed(&w));
    table->sortByColumn(0, Qt::DescendingOrder);
    const QModelIndex first = table->model()->index(0, 0);
    const double shown = table->model()->data(first).toString().toDouble();
    const QRect cell = table->visualRect(first);
    QTest::mouseClick(table->viewport(), Qt::LeftButton, {}, cell.center());
    QCOMPARE(w.controller().thresholdState().threshold(),
             w.controller().study().result->thresholds.back().threshold);
    QVERIFY(std::abs(shown - w.controller().thresholdState().threshold()) < 5e-4);
    table->sortByColumn(-1, Qt::AscendingOrder);
  }

  void badStudyFileLeavesTheStudyIntact() {
    MainWindow w;
    w.show();
    openStudy(w);
    const auto before = w.controller().study().result;
    const QString bad = path("broken.cvstudy");
    {
      QFile f(bad);
      QVERIFY(f.open(QIODevice::WriteOnly));
      f.write("{\"format\": \"calivera-study/1\", \"import\": ");
    }
    QVERIFY(!w.controller().openStudy(bad));
    QVERIFY(w.messageText().contains("broken.cvstudy"));
    QVERIFY(w.messageText().contains("not valid JSON"));
    QCOMPARE(w.controller().study().result, before);
    QCOMPARE(w.controller().studyPath(), study_);
  }

  void badCohortFileLeavesTheStudyIntact() {
    MainWindow w;
    w.show();
    openStudy(w);
    const auto before = w.controller().study().result;
    const QString ragged = path("ragged.csv");
    {
      QFile f(ragged);
      QVERIFY(f.open(QIODevice::WriteOnly));
      f.write("age,sex,marker,died\n60,male,1.2,yes\n61,female\n");
    }
    ImportSettings s = w.controller().study().import;
    QVERIFY(w.controller().importCohort(ragged, s));
    waitForJob(w);
    QVERIFY2(w.messageText().contains("ragged.csv"), qPrintable(w.messageText()));
    QCOMPARE(w.controller().study().result, before);
    QCOMPARE(QString::fromStdString(w.controller().study().data->path), cohort_);
    // A bad model file, too.
    const QString badModel = path("bad_model.json");
    {
      QFile f(badModel);
      QVERIFY(f.open(QIODevice::WriteOnly));
      f.write("{\"format\": \"something-else\"}");
    }
    QVERIFY(w.controller().loadModelFile(badModel));
    waitForJob(w);
    QVERIFY2(w.messageText().contains("bad_model.json"), qPrintable(w.messageText()));
    QCOMPARE(w.controller().study().result, before);
  }

  void saveAndReopenRoundTrip() {
    const QString saved = path("round_trip.cvstudy");
    double auc = 0.0;
    {
      MainWindow w;
      w.show();
      openStudy(w);
      w.controller().setThreshold(0.2125);
      child<QDoubleSpinBox>(w, "reasonableLoSpin")->setValue(0.08);
      child<QDoubleSpinBox>(w, "reasonableHiSpin")->setValue(0.35);
      QVERIFY(w.controller().saveStudy(saved));
      auc = w.controller().study().result->discrimination.auc;
    }
    MainWindow w;
    w.show();
    QVERIFY(w.controller().openStudy(saved));
    waitForJob(w);
    QVERIFY(w.controller().study().result != nullptr);
    QCOMPARE(w.controller().study().result->discrimination.auc, auc);
    QCOMPARE(w.controller().thresholdState().threshold(), 0.2125);
    QCOMPARE(child<QDoubleSpinBox>(w, "thresholdSpin")->value(), 0.2125);
    QCOMPARE(w.controller().study().analysis.reasonableLo, 0.08);
    QCOMPARE(w.controller().study().analysis.reasonableHi, 0.35);
    QCOMPARE(w.controller().study().import.eventValue.value_or(""), std::string("yes"));
    QVERIFY(w.messageText().isEmpty());
  }

  void changedInputIsReported() {
    const QString data = path("changing.csv");
    QVERIFY(QFile::copy(cohort_, data));
    StudyState s = readStudyFile(study_.toStdString());
    s.data = InputFileRecord{data.toStdString(), sha256OfFileForTest(data)};
    const QString saved = path("changing.cvstudy");
    writeStudyFile(saved.toStdString(), s);
    QVERIFY(appendTo(data, "70,male,2.5,yes\n"));
    MainWindow w;
    w.show();
    QVERIFY(w.controller().openStudy(saved));
    waitForJob(w);
    QTRY_VERIFY(w.messageText().contains("changed since the study was saved"));
    QVERIFY(w.controller().study().result != nullptr);
  }

  void exportsChartsAndTables() {
    MainWindow w;
    w.show();
    openStudy(w);
    const QString out = path("exports");
    QCOMPARE(w.exportAllCharts(out), QString());
    for (const char* name : {"roc", "calibration", "decision_curve", "risk_distribution"}) {
      QImage png(out + "/" + name + ".png");
      QVERIFY2(!png.isNull(), name);
      QVERIFY(png.width() >= 900);
      QFile svg(out + "/" + name + ".svg");
      QVERIFY(svg.open(QIODevice::ReadOnly));
      const QString text = QString::fromUtf8(svg.readAll());
      QVERIFY(text.contains("<svg"));
      // Every exported chart carries the caution and the inputs' fingerprints below it.
      QVERIFY2(text.contains("do not replace clinical judgment"), name);
      QVERIFY(text.contains(QString::fromStdString(w.controller().study().data->sha256)));
      QVERIFY(png.height() > 2 * w.exportFooter().size());
    }
    QCOMPARE(w.exportFooter().front(), cautionText());
    QVERIFY(w.exportFooter().back().contains("Calivera"));
    // A malformed SOURCE_DATE_EPOCH does not stop an export (the report refuses it; a chart
    // export falls back to the current time).
    qputenv("SOURCE_DATE_EPOCH", "not a number");
    QVERIFY(w.exportFooter().back().contains("UTC"));
    QCOMPARE(w.exportAllCharts(path("exports_again")), QString());
    qunsetenv("SOURCE_DATE_EPOCH");
    auto* table = child<QTableView>(w, "thresholdTable");
    const QString csv = path("thresholds.csv");
    QCOMPARE(writeTableCsv(*table->model(), csv), QString());
    QFile f(csv);
    QVERIFY(f.open(QIODevice::ReadOnly));
    const QList<QByteArray> lines = f.readAll().split('\n');
    // The command line's thresholds.csv (core/report/result_table.h), not the screen's labels.
    QVERIFY(lines.first().startsWith("threshold,tp,fp,tn,fn,sensitivity,sensitivity_lo"));
    QVERIFY(lines.first().endsWith("flagged,net_benefit"));
    QCOMPARE(lines.size() - 2, static_cast<int>(w.controller().study().result->thresholds.size()));
  }

  void predictorViewsMarkTheThreshold() {
    MainWindow w;
    w.show();
    openStudy(w);
    w.controller().setThreshold(0.3);
    auto* view = child<PredictorView>(w, "predictorView");
    view->choose("age", "");
    auto* curve = dynamic_cast<charts::RiskCurveChart*>(view->panel()->linkedChart());
    QVERIFY(curve != nullptr);
    QVERIFY(!curve->cutPoints().empty());
    // Independent check on the known linear model: risk(age cut) = 0.3 with sex and marker held at
    // the reference level (female) and the cohort median of marker.
    const auto& predictors =
        describePredictors(*w.controller().study().model, {}, *w.controller().cohort());
    double markerMedian = 0;
    for (const auto& p : predictors) {
      if (p.variable == "marker") markerMedian = p.median;
    }
    const double logit = std::log(0.3 / 0.7);
    const double ageCut = (logit - kIntercept - kMarker * markerMedian) / kAge;
    QVERIFY2(std::abs(curve->cutPoints().front() - ageCut) < 0.05,
             qPrintable(QString("%1 vs %2").arg(curve->cutPoints().front()).arg(ageCut)));

    // The held-values table lists the held predictors only, never an axis variable.
    const auto heldRowShown = [&](const QString& name) {
      auto* held = view->findChild<QTableWidget*>("predictorHeld");
      for (int row = 0; row < held->rowCount(); ++row) {
        if (held->item(row, 0)->text() == name) return !held->isRowHidden(row);
      }
      return false;
    };
    QVERIFY(!heldRowShown("age"));
    QVERIFY(heldRowShown("marker"));
    view->choose("age", "marker");
    QVERIFY(!heldRowShown("age") && !heldRowShown("marker"));
    auto* boundary = dynamic_cast<charts::BoundaryChart*>(view->panel()->linkedChart());
    QVERIFY(boundary != nullptr);
    QVERIFY(!boundary->boundary().empty());
    for (const auto& line : boundary->boundary()) {
      for (const auto& [age, marker] : line) {
        QVERIFY(std::abs(kIntercept + kAge * age + kMarker * marker - logit) < 1e-6);
      }
    }
    w.controller().setThreshold(0.4);
    const double logit4 = std::log(0.4 / 0.6);
    const auto& [age0, marker0] = boundary->boundary().front().front();
    QVERIFY(std::abs(kIntercept + kAge * age0 + kMarker * marker0 - logit4) < 1e-6);
  }

  void summaryShowsReadings() {
    MainWindow w;
    w.show();
    openStudy(w);
    const QString html = child<QTextBrowser>(w, "summaryPanel")->toPlainText();
    QVERIFY(html.contains("Calibration hierarchy"));
    QVERIFY(html.contains("AUC"));
    QVERIFY(
        html.contains(QString::number(w.controller().study().result->discrimination.auc, 'f', 3)));
  }

  // The linked views' side panel repeats core's sample-size verdict under the counts.
  void sidePanelSaysWhetherTheCohortIsLargeEnough() {
    MainWindow w;
    openStudy(w);
    QVERIFY(w.controller().study().uncertainty != nullptr);
    const SampleSizeAssessment& s = w.controller().study().uncertainty->sampleSize;
    auto* label = child<QLabel>(w, "adequacyText");
    QVERIFY(!label->isHidden());
    QVERIFY2(label->text().contains(QString::fromStdString(s.verdict).toHtmlEscaped()),
             qPrintable(label->text()));
    QCOMPARE(label->text().contains("Not for every measure"), !s.adequate);
  }

  // The window's uncertainty run against core's own pipeline (the command line's route:
  // runValidation + runUncertainty on the files) on the sample data.
  void uncertaintyViewsMatchCore() {
    if (!QFile::exists(kSampleStudy)) QSKIP("sample data not present");
    MainWindow w;
    w.show();
    openSample(w);
    // Before anything is asked for, the sample-size assessment is there and shown first.
    QVERIFY(w.controller().study().uncertainty != nullptr);
    QVERIFY(!w.controller().study().uncertainty->bootstrap);
    const QString before = child<QTextBrowser>(w, "summaryPanel")->toPlainText();
    QVERIFY(before.contains("Is the cohort large enough to judge the model?"));
    QVERIFY(before.indexOf("large enough") < before.indexOf("Discrimination"));

    const UncertaintySettings settings = sampleSettings();
    runUncertainty(w, settings);
    const UncertaintyResults& u = *w.controller().study().uncertainty;

    const ValidationRun run = sampleRun();
    UncertaintyRequest coreRequest;
    coreRequest.bootstrapReplicates = 50;
    coreRequest.seed = 7;
    coreRequest.threads = 1;  // other thread count than the window: same seed, same intervals
    coreRequest.compareModelPaths = {secondModel().toStdString()};
    coreRequest.subgroupColumns = {"site"};
    const UncertaintyResults ref = calivera::runUncertainty(run, coreRequest);

    QVERIFY(u.bootstrap && ref.bootstrap);
    compareBootstrap(*u.bootstrap, *ref.bootstrap);
    QCOMPARE(u.sampleSize.requiredN, ref.sampleSize.requiredN);
    QCOMPARE(u.sampleSize.verdict, ref.sampleSize.verdict);

    // Summary: the bootstrap interval beside the analytic one, with replicates and seed.
    const QString summary = child<QTextBrowser>(w, "summaryPanel")->toPlainText();
    QVERIFY2(summary.contains(QString("bootstrap %1 to %2")
                                  .arg(QString::number(ref.bootstrap->auc.ci.lo, 'f', 3),
                                       QString::number(ref.bootstrap->auc.ci.hi, 'f', 3))),
             qPrintable(summary));
    QVERIFY(summary.contains("50 resamples"));
    for (const auto& warning : ref.bootstrap->warnings) {
      QVERIFY(summary.contains(QString::fromStdString(warning)));
    }
    QVERIFY(summary.contains("seed 7"));
    QVERIFY(
        summary.contains(QString("n ≥ %1").arg(ref.sampleSize.criteria[0].requiredN, 0, 'f', 0)));

    // Bands on the linked views: core's percentile bounds, point for point.
    auto* calibrationChart = dynamic_cast<charts::CalibrationChart*>(
        child<ChartPanel>(w, "calibrationView")->linkedChart());
    auto* decisionChart = dynamic_cast<charts::DecisionCurveChart*>(
        child<ChartPanel>(w, "decisionCurveView")->linkedChart());
    QVERIFY(calibrationChart->curveBand() != nullptr);
    QVERIFY(decisionChart->netBenefitBand() != nullptr);
    compareBand(calibrationChart->curveBand(), ref.bootstrap->calibrationCurve);
    compareBand(decisionChart->netBenefitBand(), ref.bootstrap->netBenefit);
    // Overlays: the further model on ROC, calibration and decision curve.
    auto* rocChart =
        dynamic_cast<charts::RocChart*>(child<ChartPanel>(w, "rocView")->linkedChart());
    QCOMPARE(rocChart->comparisonCount(), std::size_t{1});
    QCOMPARE(calibrationChart->comparisonCount(), std::size_t{1});
    QCOMPARE(decisionChart->comparisonCount(), std::size_t{1});
    QCOMPARE(u.comparedResults[1].discrimination.auc, ref.comparedResults[1].discrimination.auc);

    // Subgroup table: every level's values as core computed them.
    QCOMPARE(u.subgroups.size(), std::size_t{1});
    const SubgroupAnalysis& sites = ref.subgroups[0];
    auto* table = child<QTableView>(w, "subgroupTable");
    QCOMPARE(table->model()->rowCount(), static_cast<int>(sites.levels.size()));
    const int aucCol = columnOf(table, "AUC"), slopeCol = columnOf(table, "Cal. slope"),
              interceptCol = columnOf(table, "Cal. intercept"), oeCol = columnOf(table, "O/E"),
              iciCol = columnOf(table, "ICI"), bootCol = columnOf(table, "AUC bootstrap CI");
    for (int r = 0; r < table->model()->rowCount(); ++r) {
      const SubgroupResult& level = sites.levels[static_cast<std::size_t>(r)];
      QCOMPARE(cellText(table, r, 0), QString::fromStdString(level.level));
      QCOMPARE(cellText(table, r, 1), QString::number(level.n));
      QCOMPARE(cellText(table, r, 2), QString::number(level.events));
      QVERIFY(level.metrics && level.bootstrap);
      const ValidationResult& m = *level.metrics;
      QCOMPARE(cellText(table, r, aucCol), QString::number(m.discrimination.auc, 'f', 3));
      QCOMPARE(cellText(table, r, slopeCol), QString::number(m.calibration.slope, 'f', 3));
      QCOMPARE(cellText(table, r, interceptCol), QString::number(m.calibration.intercept, 'f', 3));
      QCOMPARE(cellText(table, r, oeCol), QString::number(m.calibration.oeRatio, 'f', 3));
      QCOMPARE(cellText(table, r, iciCol), QString::number(m.calibration.ici, 'f', 4));
      QCOMPARE(cellText(table, r, bootCol),
               QString("%1 to %2")
                   .arg(QString::number(level.bootstrap->auc.ci.lo, 'f', 3),
                        QString::number(level.bootstrap->auc.ci.hi, 'f', 3)));
      QCOMPARE(u.subgroups[0].levels[static_cast<std::size_t>(r)].metrics->discrimination.auc,
               m.discrimination.auc);
    }
    // Sortable (numbers as numbers) and exportable like the other result tables.
    table->sortByColumn(aucCol, Qt::AscendingOrder);
    for (int r = 1; r < table->model()->rowCount(); ++r) {
      QVERIFY(cellText(table, r - 1, aucCol).toDouble() <= cellText(table, r, aucCol).toDouble());
    }
    const QString csv = path("subgroups.csv");
    QCOMPARE(writeTableCsv(*table->model(), csv), QString());
    QFile csvFile(csv);
    QVERIFY(csvFile.open(QIODevice::ReadOnly));
    const QList<QByteArray> csvLines = csvFile.readAll().split('\n');
    // The command line's subgroups.csv (core/report/uncertainty_result_tables.h): CSV keys.
    QVERIFY(csvLines.first().startsWith("column,level,n,events,too_small,auc,"));
    QCOMPARE(csvLines.size() - 2, static_cast<int>(sites.levels.size()));
    table->sortByColumn(-1, Qt::AscendingOrder);  // back to level order for the checks below

    // The chart shows the selected level's calibration.
    auto* view = child<SubgroupView>(w, "subgroupView");
    view->showLevel(1);
    auto* cal = dynamic_cast<charts::CalibrationChart*>(view->chartPanel()->linkedChart());
    QVERIFY(cal != nullptr);
    QVERIFY(cal->title().contains(QString::fromStdString(sites.levels[1].level)));
    QCOMPARE(cal->comparisonCount(), sites.levels.size() - 1);  // the other sites overlaid
    compareBand(cal->curveBand(), sites.levels[1].bootstrap->calibrationCurve);

    // Comparison: the paired DeLong difference of core, and the AUC of each model.
    QVERIFY(ref.comparison && u.comparison);
    const PairedAucTest& t = ref.comparison->pairs[0].auc;
    QCOMPARE(u.comparison->pairs[0].auc.difference, t.difference);
    QCOMPARE(u.comparison->pairs[0].auc.z, t.z);
    auto* delong = child<QTableView>(w, "comparisonDelongTable");
    QCOMPARE(delong->model()->rowCount(), 1);
    QCOMPARE(cellText(delong, 0, columnOf(delong, "Difference")),
             QString::number(t.difference, 'f', 4));
    QCOMPARE(cellText(delong, 0, columnOf(delong, "z")), QString::number(t.z, 'f', 3));
    QCOMPARE(cellText(delong, 0, columnOf(delong, "Correlation")),
             QString::number(t.correlation, 'f', 3));
    auto* models = child<QTableView>(w, "comparisonModelsTable");
    QCOMPARE(models->model()->rowCount(), 2);
    QCOMPARE(cellText(models, 1, columnOf(models, "AUC")),
             QString::number(ref.comparison->aucs[1], 'f', 3));
    QCOMPARE(cellText(models, 1, columnOf(models, "File")), QString("refit_model.json"));
    // Net-benefit differences only over the reasonable range (0.05 to 0.30 by 0.01: 26 rows).
    auto* nb = child<QTableView>(w, "comparisonNetBenefitTable");
    int inRange = 0;
    for (const auto& p : ref.comparison->pairs[0].netBenefit) {
      if (p.threshold >= 0.05 - 1e-12 && p.threshold <= 0.30 + 1e-12) ++inRange;
    }
    QCOMPARE(nb->model()->rowCount(), inRange);
    const auto& p10 = *std::find_if(
        ref.comparison->pairs[0].netBenefit.begin(), ref.comparison->pairs[0].netBenefit.end(),
        [](const auto& p) { return std::abs(p.threshold - 0.1) < 1e-9; });
    bool found = false;
    for (int r = 0; r < nb->model()->rowCount(); ++r) {
      if (cellText(nb, r, columnOf(nb, "Threshold")) != "0.100") continue;
      found = true;
      QCOMPARE(cellText(nb, r, columnOf(nb, "Difference")),
               QString::number(p10.difference, 'f', 4));
      QCOMPARE(cellText(nb, r, columnOf(nb, "Bootstrap 95% CI")),
               QString("%1 to %2")
                   .arg(QString::number(p10.ci.lo, 'f', 4), QString::number(p10.ci.hi, 'f', 4)));
    }
    QVERIFY(found);
    // The compared model's SHA-256 is recorded in the settings.
    QCOMPARE(w.controller().study().uncertaintySettings.compareModels[0].sha256,
             sha256OfFileForTest(secondModel()));

    // The report exported from the workstation carries the same uncertainty results.
    ReportExportRequest reportRequest;
    reportRequest.thresholds = {0.1, 0.2};
    const AuditReportInput reportInput = auditInputFromStudy(w.controller().study(), reportRequest);
    QVERIFY(reportInput.uncertainty && reportInput.uncertainty->bootstrap);
    compareBootstrap(*reportInput.uncertainty->bootstrap, *ref.bootstrap);
    QCOMPARE(reportInput.uncertainty->subgroups.size(), std::size_t{1});
    QCOMPARE(reportInput.uncertainty->comparison->pairs[0].auc.difference, t.difference);

    // Moving the threshold recomputes nothing.
    const auto results = w.controller().study().uncertainty;
    w.controller().setThreshold(0.25);
    QCOMPARE(w.controller().study().uncertainty, results);
  }

  // The menu action's dialog: subgroup columns offered from the cohort (not the outcome, not an
  // identifier with thousands of values), a compared model added, the run started from Run.
  void dialogStartsTheRun() {
    if (!QFile::exists(kSampleStudy)) QSKIP("sample data not present");
    MainWindow w;
    w.show();
    openSample(w);
    QStringList offered;
    QTimer::singleShot(0, &w, [&]() {
      auto* dialog = w.findChild<UncertaintyDialog*>("uncertaintyDialog");
      QVERIFY(dialog != nullptr);
      auto* list = dialog->findChild<QListWidget*>("subgroupColumnList");
      for (int i = 0; i < list->count(); ++i) offered << list->item(i)->text();
      dialog->findChild<QSpinBox*>("bootstrapReplicatesSpin")->setValue(20);
      dialog->findChild<QSpinBox*>("bootstrapSeedSpin")->setValue(3);
      dialog->addCompareModel(secondModel());
      dialog->setSubgroupChecked("urgency", true);
      auto* sizes = dialog->findChild<QLineEdit*>("sizeThresholdsEdit");
      auto* ok =
          dialog->findChild<QDialogButtonBox*>("uncertaintyButtons")->button(QDialogButtonBox::Ok);
      sizes->setText("0.1, abc");
      ok->click();  // refused, with the reason
      QVERIFY(dialog->isVisible());
      QVERIFY(dialog->findChild<QLabel*>("uncertaintyError")->text().contains("abc"));
      sizes->setText("0.1, 0.2");
      ok->click();
    });
    child<QAction>(w, "actionUncertainty")->trigger();
    waitForJob(w);
    QVERIFY(offered.contains("site"));
    QVERIFY(offered.contains("sex"));
    QVERIFY(!offered.contains("patient_ref"));
    QVERIFY(!offered.contains("complication_30d"));
    const UncertaintySettings& s = w.controller().study().uncertaintySettings;
    QCOMPARE(s.bootstrapReplicates, 20);
    QCOMPARE(s.seed, std::uint64_t{3});
    QCOMPARE(s.subgroupColumns, std::vector<std::string>{"urgency"});
    QVERIFY(w.controller().study().uncertainty && w.controller().study().uncertainty->comparison);
    QCOMPARE(w.controller().study().uncertainty->subgroups[0].column, std::string("urgency"));
    QCOMPARE(s.sizeThresholds, (std::vector<double>{0.1, 0.2}));
    // The net-benefit criteria, with the achieved width of the bootstrap interval.
    const SampleSizeAssessment& size = w.controller().study().uncertainty->sampleSize;
    QCOMPARE(size.criteria.size(), std::size_t{5});
    QCOMPARE(size.criteria[3].criterion, std::string("net benefit t=0.1"));
    QVERIFY(size.criteria[3].achievedCiWidth.has_value());
    const QString summary = child<QTextBrowser>(w, "summaryPanel")->toPlainText();
    QVERIFY(summary.contains("Riley size: net benefit t=0.2"));
    QVERIFY(summary.contains(QString::number(*size.criteria[3].achievedCiWidth, 'f', 3)));
  }

  // A compared model with a column the study's model does not use, missing for some patients:
  // the comparison runs on fewer patients and says so, on the tab and in the overlay's name.
  void comparisonOnFewerPatientsIsNoted() {
    const QString data = path("with_extra.csv");
    {
      QFile in(cohort_);
      QVERIFY(in.open(QIODevice::ReadOnly));
      QFile out(data);
      QVERIFY(out.open(QIODevice::WriteOnly));
      const QList<QByteArray> lines = in.readAll().split('\n');
      for (int i = 0; i < lines.size(); ++i) {
        if (lines[i].isEmpty()) continue;
        out.write(lines[i] + (i == 0 ? ",extra\n" : (i % 10 == 0 ? ",NA\n" : ",1.5\n")));
      }
    }
    Model other = demoModel();
    other.name = "With extra";
    Term extra;
    extra.name = "extra";
    extra.variable = "extra";
    extra.estimate.coefficient = 0.1;
    other.terms.push_back(extra);
    const QString otherPath = path("with_extra_model.json");
    writeModelFile(otherPath.toStdString(), other);
    StudyState s = readStudyFile(study_.toStdString());
    s.data = InputFileRecord{data.toStdString(), sha256OfFileForTest(data)};
    const QString saved = path("with_extra.cvstudy");
    writeStudyFile(saved.toStdString(), s);

    MainWindow w;
    w.show();
    QVERIFY(w.controller().openStudy(saved));
    waitForJob(w);
    QVERIFY(w.controller().study().result != nullptr);
    UncertaintySettings settings;
    settings.compareModels = {InputFileRecord{otherPath.toStdString(), {}}};
    QVERIFY(w.controller().runUncertainty(settings));
    waitForJob(w);
    const UncertaintyResults& u = *w.controller().study().uncertainty;
    QVERIFY(u.comparisonRows < w.controller().study().result->cohort.n);
    const QString note = text(w, "comparisonNote");
    QVERIFY2(note.contains("fewer than the validation"), qPrintable(note));
    QVERIFY(note.contains(QString("Compared on %1 patients").arg(u.comparisonRows)));
    QVERIFY(note.contains("no intervals"));  // no bootstrap asked for
    auto* roc = dynamic_cast<charts::RocChart*>(child<ChartPanel>(w, "rocView")->linkedChart());
    bool named = false;
    for (QAbstractSeries* series : roc->series()) {
      named = named || series->name().contains(QString("(on %1 patients)").arg(u.comparisonRows));
    }
    QVERIFY(named);
  }

  void sameSeedGivesIdenticalIntervals() {
    if (!QFile::exists(kSampleStudy)) QSKIP("sample data not present");
    MainWindow w;
    w.show();
    openSample(w);
    UncertaintySettings s;
    s.bootstrapReplicates = 30;
    s.seed = 11;
    s.threads = 1;
    runUncertainty(w, s);
    const auto first = w.controller().study().uncertainty;
    s.threads = 2;
    runUncertainty(w, s);
    QVERIFY(first != w.controller().study().uncertainty);
    compareBootstrap(*first->bootstrap, *w.controller().study().uncertainty->bootstrap);
    s.seed = 12;
    runUncertainty(w, s);
    QVERIFY(first->bootstrap->auc.ci.lo !=
            w.controller().study().uncertainty->bootstrap->auc.ci.lo);
  }

  void cancelOrFailureKeepsPreviousResults() {
    if (!QFile::exists(kSampleStudy)) QSKIP("sample data not present");
    MainWindow w;
    w.show();
    openSample(w);
    UncertaintySettings s;
    s.subgroupColumns = {"sex"};
    runUncertainty(w, s);
    const auto previous = w.controller().study().uncertainty;
    const auto previousSettings = w.controller().study().uncertaintySettings;

    s.bootstrapReplicates = 20000;
    QVERIFY(w.controller().runUncertainty(s));
    QVERIFY(w.controller().job()->isRunning());
    QTRY_VERIFY(child<QProgressBar>(w, "runProgress")->isVisible());
    child<QAction>(w, "actionCancel")->trigger();
    waitForJob(w);
    QCOMPARE(w.controller().study().uncertainty, previous);
    QCOMPARE(w.controller().study().uncertaintySettings.bootstrapReplicates, 0);
    QVERIFY2(w.messageText().contains("Cancelled"), qPrintable(w.messageText()));
    QCOMPARE(child<QTableView>(w, "subgroupTable")->model()->rowCount(),
             static_cast<int>(previous->subgroups[0].levels.size()));

    UncertaintySettings bad = s;
    bad.bootstrapReplicates = 0;
    bad.subgroupColumns = {"no_such_column"};
    QVERIFY(w.controller().runUncertainty(bad));
    waitForJob(w);
    QCOMPARE(w.controller().study().uncertainty, previous);
    QVERIFY2(w.messageText().contains("no_such_column"), qPrintable(w.messageText()));
    QCOMPARE(w.controller().study().uncertaintySettings.subgroupColumns,
             previousSettings.subgroupColumns);
  }

  void newModelClearsStaleUncertainty() {
    if (!QFile::exists(kSampleStudy)) QSKIP("sample data not present");
    MainWindow w;
    w.show();
    openSample(w);
    UncertaintySettings s;
    s.bootstrapReplicates = 20;
    runUncertainty(w, s);
    const auto results = w.controller().study().uncertainty;
    // Same cohort and model: the validation re-runs, the uncertainty results stay.
    child<QDoubleSpinBox>(w, "reasonableHiSpin")->setValue(0.4);
    QVERIFY(w.controller().runValidation());
    waitForJob(w);
    QCOMPARE(w.controller().study().uncertainty, results);
    // Another model: stale, so only the (new) sample-size assessment remains.
    QVERIFY(w.controller().loadModelFile(secondModel()));
    waitForJob(w);
    QVERIFY(w.controller().study().uncertainty != nullptr);
    QVERIFY(!w.controller().study().uncertainty->bootstrap);
    QVERIFY(!child<QTextBrowser>(w, "summaryPanel")->toPlainText().contains("bootstrap"));
  }

  void uncertaintySettingsRoundTrip() {
    if (!QFile::exists(kSampleStudy)) QSKIP("sample data not present");
    const QString saved = path("uncertainty.cvstudy");
    std::shared_ptr<const UncertaintyResults> before;
    {
      MainWindow w;
      w.show();
      openSample(w);
      runUncertainty(w, sampleSettings());
      before = w.controller().study().uncertainty;
      QVERIFY(w.controller().saveStudy(saved));
    }
    MainWindow w;
    w.show();
    QVERIFY(w.controller().openStudy(saved));
    waitForJob(w);
    const UncertaintySettings& s = w.controller().study().uncertaintySettings;
    QCOMPARE(s.bootstrapReplicates, 50);
    QCOMPARE(s.seed, std::uint64_t{7});
    QCOMPARE(s.threads, 2u);
    QCOMPARE(s.subgroupColumns, std::vector<std::string>{"site"});
    QCOMPARE(s.compareModels.size(), std::size_t{1});
    QCOMPARE(QString::fromStdString(s.compareModels[0].path), secondModel());
    QCOMPARE(s.compareModels[0].sha256, sha256OfFileForTest(secondModel()));
    // Recomputed on reopening, with the same intervals.
    QVERIFY(w.controller().study().uncertainty && w.controller().study().uncertainty->bootstrap);
    compareBootstrap(*w.controller().study().uncertainty->bootstrap, *before->bootstrap);
    QCOMPARE(w.controller().study().uncertainty->comparison->pairs[0].auc.difference,
             before->comparison->pairs[0].auc.difference);
    QVERIFY2(w.messageText().isEmpty(), qPrintable(w.messageText()));

    // A changed compared model is reported on reopening.
    const QString copy = path("compared_copy.json");
    QVERIFY(QFile::copy(secondModel(), copy));
    StudyState state = readStudyFile(saved.toStdString());
    state.uncertaintySettings.compareModels[0] =
        InputFileRecord{copy.toStdString(), sha256OfFileForTest(copy)};
    const QString changed = path("uncertainty_changed.cvstudy");
    writeStudyFile(changed.toStdString(), state);
    QVERIFY(appendTo(copy, "\n// edited\n"));
    MainWindow w2;
    w2.show();
    QVERIFY(w2.controller().openStudy(changed));
    waitForJob(w2);
    QTRY_VERIFY(w2.messageText().contains("compared model file"));
    QVERIFY(w2.messageText().contains("changed since the study was saved"));
  }

  // The Sites tab shows what core computes for the same site column: the pooled measures, one
  // forest plot per measure, and the selected site's own calibration with the others overlaid.
  void sitesTabPoolsTheSitesAsCoreDoes() {
    MainWindow w;
    w.show();
    openSample(w);
    UncertaintySettings settings;
    settings.clusterColumn = "site";
    QVERIFY(w.controller().runUncertainty(settings));
    waitForJob(w);
    QVERIFY2(w.controller().study().uncertainty != nullptr, qPrintable(w.messageText()));
    const UncertaintyResults& u = *w.controller().study().uncertainty;
    QVERIFY(u.sites.has_value());

    const ValidationRun run = sampleRun();
    UncertaintyRequest coreRequest;
    coreRequest.clusterColumn = "site";
    const UncertaintyResults ref = calivera::runUncertainty(run, coreRequest);
    QVERIFY(ref.sites.has_value());
    QCOMPARE(u.sites->measures.size(), ref.sites->measures.size());
    for (std::size_t m = 0; m < ref.sites->measures.size(); ++m) {
      const auto& a = u.sites->measures[m].pooled.pool;
      const auto& b = ref.sites->measures[m].pooled.pool;
      QCOMPARE(a.has_value(), b.has_value());
      if (a) {
        QCOMPARE(a->estimate, b->estimate);
        QCOMPARE(a->tau2, b->tau2);
      }
    }
    auto* view = child<SitesView>(w, "sitesView");
    QCOMPARE(view->findChildren<ForestWidget*>().size(), qsizetype(4));
    auto* table = child<QTableView>(w, "sitesTable");
    QCOMPARE(table->model()->rowCount(), static_cast<int>(ref.sites->sites.size()));
    view->showSite(1);
    QCOMPARE(view->currentSite(), 1);
    auto* cal = dynamic_cast<charts::CalibrationChart*>(view->chartPanel()->linkedChart());
    QVERIFY(cal != nullptr);
    QVERIFY(cal->title().contains(QString::fromStdString(ref.sites->sites[1].name)));
    QCOMPARE(cal->comparisonCount(), ref.sites->validations.size() - 1);
    // The site's own linked views: its ROC and decision curves beside its calibration.
    auto* roc = dynamic_cast<charts::RocChart*>(view->rocPanel()->linkedChart());
    auto* decision =
        dynamic_cast<charts::DecisionCurveChart*>(view->decisionPanel()->linkedChart());
    QVERIFY(roc != nullptr && decision != nullptr);
    QVERIFY(roc->title().contains(QString::fromStdString(ref.sites->sites[1].name)));
    QVERIFY(decision->title().contains(QString::fromStdString(ref.sites->sites[1].name)));
  }

  void screenshots() {
    const QByteArray dir = qgetenv("CALIVERA_SCREENSHOT_DIR");
    MainWindow w;
    // CALIVERA_SCREENSHOT_SIZE=WxH (default 1366x768, the smallest common laptop screen).
    const QList<QByteArray> size = qgetenv("CALIVERA_SCREENSHOT_SIZE").split('x');
    w.resize(size.size() == 2 ? size[0].toInt() : 1366, size.size() == 2 ? size[1].toInt() : 768);
    w.show();
    const QString sample = QStringLiteral(CALIVERA_SOURCE_DIR "/resources/sample_study.cvstudy");
    if (QFile::exists(sample)) {
      QVERIFY(w.controller().openStudy(sample));
      waitForJob(w);
      QVERIFY2(w.controller().study().result != nullptr, qPrintable(w.messageText()));
    } else {
      openStudy(w);
    }
    if (QFile::exists(sample)) {
      UncertaintySettings s = sampleSettings();
      s.bootstrapReplicates = 200;
      s.threads = 0;
      runUncertainty(w, s);
    }
    w.controller().setThreshold(0.2);
    QVERIFY(QTest::qWaitForWindowExposed(&w));
    auto save = [&](QWidget* widget, const char* name) {
      const QImage image = widget->grab().toImage();
      QVERIFY(!image.isNull());
      if (!dir.isEmpty()) QVERIFY(image.save(QString::fromLocal8Bit(dir) + "/" + name + ".png"));
    };
    auto* tabs = child<QTabWidget>(w, "mainTabs");
    save(&w, "main_window");
    // The exported calibration chart as a user gets it (PNG with its footer).
    if (!dir.isEmpty()) {
      const QString exported = path("exported_charts");
      QCOMPARE(w.exportAllCharts(exported), QString());
      QFile::remove(QString::fromLocal8Bit(dir) + "/exported_calibration.png");
      QVERIFY(QFile::copy(exported + "/calibration.png",
                          QString::fromLocal8Bit(dir) + "/exported_calibration.png"));
    }
    for (const char* v : {"rocView", "calibrationView", "decisionCurveView", "distributionView"}) {
      save(child<QWidget>(w, v), v);
    }
    save(child<QWidget>(w, "confusionPanel"), "confusion_panel");
    tabs->setCurrentIndex(1);
    save(&w, "summary_tab");
    tabs->setCurrentIndex(2);
    save(&w, "tables_tab");
    tabs->setCurrentIndex(3);
    save(&w, "model_tab");
    tabs->setCurrentIndex(4);
    auto* view = child<PredictorView>(w, "predictorView");
    const auto first = view->findChild<QComboBox*>("predictorFirst")->itemText(0);
    view->choose(first, "");
    save(&w, "predictor_curve");
    const auto* second = view->findChild<QComboBox*>("predictorSecond");
    if (second->count() > 2) {
      view->choose(first, second->itemText(2));
      save(&w, "predictor_boundary");
    }
    // Modal dialogs: grabbed while open, then closed (a report export is not started).
    const auto saveModal = [&](const std::function<void()>& open, const char* name) {
      QTimer::singleShot(400, &w, [&save, name]() {
        if (QWidget* dialog = QApplication::activeModalWidget()) {
          save(dialog, name);
          dialog->close();
        }
      });
      open();
    };
    saveModal([&] { showReproduceDialog(&w, w.controller().study()); }, "reproduce_dialog");
    saveModal([&] { showReportExportDialog(&w, w.controller().study(), {}); },
              "report_export_dialog");
    {
      UncertaintySettings current = w.controller().study().uncertaintySettings;
      current.sizeThresholds = {0.1, 0.2};
      UncertaintyDialog dialog(current, *w.controller().table(),
                               w.controller().study().import.outcomeColumn, &w);
      dialog.show();
      QVERIFY(QTest::qWaitForWindowExposed(&dialog));
      save(&dialog, "uncertainty_dialog");
    }
    tabs->setCurrentWidget(child<QWidget>(w, "comparisonView"));
    save(&w, "comparison_tab");
    tabs->setCurrentWidget(child<QWidget>(w, "subgroupView"));
    save(&w, "subgroups_tab");
    tabs->setCurrentWidget(child<QWidget>(w, "sitesView"));
    save(&w, "sites_tab");
    child<QTabWidget>(w, "sitesPages")->setCurrentIndex(1);
    save(&w, "sites_forest_plots");
    child<QTabWidget>(w, "sitesPages")->setCurrentIndex(0);
    tabs->setCurrentIndex(1);
    auto* summary = child<QTextBrowser>(w, "summaryPanel");
    summary->moveCursor(QTextCursor::End);
    QVERIFY(summary->find("Bootstrap:", QTextDocument::FindBackward));
    QTextCursor cursor = summary->textCursor();
    cursor.clearSelection();
    summary->setTextCursor(cursor);
    summary->verticalScrollBar()->setValue(summary->verticalScrollBar()->value() +
                                           summary->viewport()->height() / 2 - 30);
    save(&w, "summary_intervals");
    // Help: each page of the one help dialog.
    for (const auto& [page, name] :
         {std::pair{HelpPage::Guide, "help_guide"}, std::pair{HelpPage::Measures, "help_measures"},
          std::pair{HelpPage::Keyboard, "help_keyboard"},
          std::pair{HelpPage::About, "help_about"}}) {
      showHelpDialog(&w, page);
      auto* help = child<QDialog>(w, "helpDialog");
      QVERIFY(QTest::qWaitForWindowExposed(help));
      save(help, name);
    }
    child<QDialog>(w, "helpDialog")->close();
  }
};

QTEST_MAIN(MainWindowTest)
#include "main_window_test.moc"
