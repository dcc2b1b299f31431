// The workstation's study of site summaries (issue 15, part 4): the window pools the summaries
// through the same core path as `calivera pool` (equal numbers, not close ones), shows every site
// in the multi-site views, saves the set and opens it again, writes the report and the tables,
// and a bad summary leaves the shown pool untouched with a message naming the file. Patients:
// the Aids2 cohort (tests/reference/data/aids2_sites.csv, Debian r-cran-mass) split by state, as
// four sites would hold it.
#include "ui/sites/site_summaries_window.h"

#include <QFile>
#include <QLabel>
#include <QTabWidget>
#include <QTableView>
#include <QTemporaryDir>
#include <QtTest>
#include <fstream>
#include <map>

#include "core/metrics/validation_run.h"
#include "core/report/site_tables.h"
#include "core/sites/site_summary.h"
#include "core/sites/summary_set.h"
#include "tests/reference/reference_csv.h"
#include "tests/ui/pdf_text.h"
#include "ui/async/background_job.h"
#include "ui/main_window.h"
#include "ui/views/site_curves_widget.h"
#include "ui/views/sites_view.h"

using namespace calivera;
using namespace calivera::ui;

class SiteSummariesWindowTest : public QObject {
  Q_OBJECT

 private:
  QTemporaryDir dir_;
  QStringList summaries_;
  std::vector<std::string> states_;

  static void waitFor(SiteSummariesWindow& w) {
    QTRY_VERIFY_WITH_TIMEOUT(!w.job()->isRunning(), 60000);
  }

  PooledSummaries corePool() const {
    std::vector<SummarySetEntry> entries;
    for (const QString& p : summaries_) entries.push_back({p.toStdString(), ""});
    return poolSummaries(loadSummaryFiles(entries, {}), {});
  }

 private slots:
  void initTestCase() {
    QVERIFY(dir_.isValid());
    auto columns = testing::readColumns(testing::referencePath("aids2_sites.csv"));
    std::map<std::string, std::string> files;
    for (std::size_t i = 0; i < columns["state"].size(); ++i) {
      std::string& text = files[columns["state"][i]];
      if (text.empty()) text = "dead,risk\n";
      text += columns["dead"][i] + "," + columns["risk"][i] + "\n";
    }
    for (const auto& [state, text] : files) {
      const std::string csv = dir_.filePath(QString::fromStdString(state + ".csv")).toStdString();
      std::ofstream(csv) << text;
      ValidationRequest request;
      request.dataPath = csv;
      request.outcome = OutcomeSpec{"dead", std::nullopt};
      request.riskColumn = "risk";
      SummaryOptions options;
      options.site = state;
      const QString out = dir_.filePath(QString::fromStdString(state + ".cvsummary"));
      std::ofstream(out.toStdString())
          << siteSummaryText(summarizeRun(runValidation(request), options));
      summaries_ << out;
      states_.push_back(state);
    }
    QCOMPARE(summaries_.size(), 4);
  }

  void poolsAsCoreDoesAndShowsEverySite() {
    SiteSummariesWindow w;
    w.show();
    QVERIFY(w.addSummaries(summaries_));
    waitFor(w);
    QVERIFY2(w.pooled() != nullptr, qPrintable(w.messageText()));
    const PooledSummaries ref = corePool();
    const SiteAnalysis& a = w.pooled()->analysis;
    QCOMPARE(a.measures.size(), ref.analysis.measures.size());
    for (std::size_t m = 0; m < a.measures.size(); ++m) {
      QCOMPARE(a.measures[m].pooled.pool.has_value(),
               ref.analysis.measures[m].pooled.pool.has_value());
      if (!a.measures[m].pooled.pool) continue;
      QCOMPARE(a.measures[m].pooled.pool->estimate, ref.analysis.measures[m].pooled.pool->estimate);
      QCOMPARE(a.measures[m].pooled.pool->tau2, ref.analysis.measures[m].pooled.pool->tau2);
    }
    QCOMPARE(w.pooled()->overallAuc.auc, ref.overallAuc.auc);
    // The same sentence as `calivera pool` prints and its report carries.
    QVERIFY(w.findChild<QLabel*>("summaryOverall")
                ->text()
                .startsWith(QString::fromStdString(pooledOverallText(ref))));
    QCOMPARE(w.findChild<QTableView*>("summaryInputsTable")->model()->rowCount(), 4);
    QCOMPARE(w.findChild<QTableView*>("sitesTable")->model()->rowCount(),
             static_cast<int>(sitesTable(ref.analysis).rows.size()));
    QCOMPARE(w.findChild<QTableView*>("sitesNetBenefitTable")->model()->rowCount(),
             static_cast<int>(ref.analysis.netBenefit.size()));
    // Every site's curve on one axes; selecting a site highlights its own.
    SitesView* view = w.sitesView();
    QCOMPARE(view->allSiteCurves()->plot().curves.size(), std::size_t{4});
    view->showSite(2);
    QCOMPARE(view->currentSite(), 2);
    QVERIFY(view->allSiteCurves()->highlightedCurve().has_value());
    const std::size_t curve = *view->allSiteCurves()->highlightedCurve();
    QCOMPARE(view->allSiteCurves()->plot().curves[curve].siteIndex, std::size_t{2});
    QVERIFY(w.reproduceLine().startsWith(QStringLiteral("calivera pool ")));
    QVERIFY(w.reproduceLine().contains(QFileInfo(summaries_[0]).fileName()));
    QVERIFY(w.isModified());
  }

  void savesOpensReportsAndExports() {
    const QString setPath = dir_.filePath("aids2.cvsites");
    {
      SiteSummariesWindow w;
      QVERIFY(w.addSummaries(summaries_));
      waitFor(w);
      QCOMPARE(w.saveSet(setPath), QString());
      QVERIFY(!w.isModified());
      QCOMPARE(w.reproduceLine(), QStringLiteral("calivera pool --set ") + setPath);
    }
    SiteSummariesWindow w;
    QVERIFY(w.openSet(setPath));
    waitFor(w);
    QVERIFY2(w.pooled() != nullptr, qPrintable(w.messageText()));
    QCOMPARE(w.pooled()->inputs.size(), std::size_t{4});
    QVERIFY(!w.isModified());
    const PooledSummaries ref = corePool();
    QCOMPARE(w.pooled()->analysis.measures[0].pooled.pool->estimate,
             ref.analysis.measures[0].pooled.pool->estimate);

    const QString pdf = dir_.filePath("pooled.pdf");
    QVERIFY(w.exportReport(pdf));
    waitFor(w);
    QVERIFY2(QFile::exists(pdf), qPrintable(w.messageText()));
    const QString text = testing::pdfText(pdf);
    QVERIFY(text.contains(QStringLiteral("Calibration by site")));
    QVERIFY(text.contains(QStringLiteral("do not replace clinical judgment")));
    QVERIFY(text.contains(QStringLiteral("QLD.cvsummary")));

    const QString tables = dir_.filePath("tables");
    QCOMPARE(w.exportTables(tables), QString());
    for (const char* name :
         {"sites.csv", "sites_pooled.csv", "sites_net_benefit.csv", "site_inputs.csv"}) {
      QVERIFY2(QFile::exists(tables + "/" + name), name);
    }
  }

  void aBadSummaryLeavesThePoolAsItWas() {
    SiteSummariesWindow w;
    QVERIFY(w.addSummaries(summaries_.mid(0, 3)));
    waitFor(w);
    const PooledSummaries* before = w.pooled();
    QVERIFY(before != nullptr);
    QFile source(summaries_[3]);
    QVERIFY(source.open(QIODevice::ReadOnly));
    QByteArray bytes = source.readAll();
    bytes.replace("\"n\": ", "\"n\": 1");  // hand-edited: the fingerprint no longer matches
    const QString edited = dir_.filePath("edited.cvsummary");
    QFile out(edited);
    QVERIFY(out.open(QIODevice::WriteOnly));
    out.write(bytes);
    out.close();
    QVERIFY(w.addSummaries({edited}));
    waitFor(w);
    QCOMPARE(w.pooled(), before);
    QVERIFY2(w.messageText().contains(QStringLiteral("edited.cvsummary")),
             qPrintable(w.messageText()));
    // Adding the real fourth site, then removing one, pools again each time.
    QVERIFY(w.addSummaries({summaries_[3]}));
    waitFor(w);
    QCOMPARE(w.pooled()->inputs.size(), std::size_t{4});
    QVERIFY(w.removeSite(0));
    waitFor(w);
    QCOMPARE(w.pooled()->inputs.size(), std::size_t{3});
  }

  void theMainWindowOpensSummariesAndSets() {
    MainWindow main;
    QVERIFY(main.openDroppedFile(summaries_[0]));
    auto windows = main.findChildren<SiteSummariesWindow*>();
    QCOMPARE(windows.size(), qsizetype(1));
    waitFor(*windows.front());
    // One summary alone cannot be pooled: said, not crashed.
    QVERIFY(windows.front()->pooled() == nullptr);
    QVERIFY2(windows.front()->messageText().contains(QStringLiteral("at least two")),
             qPrintable(windows.front()->messageText()));
    SiteSummariesWindow* all = main.openSiteSummaries(summaries_);
    waitFor(*all);
    QVERIFY(all->pooled() != nullptr);
    QCOMPARE(all->pooled()->inputs.size(), std::size_t{4});
  }

  // CALIVERA_SCREENSHOT_DIR=D (and CALIVERA_SCREENSHOT_SIZE=WxH): each page of the window saved
  // for people to look at; without it the pages are still drawn and grabbed.
  // The pictures show the invented demo scenario: the sample cohort's four hospitals, each
  // summarized on its own patients with the sample model.
  void screenshots() {
    const QByteArray dir = qgetenv("CALIVERA_SCREENSHOT_DIR");
    const QList<QByteArray> size = qgetenv("CALIVERA_SCREENSHOT_SIZE").split('x');
    std::ifstream in(CALIVERA_SOURCE_DIR "/sample_data/local_cohort.csv");
    std::string header, line;
    QVERIFY(std::getline(in, header));
    std::map<std::string, std::string> bySite;  // the second column names the hospital
    while (std::getline(in, line)) {
      const std::size_t a = line.find(',');
      const std::size_t b = line.find(',', a + 1);
      QVERIFY(a != std::string::npos && b != std::string::npos);
      std::string& text = bySite[line.substr(a + 1, b - a - 1)];
      if (text.empty()) text = header + "\n";
      text += line + "\n";
    }
    QStringList demo;
    for (const auto& [site, text] : bySite) {
      const QString csv = dir_.filePath(QString::fromStdString("demo_" + site + ".csv"));
      std::ofstream(csv.toStdString()) << text;
      ValidationRequest request;
      request.dataPath = csv.toStdString();
      request.outcome = OutcomeSpec{"complication_30d", std::nullopt};
      request.modelPath = CALIVERA_SOURCE_DIR "/sample_data/published_model.json";
      SummaryOptions options;
      options.site = site;
      options.suppressBelow = 11;
      const QString out = dir_.filePath(QString::fromStdString(site + ".cvsummary"));
      std::ofstream(out.toStdString())
          << siteSummaryText(summarizeRun(runValidation(request), options));
      demo << out;
    }
    QCOMPARE(demo.size(), 4);
    SiteSummariesWindow w;
    w.resize(size.size() == 2 ? size[0].toInt() : 1366, size.size() == 2 ? size[1].toInt() : 768);
    w.show();
    QVERIFY(QTest::qWaitForWindowExposed(&w));
    QVERIFY(w.addSummaries(demo));
    waitFor(w);
    QVERIFY(w.pooled() != nullptr);
    auto* pages = w.findChild<QTabWidget*>("sitesPages");
    QVERIFY(pages != nullptr);
    const char* names[] = {"summaries_read", "summaries_sites", "summaries_forest",
                           "summaries_calibration", "summaries_net_benefit"};
    QCOMPARE(pages->count(), 5);
    // What a user waits for is on screen at the smallest common size: nothing grew the window.
    QCOMPARE(w.height(), size.size() == 2 ? size[1].toInt() : 768);
    for (int i = 0; i < pages->count(); ++i) {
      pages->setCurrentIndex(i);
      QTest::qWait(50);  // the page's layout settles as a user would see it
      const QImage image = w.grab().toImage();
      QVERIFY(!image.isNull());
      if (!dir.isEmpty()) {
        QVERIFY(image.save(QString::fromLocal8Bit(dir) + "/" + names[i] + ".png"));
      }
    }
  }
};

QTEST_MAIN(SiteSummariesWindowTest)
#include "site_summaries_window_test.moc"
