// One study, one run (issue 10): the workstation and the command line give the same report input
// for the same study, and both call a model checked on its own development data apparent, whether
// the fingerprint says so or the user states it. Data: MASS::birthwt (Debian r-cran-mass,
// tests/reference/data); two routes of our own are compared, so no reference value is involved.
#include <QAction>
#include <QFile>
#include <QProcess>
#include <QTableView>
#include <QTemporaryDir>
#include <QtTest>
#include <cstdlib>
#include <fstream>
#include <nlohmann/json.hpp>

#include "core/data/csv_reader.h"
#include "core/fit/cohort_fit.h"
#include "core/model/model_io.h"
#include "core/report/audit_run.h"
#include "core/report/result_table.h"
#include "core/study/reproduce_command.h"
#include "core/study/study_file.h"
#include "core/util/sha256.h"
#include "render/charts/predictor_charts.h"
#include "tests/ui/open_study.h"
#include "tests/ui/pdf_text.h"
#include "tests/unit/cli_run.h"
#include "tests/unit/study_fixture.h"
#include "ui/async/background_job.h"
#include "ui/dialogs/report_export_dialog.h"
#include "ui/dialogs/reproduce_dialog.h"
#include "ui/main_window.h"
#include "ui/models/table_export.h"
#include "ui/views/chart_panel.h"
#include "ui/views/predictor_view.h"

using namespace calivera;
using namespace calivera::ui;
using calivera::testing::pdfText;

namespace {

const std::string kBirthwt = CALIVERA_SOURCE_DIR "/tests/reference/data/birthwt.csv";

// The command line's report input for the study: core's runValidation on the study's requests.
AuditReportInput commandLineReportInput(const StudyState& study) {
  const StudyRequests requests = studyRequests(study);
  const ValidationRun run = runValidation(requests.validation);
  return auditInputFromRun(run, "t", 0, calivera::runUncertainty(run, requests.uncertainty));
}

}  // namespace

class StudyParityTest : public QObject {
  Q_OBJECT

 private:
  QTemporaryDir dir_;
  std::string model_;

  std::string path(const char* name) const { return dir_.filePath(name).toStdString(); }

  // Opens the study file in a window and waits for the run.
  void open(MainWindow& w, const StudyState& study, const char* name) {
    calivera::testing::openStudyAndWait(w, study, path(name));
  }

  void compareWithCommandLine(const StudyState& windowStudy, const StudyState& saved) {
    ReportExportRequest request;
    request.title = "t";
    const AuditReportInput gui = auditInputFromStudy(windowStudy, request);
    const AuditReportInput cli = commandLineReportInput(saved);
    QCOMPARE(gui.settings.apparent, cli.settings.apparent);
    QCOMPARE(gui.settings.other, cli.settings.other);
    QCOMPARE(gui.cohortFile.sha256, cli.cohortFile.sha256);
    QCOMPARE(gui.modelFile.sha256, cli.modelFile.sha256);
    QCOMPARE(gui.result.hosmerLemeshow.df, cli.result.hosmerLemeshow.df);
    QCOMPARE(gui.result.hosmerLemeshow.statistic, cli.result.hosmerLemeshow.statistic);
    QCOMPARE(gui.result.discrimination.auc, cli.result.discrimination.auc);
    QCOMPARE(gui.result.calibration.slope, cli.result.calibration.slope);
    QCOMPARE(gui.result.decisionCurve.size(), cli.result.decisionCurve.size());
    for (std::size_t i = 0; i < gui.result.decisionCurve.size(); ++i) {
      QCOMPARE(gui.result.decisionCurve[i].netBenefit, cli.result.decisionCurve[i].netBenefit);
    }
    QVERIFY(gui.uncertainty.has_value());
    QCOMPARE(gui.uncertainty->sampleSize.verdict, cli.uncertainty->sampleSize.verdict);
  }

 private slots:
  void initTestCase() {
    QVERIFY(dir_.isValid());
    const Table table = readCsvFile(kBirthwt, CsvOptions{}).table;
    CohortFitSpec spec;
    spec.outcome = OutcomeSpec{"low", std::nullopt};
    spec.predictors = {"age", "lwt", "smoke", "ht"};
    spec.modelName = "birthwt four terms";
    Model model = fitCohortModel(table, spec).model;
    model.development.dataSha256 = sha256OfFile(kBirthwt);  // as `calivera fit` records it
    model_ = path("model.json");
    writeModelFile(model_, model);
  }

  // The drift the issue found: the model's development fingerprint matches the cohort, the
  // checkbox is off. The window, its PDF and the command line all say apparent (g - 2 df).
  void fingerprintMatchIsApparentEverywhere() {
    const StudyState study = calivera::testing::birthwtFileStudy(kBirthwt, model_);
    MainWindow w;
    open(w, study, "own.cvstudy");
    QVERIFY(w.controller().study().run != nullptr);
    QCOMPARE(w.controller().study().run->performance, std::string(kPerformanceApparent));
    QCOMPARE(w.controller().study().result->hosmerLemeshow.df, 6);
    ReportExportRequest request;
    QVERIFY(auditInputFromStudy(w.controller().study(), request).settings.apparent);
    compareWithCommandLine(w.controller().study(), study);
  }

  // The same patients saved with another delimiter: other bytes, the same analysed values, so
  // apparent by the analysed-data fingerprint (issue 12). Without the last patient the values
  // differ: new data, until the user ticks "the cohort is the development data". The window and
  // the command line agree in each case.
  void statedDevelopmentDataIsApparentEverywhere() {
    std::string text;
    {
      QFile in(QString::fromStdString(kBirthwt));
      QVERIFY(in.open(QIODevice::ReadOnly));
      text = in.readAll().toStdString();
    }
    for (char& c : text) {
      if (c == ',') c = ';';
    }
    const auto write = [&](const char* name, const std::string& bytes) {
      std::ofstream(path(name), std::ios::binary) << bytes;
      return path(name);
    };
    StudyState study = calivera::testing::birthwtFileStudy(write("semicolons.csv", text), model_);
    study.import.delimiter = ';';
    {
      MainWindow w;
      open(w, study, "resaved.cvstudy");
      QCOMPARE(w.controller().study().run->performance, std::string(kPerformanceApparent));
      QVERIFY(w.controller().study().run->performanceBasis.find("analysed-data fingerprint") !=
              std::string::npos);
      QCOMPARE(w.controller().study().result->hosmerLemeshow.df, 6);
      compareWithCommandLine(w.controller().study(), study);
    }
    // The last patient removed: other analysed values.
    std::string fewer = text;
    fewer.erase(fewer.rfind('\n', fewer.size() - 2) + 1);
    study = calivera::testing::birthwtFileStudy(write("fewer.csv", fewer), model_);
    study.import.delimiter = ';';
    {
      MainWindow w;
      open(w, study, "new.cvstudy");
      QCOMPARE(w.controller().study().run->performance, std::string(kPerformanceNewData));
      QCOMPARE(w.controller().study().result->cohort.n, std::size_t{188});
      QCOMPARE(w.controller().study().result->hosmerLemeshow.df, 8);
      compareWithCommandLine(w.controller().study(), study);
    }
    study.analysis.apparent = true;
    MainWindow w;
    open(w, study, "stated.cvstudy");
    QCOMPARE(w.controller().study().run->performance, std::string(kPerformanceApparent));
    QCOMPARE(w.controller().study().result->hosmerLemeshow.df, 6);
    ReportExportRequest request;
    const AuditReportInput input = auditInputFromStudy(w.controller().study(), request);
    QVERIFY(input.settings.apparent);
    bool basisStated = false;
    for (const auto& [name, value] : input.settings.other) {
      if (name == "Performance basis") basisStated = value.find("stated by the user") == 0;
    }
    QVERIFY(basisStated);
    compareWithCommandLine(w.controller().study(), study);
  }

  // The workstation's table export writes, byte for byte, the file the command line's --csv-dir
  // writes for the same table of the same study (`calivera run`, the real executable).
  void tablesExportAsTheCommandLineWritesThem() {
    const StudyState study = calivera::testing::birthwtFileStudy(kBirthwt, model_);
    MainWindow w;
    open(w, study, "tables.cvstudy");
    const std::string folder = path("cli_tables");
    const auto cli =
        calivera::testing::runCalivera({"run", path("tables.cvstudy"), "--csv-dir", folder}, 120);
    QVERIFY2(cli.status == 0, cli.err.c_str());
    for (const char* view : {"thresholdTable", "hosmerLemeshowTable", "missingPatternsTable"}) {
      auto* table = w.findChild<QTableView*>(view);
      QVERIFY2(table != nullptr, view);
      const ResultTable* core = coreTableOf(*table->model());
      QVERIFY2(core != nullptr, view);
      const std::string written =
          calivera::testing::readWhole(std::filesystem::path(folder) / core->fileName);
      QVERIFY2(!written.empty(), core->fileName.c_str());
      QCOMPARE(tableToCsv(*table->model()).toStdString(), written);
    }
    // Sorting the view changes what is shown, not what is exported.
    auto* table = w.findChild<QTableView*>("thresholdTable");
    table->sortByColumn(5, Qt::DescendingOrder);
    QCOMPARE(tableToCsv(*table->model()).toStdString(),
             calivera::testing::readWhole(std::filesystem::path(folder) / "thresholds.csv"));
  }

  // The comparison and subgroup tables, defined once in core
  // (core/report/uncertainty_result_tables.h): the workstation's export writes what
  // `calivera run --csv-dir` writes. The net-benefit difference table shows only the reasonable
  // thresholds, so its export is the command line's file restricted to those rows.
  void comparisonAndSubgroupTablesExportAsTheCommandLineWritesThem() {
    const Table table = readCsvFile(kBirthwt, CsvOptions{}).table;
    CohortFitSpec spec;
    spec.outcome = OutcomeSpec{"low", std::nullopt};
    spec.predictors = {"age", "lwt"};
    spec.modelName = "birthwt two terms";
    const std::string second = path("second_model.json");
    writeModelFile(second, fitCohortModel(table, spec).model);
    StudyState study = calivera::testing::birthwtFileStudy(kBirthwt, model_);
    study.uncertaintySettings.compareModels = {InputFileRecord{second, sha256OfFile(second)}};
    study.uncertaintySettings.subgroupColumns = {"race"};
    study.uncertaintySettings.bootstrapReplicates = 20;
    study.uncertaintySettings.threads = 1;
    MainWindow w;
    open(w, study, "compare.cvstudy");
    QTRY_VERIFY_WITH_TIMEOUT(w.controller().study().uncertainty != nullptr, 120000);
    QTRY_VERIFY_WITH_TIMEOUT(!w.controller().job()->isRunning(), 120000);
    const std::string folder = path("cli_compare");
    const auto cli =
        calivera::testing::runCalivera({"run", path("compare.cvstudy"), "--csv-dir", folder}, 120);
    QVERIFY2(cli.status == 0, cli.err.c_str());
    for (const char* view : {"comparisonModelsTable", "comparisonDelongTable", "subgroupTable"}) {
      auto* shown = w.findChild<QTableView*>(view);
      QVERIFY2(shown != nullptr, view);
      const ResultTable* core = coreTableOf(*shown->model());
      QVERIFY2(core != nullptr && !core->rows.empty(), view);
      const std::string written =
          calivera::testing::readWhole(std::filesystem::path(folder) / core->fileName);
      QVERIFY2(!written.empty(), core->fileName.c_str());
      QCOMPARE(tableToCsv(*shown->model()).toStdString(), written);
    }
    auto* netBenefit = w.findChild<QTableView*>("comparisonNetBenefitTable");
    QVERIFY(netBenefit != nullptr);
    const QStringList exported = tableToCsv(*netBenefit->model()).split('\n', Qt::SkipEmptyParts);
    const QStringList whole =
        QString::fromStdString(calivera::testing::readWhole(std::filesystem::path(folder) /
                                                            "model_comparison_net_benefit.csv"))
            .split('\n', Qt::SkipEmptyParts);
    QVERIFY(exported.size() > 1);
    QVERIFY(exported.size() < whole.size());  // some grid thresholds lie outside 0.05 to 0.30
    QCOMPARE(exported.front(), whole.front());
    qsizetype at = 1;
    for (qsizetype i = 1; i < exported.size(); ++i) {  // in the file, in the file's order
      at = whole.indexOf(exported[i], at);
      QVERIFY2(at > 0, qPrintable(exported[i]));
    }
  }

  // The same study through the workstation's report export and through `calivera run --pdf`:
  // the same report settings (saved with the study), the same PDF text as pdftotext reads it.
  // Both runs share SOURCE_DATE_EPOCH, so even the creation date agrees. The model's development
  // fingerprint is the cohort's, so both PDFs must also call the validation apparent.
  void pdfTextMatchesTheCommandLine() {
    StudyState study = calivera::testing::birthwtFileStudy(kBirthwt, model_);
    study.report.title = "Parity <check> & \"quotes\"";
    study.report.thresholds = {0.1, 0.25, 0.4};
    study.report.suppressBelow = 5;
    study.report.paper = "letter";
    study.report.analyst = "A. Analyst";
    study.report.reviewer = "R. Reviewer";
    qputenv("SOURCE_DATE_EPOCH", "1764590400");
    MainWindow w;
    open(w, study, "pdf.cvstudy");
    QCOMPARE(w.controller().study().report.thresholds, study.report.thresholds);
    const std::string guiPdf = path("gui.pdf");
    // The opened study is saved and unchanged: the report names it, as `calivera run` does.
    ReportExportRequest request = exportRequestFor(w.controller().study(), guiPdf);
    request.studyFile = w.controller().savedStudyFile();
    QVERIFY(request.studyFile.has_value());
    QCOMPARE(exportReport(w.controller().study(), request).result(), QString());
    const std::string cliPdf = path("cli.pdf");
    const auto cli = calivera::testing::runCalivera(
        {"run", path("pdf.cvstudy"), "--pdf", cliPdf, "--json", path("cli.json")}, 120);
    QVERIFY2(cli.status == 0, cli.err.c_str());
    const QString guiText = pdfText(QString::fromStdString(guiPdf));
    const QString cliText = pdfText(QString::fromStdString(cliPdf));
    QVERIFY(guiText.contains("Parity <check>"));
    QVERIFY(guiText.contains("apparent", Qt::CaseInsensitive));
    QVERIFY(guiText.contains("2025-12-01"));
    QVERIFY(guiText.contains("A. Analyst") && guiText.contains("R. Reviewer"));
    QVERIFY(guiText.contains("pdf.cvstudy, SHA-256"));
    QVERIFY(guiText.contains(QString::fromStdString(sha256OfFile(path("pdf.cvstudy")))));
    QCOMPARE(guiText, cliText);
    // An option given to `run` wins over the saved setting.
    const auto retitled = calivera::testing::runCalivera(
        {"run", path("pdf.cvstudy"), "--pdf", path("cli2.pdf"), "--title", "Other"}, 120);
    QVERIFY2(retitled.status == 0, retitled.err.c_str());
    QVERIFY(pdfText(dir_.filePath("cli2.pdf")).contains("Other"));
    qunsetenv("SOURCE_DATE_EPOCH");
  }

  // The Predictor space tab's curve through the command the Reproduce dialog shows for it: the
  // same crossings of the study's threshold, to the last bit.
  void predictorViewRunsAsItsCommand() {
    StudyState study = calivera::testing::birthwtFileStudy(kBirthwt, model_);
    study.analysis.threshold = 0.3;
    MainWindow w;
    open(w, study, "predictor.cvstudy");
    auto* view = w.findChild<PredictorView*>("predictorView");
    QVERIFY(view != nullptr);
    view->choose("lwt", "");
    auto* curve = dynamic_cast<charts::RiskCurveChart*>(view->panel()->linkedChart());
    QVERIFY(curve != nullptr);
    QCOMPARE(w.controller().study().predictorView, std::vector<std::string>{"lwt"});
    const std::string line = predictorSpaceCommandText(w.controller().study()).toStdString();
    QVERIFY2(line.rfind("calivera predictor-space ", 0) == 0, line.c_str());
    const std::string json = path("predictor.json");
    const std::string command = calivera::testing::shellQuote(CALIVERA_BINARY) +
                                line.substr(std::string("calivera").size()) + " --json " +
                                calivera::testing::shellQuote(json);
    QCOMPARE(std::system(command.c_str()), 0);
    const auto j = nlohmann::json::parse(calivera::testing::readWhole(json));
    QCOMPARE(j["crossings"].get<std::vector<double>>(), curve->cutPoints());
    QVERIFY(!curve->cutPoints().empty());
  }

  // Every view's numbers can be reproduced: the action is there and shows core's command.
  void reproduceActionShowsTheStudysCommand() {
    const StudyState study = calivera::testing::birthwtFileStudy(kBirthwt, model_);
    MainWindow w;
    open(w, study, "reproduce.cvstudy");
    QVERIFY(w.findChild<QAction*>("actionReproduce") != nullptr);
    bool ok = false;
    const QString text = reproduceCommandText(w.controller().study(), &ok);
    QVERIFY(ok);
    QCOMPARE(text.toStdString(), reproduceCommandLine(study));
    QVERIFY(text.startsWith("calivera validate --data "));
    QVERIFY(text.contains("--groups 8"));
    // Without a model there is no command, and the reason says so.
    StudyState empty;
    QVERIFY(!reproduceCommandText(empty, &ok).isEmpty());
    QVERIFY(!ok);
  }
};

QTEST_MAIN(StudyParityTest)
#include "study_parity_test.moc"
