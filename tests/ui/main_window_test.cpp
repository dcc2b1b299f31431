// Drives the real main window offscreen through objectNames: open a study, run the validation,
// move the threshold, and check that every linked view and the threshold table agree with core's
// results at that threshold; bad files leave the study intact; save -> reopen round trip; exports.
//
// The cohort is simulated here (a property check: the views must agree with core, whatever the
// numbers); the sample study under resources/ is opened too when the sample data exists.
#include "ui/main_window.h"

#include <QComboBox>
#include <QDoubleSpinBox>
#include <QFile>
#include <QImage>
#include <QLabel>
#include <QSlider>
#include <QSortFilterProxyModel>
#include <QTabWidget>
#include <QTableView>
#include <QTemporaryDir>
#include <QTextBrowser>
#include <QtTest>
#include <cmath>
#include <fstream>
#include <random>

#include "core/metrics/threshold_index.h"
#include "core/model/model_io.h"
#include "core/util/sha256.h"
#include "ui/async/background_job.h"
#include "ui/charts/calibration_chart.h"
#include "ui/charts/decision_curve_chart.h"
#include "ui/charts/distribution_chart.h"
#include "ui/charts/predictor_charts.h"
#include "ui/charts/roc_chart.h"
#include "ui/models/table_export.h"
#include "ui/state/study_file.h"
#include "ui/views/chart_panel.h"
#include "ui/views/predictor_view.h"

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
  QTRY_VERIFY_WITH_TIMEOUT(!w.job()->isRunning(), 60000);
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

}  // namespace

class MainWindowTest : public QObject {
  Q_OBJECT

 private:
  QTemporaryDir dir_;
  QString cohort_, model_, study_;

  QString path(const QString& name) const { return dir_.filePath(name); }

  // Opens the simulated study and waits for the validation.
  void openStudy(MainWindow& w) {
    QVERIFY(w.openStudy(study_));
    waitForJob(w);
    QVERIFY2(w.study().result != nullptr, qPrintable(w.messageText()));
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
    const ValidationResult& r = *w.study().result;
    child<QDoubleSpinBox>(w, "thresholdSpin")->setValue(threshold);
    QCOMPARE(w.thresholdState().threshold(), threshold);

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
    QCOMPARE(table->model()->index(current.row(), 2).data().toString(), QString::number(row->tp));
  }

  void offGridThresholdMatchesBruteForce() {
    MainWindow w;
    w.show();
    openStudy(w);
    const double t = 0.1372;
    child<QDoubleSpinBox>(w, "thresholdSpin")->setValue(t);
    const auto cohort = w.cohort();
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
    w.setThreshold(0.2);
    auto* roc = child<ChartPanel>(w, "rocView");
    roc->setFocus();
    QTest::keyClick(roc, Qt::Key_Right);
    QCOMPARE(w.thresholdState().threshold(), 0.205);
    QTest::keyClick(roc, Qt::Key_Left);
    QTest::keyClick(roc, Qt::Key_Left);
    QCOMPARE(w.thresholdState().threshold(), 0.195);
    child<QSlider>(w, "thresholdSlider")->setValue(300);
    QCOMPARE(w.thresholdState().threshold(), 0.3);
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
    QVERIFY2(std::abs(w.thresholdState().threshold() - 0.3) < 0.01,
             qPrintable(QString::number(w.thresholdState().threshold())));
    auto* rocPanel = child<ChartPanel>(w, "rocView");
    auto* roc = dynamic_cast<charts::RocChart*>(rocPanel->linkedChart());
    const RocPoint& p =
        w.study().result->discrimination.roc[w.study().result->discrimination.roc.size() / 2];
    const QPoint rocPos =
        rocPanel->mapFromScene(roc->mapToPosition(QPointF(p.fpr, p.tpr), roc->series().last()));
    QTest::mouseClick(rocPanel->viewport(), Qt::LeftButton, {}, rocPos);
    // The nearest ROC point to the click may be a neighbour of p on screen; its threshold is close.
    QVERIFY(std::abs(w.thresholdState().threshold() - std::clamp(p.threshold, 0.0, 1.0)) < 0.05);
  }

  void badStudyFileLeavesTheStudyIntact() {
    MainWindow w;
    w.show();
    openStudy(w);
    const auto before = w.study().result;
    const QString bad = path("broken.cvstudy");
    {
      QFile f(bad);
      QVERIFY(f.open(QIODevice::WriteOnly));
      f.write("{\"format\": \"calivera-study/1\", \"import\": ");
    }
    QVERIFY(!w.openStudy(bad));
    QVERIFY(w.messageText().contains("broken.cvstudy"));
    QVERIFY(w.messageText().contains("not valid JSON"));
    QCOMPARE(w.study().result, before);
    QCOMPARE(w.studyPath(), study_);
  }

  void badCohortFileLeavesTheStudyIntact() {
    MainWindow w;
    w.show();
    openStudy(w);
    const auto before = w.study().result;
    const QString ragged = path("ragged.csv");
    {
      QFile f(ragged);
      QVERIFY(f.open(QIODevice::WriteOnly));
      f.write("age,sex,marker,died\n60,male,1.2,yes\n61,female\n");
    }
    ImportSettings s = w.study().import;
    QVERIFY(w.importCohort(ragged, s));
    waitForJob(w);
    QVERIFY2(w.messageText().contains("ragged.csv"), qPrintable(w.messageText()));
    QCOMPARE(w.study().result, before);
    QCOMPARE(QString::fromStdString(w.study().data->path), cohort_);
    // A bad model file, too.
    const QString badModel = path("bad_model.json");
    {
      QFile f(badModel);
      QVERIFY(f.open(QIODevice::WriteOnly));
      f.write("{\"format\": \"something-else\"}");
    }
    QVERIFY(w.loadModelFile(badModel));
    waitForJob(w);
    QVERIFY2(w.messageText().contains("bad_model.json"), qPrintable(w.messageText()));
    QCOMPARE(w.study().result, before);
  }

  void saveAndReopenRoundTrip() {
    const QString saved = path("round_trip.cvstudy");
    double auc = 0.0;
    {
      MainWindow w;
      w.show();
      openStudy(w);
      w.setThreshold(0.2125);
      child<QDoubleSpinBox>(w, "reasonableLoSpin")->setValue(0.08);
      child<QDoubleSpinBox>(w, "reasonableHiSpin")->setValue(0.35);
      QVERIFY(w.saveStudy(saved));
      auc = w.study().result->discrimination.auc;
    }
    MainWindow w;
    w.show();
    QVERIFY(w.openStudy(saved));
    waitForJob(w);
    QVERIFY(w.study().result != nullptr);
    QCOMPARE(w.study().result->discrimination.auc, auc);
    QCOMPARE(w.thresholdState().threshold(), 0.2125);
    QCOMPARE(child<QDoubleSpinBox>(w, "thresholdSpin")->value(), 0.2125);
    QCOMPARE(w.study().analysis.reasonableLo, 0.08);
    QCOMPARE(w.study().analysis.reasonableHi, 0.35);
    QCOMPARE(w.study().import.eventValue.value_or(""), std::string("yes"));
    QVERIFY(w.messageText().isEmpty());
  }

  void changedInputIsReported() {
    const QString data = path("changing.csv");
    QVERIFY(QFile::copy(cohort_, data));
    StudyState s = readStudyFile(study_.toStdString());
    s.data = InputFileRecord{data.toStdString(), sha256OfFileForTest(data)};
    const QString saved = path("changing.cvstudy");
    writeStudyFile(saved.toStdString(), s);
    {
      QFile f(data);
      QVERIFY(f.open(QIODevice::Append));
      f.write("70,male,2.5,yes\n");
    }
    MainWindow w;
    w.show();
    QVERIFY(w.openStudy(saved));
    waitForJob(w);
    QTRY_VERIFY(w.messageText().contains("changed since the study was saved"));
    QVERIFY(w.study().result != nullptr);
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
      QVERIFY(svg.readAll().contains("<svg"));
    }
    auto* table = child<QTableView>(w, "thresholdTable");
    const QString csv = path("thresholds.csv");
    QCOMPARE(writeTableCsv(*table->model(), csv), QString());
    QFile f(csv);
    QVERIFY(f.open(QIODevice::ReadOnly));
    const QList<QByteArray> lines = f.readAll().split('\n');
    QVERIFY(lines.first().startsWith("Threshold,Flagged,TP,FP,TN,FN,Sensitivity"));
    QCOMPARE(lines.size() - 2, static_cast<int>(w.study().result->thresholds.size()));
  }

  void predictorViewsMarkTheThreshold() {
    MainWindow w;
    w.show();
    openStudy(w);
    w.setThreshold(0.3);
    auto* view = child<PredictorView>(w, "predictorView");
    view->choose("age", "");
    auto* curve = dynamic_cast<charts::RiskCurveChart*>(view->panel()->linkedChart());
    QVERIFY(curve != nullptr);
    QVERIFY(!curve->cutPoints().empty());
    // Independent check on the known linear model: risk(age cut) = 0.3 with sex and marker held at
    // the reference level (female) and the cohort median of marker.
    const auto& predictors = describePredictors(*w.study().model, {}, *w.cohort());
    double markerMedian = 0;
    for (const auto& p : predictors) {
      if (p.variable == "marker") markerMedian = p.median;
    }
    const double logit = std::log(0.3 / 0.7);
    const double ageCut = (logit - kIntercept - kMarker * markerMedian) / kAge;
    QVERIFY2(std::abs(curve->cutPoints().front() - ageCut) < 0.05,
             qPrintable(QString("%1 vs %2").arg(curve->cutPoints().front()).arg(ageCut)));

    view->choose("age", "marker");
    auto* boundary = dynamic_cast<charts::BoundaryChart*>(view->panel()->linkedChart());
    QVERIFY(boundary != nullptr);
    QVERIFY(!boundary->boundary().empty());
    for (const auto& line : boundary->boundary()) {
      for (const auto& [age, marker] : line) {
        QVERIFY(std::abs(kIntercept + kAge * age + kMarker * marker - logit) < 1e-6);
      }
    }
    w.setThreshold(0.4);
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
    QVERIFY(html.contains(QString::number(w.study().result->discrimination.auc, 'f', 3)));
  }

  void screenshots() {
    const QByteArray dir = qgetenv("CALIVERA_SCREENSHOT_DIR");
    MainWindow w;
    w.resize(1280, 800);
    w.show();
    const QString sample = QStringLiteral(CALIVERA_SOURCE_DIR "/resources/sample_study.cvstudy");
    if (QFile::exists(sample)) {
      QVERIFY(w.openStudy(sample));
      waitForJob(w);
      QVERIFY2(w.study().result != nullptr, qPrintable(w.messageText()));
    } else {
      openStudy(w);
    }
    w.setThreshold(0.2);
    QVERIFY(QTest::qWaitForWindowExposed(&w));
    auto save = [&](QWidget* widget, const char* name) {
      const QImage image = widget->grab().toImage();
      QVERIFY(!image.isNull());
      if (!dir.isEmpty()) QVERIFY(image.save(QString::fromLocal8Bit(dir) + "/" + name + ".png"));
    };
    auto* tabs = child<QTabWidget>(w, "mainTabs");
    save(&w, "main_window");
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
  }
};

QTEST_MAIN(MainWindowTest)
#include "main_window_test.moc"
