// Widget-free UI logic: threshold state, net benefit, table models and CSV export, the study file,
// unit checks, the boundary tracer and the plain-language readings.
#include <QSortFilterProxyModel>
#include <QTemporaryDir>
#include <QtTest>
#include <cmath>
#include <fstream>
#include <random>

#include "core/metrics/size_warnings.h"
#include "core/present/readings.h"
#include "core/study/predictor_space.h"
#include "core/study/spline_list.h"
#include "core/study/study_file.h"
#include "core/study/threshold_state.h"
#include "core/study/unit_check.h"
#include "core/util/errors.h"
#include "render/charts/chart_text.h"
#include "ui/models/record_table_model.h"
#include "ui/models/result_tables.h"
#include "ui/models/table_export.h"
#include "ui/models/uncertainty_tables.h"

using namespace calivera;
using namespace calivera::ui;

class UiLogicTest : public QObject {
  Q_OBJECT

 private slots:
  // Property: the O(log n) snapshot equals a direct count at every threshold (simulated data).
  void snapshotMatchesDirectCount() {
    std::mt19937 rng(3);
    std::uniform_real_distribution<double> u(0, 1);
    std::vector<double> risk(5000), outcome(5000);
    for (std::size_t i = 0; i < risk.size(); ++i) {
      risk[i] = std::round(u(rng) * 200) / 200;  // ties on purpose
      outcome[i] = u(rng) < risk[i] ? 1 : 0;
    }
    ThresholdState state;
    state.setData(risk, outcome);
    for (double t : {0.0, 0.005, 0.1, 0.333, 0.5, 0.995, 1.0}) {
      ConfusionCounts c;
      for (std::size_t i = 0; i < risk.size(); ++i) {
        const bool flagged = risk[i] >= t, event = outcome[i] > 0.5;
        (flagged ? (event ? c.tp : c.fp) : (event ? c.fn : c.tn))++;
      }
      const ThresholdSnapshot s = state.snapshotAt(t);
      QCOMPARE(s.counts.tp, c.tp);
      QCOMPARE(s.counts.fp, c.fp);
      QCOMPARE(s.counts.tn, c.tn);
      QCOMPARE(s.counts.fn, c.fn);
      QCOMPARE(s.flaggedPer1000, 1000.0 * double(c.tp + c.fp) / 5000.0);
    }
  }

  // Vickers, van Calster & Steyerberg, Diagn Progn Res 2019;3:18, worked table (read):
  // prevalence 0.30, treat-all net benefit 0.222 at t = 0.10 and 0.125 at t = 0.20.
  void treatAllNetBenefitMatchesPublishedTable() {
    const ConfusionCounts everyoneFlagged{30, 70, 0, 0};
    QVERIFY(std::abs(snapshotFromCounts(0.10, everyoneFlagged).netBenefitTreatAll - 0.222) < 5e-4);
    QVERIFY(std::abs(snapshotFromCounts(0.20, everyoneFlagged).netBenefitTreatAll - 0.125) < 5e-4);
    // Treating everyone is the model that flags everyone: its NB equals treat-all.
    const ThresholdSnapshot s = snapshotFromCounts(0.10, everyoneFlagged);
    QCOMPARE(s.netBenefit, s.netBenefitTreatAll);
  }

  void roundedNegativeZeroHasNoSign() {
    QCOMPARE(fixed(-0.00001, 4), QString("0.0000"));
    QCOMPARE(fixed(-0.4, 0), QString("0"));
    QCOMPARE(fixed(-0.00005, 4), QString("-0.0001"));
    QCOMPARE(fixed(-12.5, 1), QString("-12.5"));
  }

  void undefinedProportionsAreNaN() {
    const ThresholdSnapshot s = snapshotFromCounts(0.9, ConfusionCounts{0, 0, 70, 30});
    QVERIFY(std::isnan(s.ppv));
    QCOMPARE(s.sensitivity, 0.0);
    QVERIFY(std::isnan(snapshotFromCounts(1.0, ConfusionCounts{1, 1, 1, 1}).netBenefit));
  }

  void nudgeStaysOnTheGridAndClamps() {
    ThresholdState state;
    state.setThreshold(0.1);
    for (int i = 0; i < 20; ++i) state.nudge(1);
    QCOMPARE(state.threshold(), 0.2);
    state.setThreshold(0.998);
    state.nudge(1);
    QCOMPARE(state.threshold(), 1.0);
    QVERIFY(!state.setThreshold(std::nan("")));
  }

  void tableSortsNumbersAsNumbersAndExportsCsv() {
    RecordTableModel model;
    model.setTable({"Name", "Value"}, {},
                   {{{"a, with comma", 0}, {"10", 10}}, {{"b \"quoted\"", 0}, {"9", 9}}});
    QSortFilterProxyModel proxy;
    proxy.setSourceModel(&model);
    proxy.setSortRole(RecordTableModel::kSortRole);
    proxy.sort(1, Qt::AscendingOrder);
    QCOMPARE(proxy.index(0, 1).data().toString(), QString("9"));
    QCOMPARE(tableToCsv(proxy),
             QString("Name,Value\r\n\"b \"\"quoted\"\"\",9\r\n\"a, with comma\",10\r\n"));
    QCOMPARE(tableToTsv(proxy, {1}), QString("Name\tValue\r\na, with comma\t10\r\n"));
  }

  void nearestRowPicksTheClosestThreshold() {
    std::vector<ThresholdRow> rows(3);
    rows[0].threshold = 0.1;
    rows[1].threshold = 0.2;
    rows[2].threshold = 0.3;
    QCOMPARE(nearestThresholdRow(rows, 0.0), 0);
    QCOMPARE(nearestThresholdRow(rows, 0.16), 1);
    QCOMPARE(nearestThresholdRow(rows, 0.14), 0);
    QCOMPARE(nearestThresholdRow(rows, 0.9), 2);
    QCOMPARE(nearestThresholdRow({}, 0.5), -1);
  }

  void studyFileRoundTrip() {
    QTemporaryDir dir;
    const std::string data = dir.filePath("cohort.csv").toStdString();
    std::ofstream(data) << "x,y\n1,0\n";
    StudyState s;
    s.data = InputFileRecord{data, "abc"};
    s.import.delimiter = ';';
    s.import.missingTokens = {"", "NA", "."};
    s.import.outcomeColumn = "died";
    s.import.eventValue = "yes";
    s.modelSource = ModelSource::Fitted;
    s.fit.predictors = {"x"};
    s.fit.firth = true;
    s.fit.splineKnots = {{"x", 4}};
    s.columnMapping = {{"a", "b"}};
    s.analysis.threshold = 0.125;
    s.analysis.groups = 8;
    s.heldValues = {{"x", "3"}};
    const std::string path = dir.filePath("s.cvstudy").toStdString();
    writeStudyFile(path, s);
    const StudyState r = readStudyFile(path);
    QCOMPARE(r.data->path, data);
    QCOMPARE(r.import.delimiter, ';');
    QCOMPARE(r.import.missingTokens, s.import.missingTokens);
    QCOMPARE(*r.import.eventValue, std::string("yes"));
    QVERIFY(r.modelSource == ModelSource::Fitted);
    QCOMPARE(r.fit.predictors, s.fit.predictors);
    QVERIFY(r.fit.firth);
    QCOMPARE(r.fit.splineKnots, s.fit.splineKnots);
    QCOMPARE(r.columnMapping, s.columnMapping);
    QCOMPARE(r.analysis.threshold, 0.125);
    QCOMPARE(r.analysis.groups, 8);
    QCOMPARE(r.heldValues, s.heldValues);
    const auto checks = checkInputs(r);  // recorded SHA "abc" is not the file's
    QCOMPARE(checks.size(), std::size_t{1});
    QCOMPARE(checks[0].problem, std::string("changed since the study was saved"));
  }

  void splineListParsesAndRejectsWithTheItem() {
    const auto parsed = parseSplineList(" age=4, bmi = 3 ,");
    QCOMPARE(parsed, (std::map<std::string, int>{{"age", 4}, {"bmi", 3}}));
    QCOMPARE(formatSplineList(parsed), std::string("age=4, bmi=3"));
    QVERIFY(parseSplineList("").empty());
    for (const char* bad : {"age", "age=2", "age=8", "=4", "age=4x", "age=4, age=5"}) {
      try {
        parseSplineList(bad);
        QFAIL(bad);
      } catch (const InputError& e) {
        QVERIFY2(std::string(e.what()).find("splines:") == 0, e.what());
      }
    }
  }

  void studyFileKeepsUncertaintySettings() {
    QTemporaryDir dir;
    const std::string model = dir.filePath("other_model.json").toStdString();
    std::ofstream(model) << "{}";
    StudyState s;
    s.uncertaintySettings.bootstrapReplicates = 500;
    s.uncertaintySettings.seed = 4242;
    s.uncertaintySettings.threads = 3;
    s.uncertaintySettings.compareModels = {InputFileRecord{model, "def"}};
    s.uncertaintySettings.subgroupColumns = {"site", "sex"};
    s.uncertaintySettings.sizeThresholds = {0.1, 0.25};
    const std::string path = dir.filePath("u.cvstudy").toStdString();
    writeStudyFile(path, s);
    const StudyState r = readStudyFile(path);
    const UncertaintySettings& u = r.uncertaintySettings;
    QCOMPARE(u.bootstrapReplicates, 500);
    QCOMPARE(u.seed, std::uint64_t{4242});
    QCOMPARE(u.threads, 3u);
    QCOMPARE(u.compareModels.size(), std::size_t{1});
    QCOMPARE(u.compareModels[0].path, model);
    QCOMPARE(u.compareModels[0].sha256, std::string("def"));
    QCOMPARE(u.subgroupColumns, s.uncertaintySettings.subgroupColumns);
    QCOMPARE(u.sizeThresholds, s.uncertaintySettings.sizeThresholds);
    // The compared model is checked like the other inputs ("def" is not its SHA-256).
    const auto checks = checkInputs(r);
    QCOMPARE(checks.size(), std::size_t{1});
    QCOMPARE(checks[0].role, std::string("compared model file"));
    // A study without the key (saved before it existed) opens with everything off.
    const StudyState old = parseStudyJson(
        R"({"format": "calivera-study/1", "import": {}, "model": {}, "analysis": {}})", "o");
    QVERIFY(!old.uncertaintySettings.anyRequested());
    try {
      parseStudyJson(R"({"format": "calivera-study/1", "import": {}, "model": {},
                         "analysis": {}, "uncertainty": {"bootstrap": -5}})",
                     "b.cvstudy");
      QFAIL("no error");
    } catch (const InputError& e) {
      QVERIFY2(QString(e.what()).contains("b.cvstudy: field 'uncertainty.bootstrap'"), e.what());
    }
  }

  // A level without metrics (one outcome class) keeps its counts, shows "not defined" for every
  // measure and says why; bootstrap columns appear only when some level has a bootstrap.
  void subgroupTableShowsLevelsWithoutMetrics() {
    SubgroupAnalysis a;
    a.column = "site";
    SubgroupResult level;
    level.level = "North";
    level.n = 12;
    level.events = 0;
    level.tooSmall = true;
    level.warnings = {"no metrics: one outcome class"};
    a.levels.push_back(level);
    RecordTableModel model;
    fillSubgroupTable(model, a);
    QCOMPARE(model.rowCount(), 1);
    QCOMPARE(model.columnCount(), 15);
    QCOMPARE(model.cell(0, 0).text, QString("North"));
    QCOMPARE(model.cell(0, 1).text, QString("12"));
    QCOMPARE(model.cell(0, 3).text, QString("0.0000"));
    QCOMPARE(model.cell(0, 4).text, QString("not defined"));
    QCOMPARE(model.cell(0, 13).text, QString("too few patients"));
    QCOMPARE(model.cell(0, 14).text, QString("no metrics: one outcome class"));
  }

  void studyFileErrorsNameTheField() {
    try {
      parseStudyJson(R"({"format": "calivera-study/1", "import": {}, "model": {},
                         "analysis": {"threshold": 3}})",
                     "x.cvstudy");
      QFAIL("no error");
    } catch (const InputError& e) {
      QVERIFY2(QString(e.what()).contains("x.cvstudy: field 'analysis.threshold'"), e.what());
    }
    QVERIFY_THROWS_EXCEPTION(InputError, parseStudyJson(R"({"format": "other"})", "y"));
    QVERIFY_THROWS_EXCEPTION(InputError, parseStudyJson("{", "z"));
  }

  void unitCheck() {
    QCOMPARE(*unitFromHeader("creatinine [umol/L]"), std::string("umol/L"));
    QCOMPARE(*unitFromHeader("age (years)"), std::string("years"));
    QVERIFY(!unitFromHeader("creat_umol"));
    QVERIFY(checkUnit(std::string("µmol/L"), "creatinine [umol/l]").verdict ==
            UnitVerdict::Matches);
    QVERIFY(checkUnit(std::string("mg/dL"), "creatinine [umol/L]").verdict == UnitVerdict::Differs);
    QVERIFY(checkUnit(std::string("mg/dL"), "creatinine").verdict == UnitVerdict::ColumnSilent);
    QVERIFY(checkUnit(std::nullopt, "creatinine").verdict == UnitVerdict::NotStated);
  }

  // A surface whose logit is linear: the traced boundary must satisfy the linear equation exactly
  // (interpolation is on the logit scale).
  void boundaryOfALinearLogitIsExact() {
    BoundaryData s;
    for (int i = 0; i < 30; ++i) s.xs.push_back(i / 29.0 * 10);
    for (int j = 0; j < 30; ++j) s.ys.push_back(j / 29.0 * 5);
    for (double y : s.ys) {
      for (double x : s.xs) s.risk.push_back(1 / (1 + std::exp(-(-3 + 0.4 * x + 0.5 * y))));
    }
    const auto lines = contourAt(s, 0.5);
    QCOMPARE(lines.size(), std::size_t{1});
    QVERIFY(lines[0].size() > 20);
    for (const auto& [x, y] : lines[0]) QVERIFY(std::abs(-3 + 0.4 * x + 0.5 * y) < 1e-9);
    QVERIFY(contourAt(s, 0.999999).empty());
  }

  void curveCrossings() {
    RiskCurveData c;
    c.x = {0, 1, 2, 3};
    c.risk = {0.1, 0.3, 0.5, 0.2};
    const auto x = crossings(c, 0.4);
    QCOMPARE(x.size(), std::size_t{2});
    QVERIFY(std::abs(x[0] - 1.5) < 1e-12);
    QVERIFY(std::abs(x[1] - (2 + 1.0 / 3)) < 1e-12);
  }

  void hierarchyReading() {
    Calibration c;
    c.interceptCi = {-0.1, 0.1};
    c.slope = 0.95;
    c.slopeCi = {0.8, 1.1};
    QCOMPARE(readCalibrationHierarchy(c).level, std::string("weak"));
    c.slopeCi = {0.6, 0.9};
    c.slope = 0.75;
    const HierarchyReading r = readCalibrationHierarchy(c);
    QCOMPARE(r.level, std::string("mean"));
    QVERIFY(r.explanation.find("too extreme") != std::string::npos);
    c.interceptCi = {-0.5, -0.2};
    c.intercept = -0.35;
    QCOMPARE(readCalibrationHierarchy(c).level, std::string("none"));
    QVERIFY(readCalibrationHierarchy(c).explanation.find("too high") != std::string::npos);
  }

  void sizeWarningsAreWordedOnce() {
    // Each shortfall once, from core/metrics/size_warnings.h; the reading adds only the
    // apparent-performance note.
    QCOMPARE(sizeWarningTexts(40, 460).size(), std::size_t{2});
    QCOMPARE(sizeWarningTexts(150, 4850).size(), std::size_t{1});
    QVERIFY(sizeWarningTexts(400, 4600).empty());
    QVERIFY(sizeWarningText(SizeWarning::FewEventsOrNonEvents, 40, 460, false).find("40") ==
            std::string::npos);
    CohortSummary small{500, 40, 0.08, false};
    QVERIFY(readingWarnings(small).empty());
    CohortSummary apparent{5000, 400, 0.08, true};
    QCOMPARE(readingWarnings(apparent).size(), std::size_t{1});
  }
};

QTEST_MAIN(UiLogicTest)
#include "ui_logic_test.moc"
