// The PDF report renderer (render/report): byte-identical output for a fixed timestamp, the
// creation date rewrite, paper sizes, atomic writing, table continuation and the caution on every
// page. The document comes from simulated data: these tests check properties of the rendering,
// never a statistic (the reference checks of the numbers run the command line on open datasets, in
// tests/reference/audit_report_test.cpp). The uncertainty layout test runs core on birthwt
// (Debian r-cran-mass) for a realistic document and checks only what is drawn and printed.
#include <QApplication>
#include <QDir>
#include <QFile>
#include <QProcess>
#include <QTemporaryDir>
#include <QtTest>
#include <algorithm>
#include <cmath>
#include <random>

#include "core/report/audit_run.h"
#include "core/util/errors.h"
#include "render/report/audit_pdf_writer.h"
#include "render/report/report_charts.h"
#include "tests/ui/pdf_text.h"
#include "tests/unit/birthwt_run.h"
#include "ui/dialogs/report_export_dialog.h"

using namespace calivera;
using namespace calivera::report;
using calivera::testing::pdfText;

namespace {

// A plausible result from simulated patients, counted directly (layout input only).
AuditReportInput simulatedInput(std::size_t tableRows) {
  std::mt19937 rng(7);
  std::uniform_real_distribution<double> uniform(0.0, 1.0);
  std::vector<double> risk, outcome;
  for (int i = 0; i < 400; ++i) {
    const double r = std::pow(uniform(rng), 1.6);
    risk.push_back(r);
    outcome.push_back(uniform(rng) < r ? 1.0 : 0.0);
  }
  ValidationResult result;
  result.cohort.n = risk.size();
  for (const double y : outcome) result.cohort.events += y > 0.5 ? 1 : 0;
  result.cohort.prevalence = double(result.cohort.events) / double(result.cohort.n);
  const std::size_t events = result.cohort.events, nonEvents = result.cohort.n - events;
  auto counts = [&](double t) {
    ThresholdRow row;
    row.threshold = t;
    for (std::size_t i = 0; i < risk.size(); ++i) {
      const bool flagged = risk[i] >= t, event = outcome[i] > 0.5;
      (flagged ? (event ? row.tp : row.fp) : (event ? row.fn : row.tn)) += 1;
    }
    row.sensitivity = double(row.tp) / double(events);
    row.specificity = double(row.tn) / double(nonEvents);
    row.sensitivityCi = {row.sensitivity - 0.05, row.sensitivity + 0.05};
    row.specificityCi = {row.specificity - 0.05, row.specificity + 0.05};
    row.flaggedPer1000 = 1000.0 * double(row.tp + row.fp) / double(risk.size());
    return row;
  };
  for (int k = 100; k >= 0; --k) {
    const ThresholdRow row = counts(k / 100.0);
    result.discrimination.roc.push_back(
        {k / 100.0, double(row.fp) / double(nonEvents), double(row.tp) / double(events)});
  }
  for (std::size_t k = 1; k <= 99; ++k) {
    const double t = double(k) / 100.0;
    const ThresholdRow row = counts(t);
    result.thresholds.push_back(row);
    const double w = t / (1 - t), n = double(risk.size());
    DecisionCurvePoint point;
    point.threshold = t;
    point.netBenefit = double(row.tp) / n - double(row.fp) / n * w;
    point.netBenefitTreatAll = result.cohort.prevalence - (1 - result.cohort.prevalence) * w;
    result.decisionCurve.push_back(point);
  }
  result.discrimination.auc = 0.781;
  result.discrimination.aucCi = {0.735, 0.821};
  result.calibration.slope = 0.93;
  result.calibration.slopeCi = {0.75, 1.11};
  result.calibration.interceptCi = {-0.2, 0.25};
  std::vector<std::size_t> order(risk.size());
  for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
  std::sort(order.begin(), order.end(), [&](auto a, auto b) { return risk[a] < risk[b]; });
  for (int g = 0; g < 10; ++g) {
    CalibrationGroup group;
    group.riskLo = 1.0;
    for (int j = g * 40; j < (g + 1) * 40; ++j) {
      const std::size_t i = order[static_cast<std::size_t>(j)];
      group.n += 1;
      group.observed += outcome[i] > 0.5 ? 1 : 0;
      group.expected += risk[i];
      group.riskLo = std::min(group.riskLo, risk[i]);
      group.riskHi = std::max(group.riskHi, risk[i]);
    }
    group.meanRisk = group.expected / double(group.n);
    group.observedProportion = double(group.observed) / double(group.n);
    group.observedCi = {std::max(0.0, group.observedProportion - 0.1),
                        std::min(1.0, group.observedProportion + 0.1)};
    result.hosmerLemeshow.groups.push_back(group);
    result.calibration.curve.push_back({group.meanRisk, group.observedProportion});
  }
  result.calibration.groups = result.hosmerLemeshow.groups;
  result.hosmerLemeshow.df = 10;
  result.distribution.binEdges.push_back(0.0);
  result.distribution.eventCounts.assign(20, 0);
  result.distribution.nonEventCounts.assign(20, 0);
  for (int b = 1; b <= 20; ++b) result.distribution.binEdges.push_back(b / 20.0);
  for (std::size_t i = 0; i < risk.size(); ++i) {
    const std::size_t bin = std::min<std::size_t>(19, static_cast<std::size_t>(risk[i] * 20));
    (outcome[i] > 0.5 ? result.distribution.eventCounts
                      : result.distribution.nonEventCounts)[bin]++;
  }

  AuditReportInput input;
  input.title = "Simulated cohort, layout check";
  input.createdAt = "2026-12-01 12:00:00 UTC";
  input.softwareVersion = CALIVERA_VERSION;
  input.cohortFile = {"simulated.csv", std::string(64, 'a')};
  input.modelFile = {"model.json", std::string(64, 'b')};
  input.exclusions.rowsRead = 403;
  input.exclusions.rowsExcluded = 3;
  input.exclusions.rowsAnalysed = 400;
  input.exclusions.byColumn = {{"age", 3}};
  input.model.name = "simulated model";
  Term term;
  term.name = "age";
  input.model.terms = {term};
  input.settings.outcomeColumn = "event";
  for (std::size_t k = 0; k < tableRows; ++k) {
    input.settings.tableThresholds.push_back(double(k + 1) / 100.0);
  }
  input.settings.reasonableThresholds = Interval{0.05, 0.3};
  input.result = result;
  return input;
}

}  // namespace

class ReportPdfTest : public QObject {
  Q_OBJECT

 private slots:
  void sameInputsAndTimestampGiveIdenticalBytes() {
    const AuditDocument doc = buildAuditDocument(simulatedInput(5));
    const ChartPainter charts = replayCharts(recordReportCharts(doc));
    const QByteArray first = renderAuditPdf(doc, PaperSize::A4, charts, 1764590400);
    const QByteArray second = renderAuditPdf(doc, PaperSize::A4, charts, 1764590400);
    QVERIFY(first.startsWith("%PDF-"));
    QCOMPARE(first, second);
    const QByteArray later = renderAuditPdf(doc, PaperSize::A4, charts, 1764590401);
    QCOMPARE(later.size(), first.size());
    QVERIFY(later != first);
    QVERIFY(first.contains("/CreationDate (D:20251201120000"));
  }

  void creationDateKeepsItsLength() {
    QByteArray utc = "<< /CreationDate (D:20200101000000Z) >>";
    QVERIFY(setPdfCreationDate(utc, 0));
    QCOMPARE(utc, QByteArray("<< /CreationDate (D:19700101000000Z) >>"));
    QByteArray local = "<< /CreationDate (D:20200101000000+01'00') >>";
    QVERIFY(setPdfCreationDate(local, 86400));
    QCOMPARE(local, QByteArray("<< /CreationDate (D:19700102000000+00'00') >>"));
    QByteArray none = "<< /Title (x) >>";
    QVERIFY(!setPdfCreationDate(none, 0));
  }

  void paperSizesDiffer() {
    const AuditDocument doc = buildAuditDocument(simulatedInput(5));
    const QByteArray a4 = renderAuditPdf(doc, PaperSize::A4, {}, 0);
    const QByteArray letter = renderAuditPdf(doc, PaperSize::Letter, {}, 0);
    QVERIFY(a4.contains("/MediaBox [0 0 595"));
    QVERIFY(letter.contains("/MediaBox [0 0 612.000000 792.000000]"));
    QCOMPARE(parsePaperSize("A4", "--paper"), PaperSize::A4);
    QCOMPARE(parsePaperSize("letter", "--paper"), PaperSize::Letter);
    QVERIFY_THROWS_EXCEPTION(InputError, parsePaperSize("a5", "--paper"));
  }

  void failedWriteLeavesNoFile() {
    QTemporaryDir dir;
    const QString missing = dir.filePath(QStringLiteral("no/such/folder/report.pdf"));
    QVERIFY_THROWS_EXCEPTION(
        InputError, writeAuditReportPdf(simulatedInput(3), missing.toStdString(), PaperSize::A4));
    QVERIFY(!QFile::exists(missing));
    // A threshold the run did not compute is refused before anything is written.
    AuditReportInput input = simulatedInput(3);
    input.settings.tableThresholds = {0.123};
    const QString path = dir.filePath(QStringLiteral("report.pdf"));
    QVERIFY_THROWS_EXCEPTION(InputError,
                             writeAuditReportPdf(input, path.toStdString(), PaperSize::A4));
    QVERIFY(QDir(dir.path()).entryList(QDir::Files).isEmpty());
  }

  void longTablesContinueWithTheirHeaderAndEveryPageHasTheCaution() {
    QTemporaryDir dir;
    const QString path = dir.filePath(QStringLiteral("long.pdf"));
    writeAuditReportPdf(simulatedInput(60), path.toStdString(), PaperSize::Letter);
    const QString text = pdfText(path);
    QVERIFY2(text.contains(QStringLiteral("(continued)")), "threshold table continues");
    const QStringList pages = text.split(QChar('\f'), Qt::SkipEmptyParts);
    QVERIFY(pages.size() >= 5);
    for (int i = 0; i < pages.size(); ++i) {
      const QString& page = pages[i];
      if (page.trimmed().isEmpty()) continue;
      QVERIFY2(page.contains(QStringLiteral("do not replace clinical")),
               qPrintable(page.left(200)));
      QVERIFY(page.contains(QStringLiteral("Page %1 of").arg(i + 1)));
      QVERIFY(page.contains(QString(64, 'a')) && page.contains(QString(64, 'b')));
    }
    // Every continuation page of the threshold table repeats its header row.
    int continued = 0;
    for (const QString& page : pages) {
      if (!page.contains(QStringLiteral("At the selected thresholds"))) continue;
      if (page.contains(QStringLiteral("(continued)"))) {
        ++continued;
        QVERIFY(page.contains(QStringLiteral("Specificity")));
      }
    }
    QVERIFY(continued >= 1);
  }

  void suppressionIsStatedAndApplied() {
    AuditReportInput input = simulatedInput(5);
    input.settings.suppressBelow = 5;
    QTemporaryDir dir;
    const QString path = dir.filePath(QStringLiteral("suppressed.pdf"));
    writeAuditReportPdf(input, path.toStdString(), PaperSize::A4);
    const QString text = pdfText(path);
    QVERIFY(text.contains(QStringLiteral("Small-cell suppression was applied")));
    QVERIFY(text.contains(QStringLiteral("<5")));
  }

  // A real run with the uncertainty layer (birthwt from Debian r-cran-mass, models fitted by core,
  // runUncertainty): the charts carry the bands and the overlay, the sections render.
  void uncertaintySectionsRenderAndChartsDrawBandsAndOverlays() {
    QTemporaryDir dir;
    const std::string full = dir.filePath(QStringLiteral("full.json")).toStdString();
    const std::string small = dir.filePath(QStringLiteral("small.json")).toStdString();
    testing::writeBirthwtModel(full, {"age", "lwt", "race", "smoke", "ht", "ui"}, "full model");
    testing::writeBirthwtModel(small, {"lwt"}, "weight only");
    const ValidationRun run = testing::birthwtRun(full);
    UncertaintyRequest request;
    request.bootstrapReplicates = 20;
    request.seed = 4;
    request.threads = 1;
    request.compareModelPaths = {small};
    request.subgroupColumns = {"smoke"};
    const UncertaintyResults uncertainty = runUncertainty(run, request);
    AuditReportInput input = auditInputFromRun(run, "Uncertainty layout", 0, uncertainty);
    input.createdAt = "2026-12-02 00:00:00 UTC";
    const AuditDocument doc = buildAuditDocument(input);
    QCOMPARE(doc.comparisons.size(), std::size_t{1});
    QVERIFY(!doc.netBenefitBand.empty() && !doc.calibrationBand.empty());

    const RecordedCharts recorded = recordReportCharts(doc);
    AuditDocument plain = doc;
    plain.comparisons.clear();
    plain.netBenefitBand.clear();
    plain.calibrationBand.clear();
    const RecordedCharts without = recordReportCharts(plain);
    for (const ChartKind kind :
         {ChartKind::Roc, ChartKind::Calibration, ChartKind::DecisionCurve}) {
      const QByteArray& svg = recorded.drawings.at(kind);
      QVERIFY2(svg.contains("weight only"), "the overlay is named in the legend");
      QVERIFY(!without.drawings.at(kind).contains("weight only"));
      QVERIFY(svg.size() > without.drawings.at(kind).size());
    }
    QVERIFY(recorded.drawings.at(ChartKind::Calibration).contains("Bootstrap 95% band"));
    QVERIFY(recorded.drawings.at(ChartKind::DecisionCurve).contains("Bootstrap 95% band"));
    QVERIFY(recorded.drawings.at(ChartKind::Roc)
                .contains("AUC " + QByteArray::number(uncertainty.comparison->aucs[1], 'f', 3)));

    const QString path = dir.filePath(QStringLiteral("uncertainty.pdf"));
    writeAuditReportPdf(input, path.toStdString(), PaperSize::A4);
    const QString text = pdfText(path);
    for (const char* part :
         {"Is the cohort large enough?", "Bootstrap 95% CI", "Comparison with other models",
          "Subgroups by 'smoke'", "Bootstrap percentile intervals and bands"}) {
      QVERIFY2(text.contains(QString::fromUtf8(part)), part);
    }
    QVERIFY(!text.contains(dir.path()));  // file names, never folders
    // The caution and the page numbers stay on every page with the longer report.
    const QStringList pages = text.split(QChar('\f'), Qt::SkipEmptyParts);
    for (int i = 0; i < pages.size(); ++i) {
      if (pages[i].trimmed().isEmpty()) continue;
      QVERIFY(pages[i].contains(QStringLiteral("do not replace clinical")));
      QVERIFY(pages[i].contains(QStringLiteral("Page %1 of").arg(i + 1)));
    }
  }

  void workstationExportRunsInTheBackgroundAndRefusesUncomputedThresholds() {
    const AuditReportInput input = simulatedInput(0);
    StudyState study;
    study.data = InputFileRecord{"/somewhere/simulated.csv", std::string(64, 'c')};
    study.modelSource = ModelSource::Fitted;
    study.model = input.model;
    study.exclusions = input.exclusions;
    // The study's run as the pipeline leaves it (core's ValidationRun for a fitted model).
    auto run = std::make_shared<ValidationRun>();
    run->request.dataPath = study.data->path;
    run->request.modelPath = "(fitted in the workstation)";
    run->dataSha256 = study.data->sha256;
    run->model = input.model;
    run->modelName = input.model.name;
    run->modelSha256 = input.modelFile.sha256;
    run->performance = kPerformanceApparent;
    run->performanceBasis = "stated by the user: the cohort is the model's development data";
    run->cohort.exclusions = input.exclusions;
    run->result = input.result;
    study.run = run;
    study.result = std::shared_ptr<const ValidationResult>(run, &run->result);
    QTemporaryDir dir;
    ui::ReportExportRequest request;
    request.path = dir.filePath(QStringLiteral("study.pdf")).toStdString();
    request.title = "Workstation export";
    request.thresholds = {0.1, 0.2};
    request.suppressBelow = 11;
    request.paper = PaperSize::Letter;
    QFuture<QString> future = ui::exportReport(study, request);
    future.waitForFinished();
    QCOMPARE(future.result(), QString());
    const QString text = pdfText(QString::fromStdString(request.path));
    QVERIFY(text.contains(QStringLiteral("Workstation export")));
    QVERIFY(text.contains(QString(64, 'c')));
    QVERIFY(text.contains(QStringLiteral("fitted in the workstation")));
    QVERIFY(text.contains(QStringLiteral("counts from 1 to 10 hidden")));
    request.thresholds = {0.125};
    QVERIFY_THROWS_EXCEPTION(InputError, ui::exportReport(study, request));
    StudyState empty;
    QVERIFY_THROWS_EXCEPTION(InputError, ui::auditInputFromStudy(empty, request));
  }
};

int main(int argc, char** argv) {
  QApplication app(argc, argv);
  ReportPdfTest test;
  return QTest::qExec(&test, argc, argv);
}

#include "report_pdf_test.moc"
