// Core logic of the study layer, checked without Qt: the threshold state and its snapshot, the
// study file, spline lists, unit checks, the predictor-space tracer and the plain-language
// readings. (These were Qt tests of the workstation before the study layer moved to core.)
#include <gtest/gtest.h>

#include <cmath>
#include <cstdint>
#include <fstream>
#include <map>
#include <random>
#include <string>
#include <vector>

#include "core/metrics/size_warnings.h"
#include "core/present/readings.h"
#include "core/study/predictor_space.h"
#include "core/study/spline_list.h"
#include "core/study/study_file.h"
#include "core/study/threshold_state.h"
#include "core/study/unit_check.h"
#include "core/util/errors.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

// Property: the O(log n) snapshot equals a direct count at every threshold (simulated data).
TEST(ThresholdState, SnapshotMatchesDirectCount) {
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
    EXPECT_EQ(s.counts.tp, c.tp);
    EXPECT_EQ(s.counts.fp, c.fp);
    EXPECT_EQ(s.counts.tn, c.tn);
    EXPECT_EQ(s.counts.fn, c.fn);
    EXPECT_DOUBLE_EQ(s.flaggedPer1000, 1000.0 * double(c.tp + c.fp) / 5000.0);
  }
}

// Vickers, van Calster & Steyerberg, Diagn Progn Res 2019;3:18, worked table (read):
// prevalence 0.30, treat-all net benefit 0.222 at t = 0.10 and 0.125 at t = 0.20.
TEST(ThresholdState, TreatAllNetBenefitMatchesPublishedTable) {
  const ConfusionCounts everyoneFlagged{30, 70, 0, 0};
  EXPECT_TRUE(std::abs(snapshotFromCounts(0.10, everyoneFlagged).netBenefitTreatAll - 0.222) <
              5e-4);
  EXPECT_TRUE(std::abs(snapshotFromCounts(0.20, everyoneFlagged).netBenefitTreatAll - 0.125) <
              5e-4);
  // Treating everyone is the model that flags everyone: its NB equals treat-all.
  const ThresholdSnapshot s = snapshotFromCounts(0.10, everyoneFlagged);
  EXPECT_EQ(s.netBenefit, s.netBenefitTreatAll);
}

TEST(ThresholdState, UndefinedProportionsAreNaN) {
  const ThresholdSnapshot s = snapshotFromCounts(0.9, ConfusionCounts{0, 0, 70, 30});
  EXPECT_TRUE(std::isnan(s.ppv));
  EXPECT_EQ(s.sensitivity, 0.0);
  EXPECT_TRUE(std::isnan(snapshotFromCounts(1.0, ConfusionCounts{1, 1, 1, 1}).netBenefit));
}

TEST(ThresholdState, NudgeStaysOnTheGridAndClamps) {
  ThresholdState state;
  state.setThreshold(0.1);
  for (int i = 0; i < 20; ++i) state.nudge(1);
  EXPECT_DOUBLE_EQ(state.threshold(), 0.2);
  state.setThreshold(0.998);
  state.nudge(1);
  EXPECT_EQ(state.threshold(), 1.0);
  EXPECT_TRUE(!state.setThreshold(std::nan("")));
}

TEST(StudyFile, StudyFileRoundTrip) {
  testing::TempDir dir("study_logic");
  const std::string data = dir.file("cohort.csv");
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
  const std::string path = dir.file("s.cvstudy");
  writeStudyFile(path, s);
  const StudyState r = readStudyFile(path);
  EXPECT_EQ(r.data->path, data);
  EXPECT_EQ(r.import.delimiter, ';');
  EXPECT_EQ(r.import.missingTokens, s.import.missingTokens);
  EXPECT_EQ(*r.import.eventValue, std::string("yes"));
  EXPECT_TRUE(r.modelSource == ModelSource::Fitted);
  EXPECT_EQ(r.fit.predictors, s.fit.predictors);
  EXPECT_TRUE(r.fit.firth);
  EXPECT_EQ(r.fit.splineKnots, s.fit.splineKnots);
  EXPECT_EQ(r.columnMapping, s.columnMapping);
  EXPECT_EQ(r.analysis.threshold, 0.125);
  EXPECT_EQ(r.analysis.groups, 8);
  EXPECT_EQ(r.heldValues, s.heldValues);
  const auto checks = checkInputs(r);  // recorded SHA "abc" is not the file's
  EXPECT_EQ(checks.size(), std::size_t{1});
  EXPECT_EQ(checks[0].problem, std::string("changed since the study was saved"));
}

TEST(SplineList, SplineListParsesAndRejectsWithTheItem) {
  const auto parsed = parseSplineList(" age=4, bmi = 3 ,");
  EXPECT_EQ(parsed, (std::map<std::string, int>{{"age", 4}, {"bmi", 3}}));
  EXPECT_EQ(formatSplineList(parsed), std::string("age=4, bmi=3"));
  EXPECT_TRUE(parseSplineList("").empty());
  for (const char* bad : {"age", "age=2", "age=8", "=4", "age=4x", "age=4, age=5"}) {
    try {
      parseSplineList(bad);
      ADD_FAILURE() << bad;
    } catch (const InputError& e) {
      EXPECT_TRUE(std::string(e.what()).find("splines:") == 0) << e.what();
    }
  }
}

TEST(StudyFile, StudyFileKeepsUncertaintySettings) {
  testing::TempDir dir("study_logic");
  const std::string model = dir.file("other_model.json");
  std::ofstream(model) << "{}";
  StudyState s;
  s.uncertaintySettings.bootstrapReplicates = 500;
  s.uncertaintySettings.seed = 4242;
  s.uncertaintySettings.threads = 3;
  s.uncertaintySettings.compareModels = {InputFileRecord{model, "def"}};
  s.uncertaintySettings.subgroupColumns = {"site", "sex"};
  s.uncertaintySettings.sizeThresholds = {0.1, 0.25};
  const std::string path = dir.file("u.cvstudy");
  writeStudyFile(path, s);
  const StudyState r = readStudyFile(path);
  const UncertaintySettings& u = r.uncertaintySettings;
  EXPECT_EQ(u.bootstrapReplicates, 500);
  EXPECT_EQ(u.seed, std::uint64_t{4242});
  EXPECT_EQ(u.threads, 3u);
  EXPECT_EQ(u.compareModels.size(), std::size_t{1});
  EXPECT_EQ(u.compareModels[0].path, model);
  EXPECT_EQ(u.compareModels[0].sha256, std::string("def"));
  EXPECT_EQ(u.subgroupColumns, s.uncertaintySettings.subgroupColumns);
  EXPECT_EQ(u.sizeThresholds, s.uncertaintySettings.sizeThresholds);
  // The compared model is checked like the other inputs ("def" is not its SHA-256).
  const auto checks = checkInputs(r);
  EXPECT_EQ(checks.size(), std::size_t{1});
  EXPECT_EQ(checks[0].role, std::string("compared model file"));
  // A study without the key (saved before it existed) opens with everything off.
  const StudyState old = parseStudyJson(
      R"({"format": "calivera-study/1", "import": {}, "model": {}, "analysis": {}})", "o");
  EXPECT_TRUE(!old.uncertaintySettings.anyRequested());
  try {
    parseStudyJson(R"({"format": "calivera-study/1", "import": {}, "model": {},
                         "analysis": {}, "uncertainty": {"bootstrap": -5}})",
                   "b.cvstudy");
    ADD_FAILURE() << "no error";
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("b.cvstudy: field 'uncertainty.bootstrap'"),
              std::string::npos)
        << e.what();
  }
}

TEST(StudyFile, StudyFileErrorsNameTheField) {
  try {
    parseStudyJson(R"({"format": "calivera-study/1", "import": {}, "model": {},
                         "analysis": {"threshold": 3}})",
                   "x.cvstudy");
    ADD_FAILURE() << "no error";
  } catch (const InputError& e) {
    EXPECT_NE(std::string(e.what()).find("x.cvstudy: field 'analysis.threshold'"),
              std::string::npos)
        << e.what();
  }
  EXPECT_THROW(parseStudyJson(R"({"format": "other"})", "y"), InputError);
  EXPECT_THROW(parseStudyJson("{", "z"), InputError);
}

TEST(UnitCheck, UnitCheck) {
  EXPECT_EQ(*unitFromHeader("creatinine [umol/L]"), std::string("umol/L"));
  EXPECT_EQ(*unitFromHeader("age (years)"), std::string("years"));
  EXPECT_TRUE(!unitFromHeader("creat_umol"));
  EXPECT_TRUE(checkUnit(std::string("µmol/L"), "creatinine [umol/l]").verdict ==
              UnitVerdict::Matches);
  EXPECT_TRUE(checkUnit(std::string("mg/dL"), "creatinine [umol/L]").verdict ==
              UnitVerdict::Differs);
  EXPECT_TRUE(checkUnit(std::string("mg/dL"), "creatinine").verdict == UnitVerdict::ColumnSilent);
  EXPECT_TRUE(checkUnit(std::nullopt, "creatinine").verdict == UnitVerdict::NotStated);
}

// A surface whose logit is linear: the traced boundary must satisfy the linear equation exactly
// (interpolation is on the logit scale).
TEST(PredictorSpace, BoundaryOfALinearLogitIsExact) {
  BoundaryData s;
  for (int i = 0; i < 30; ++i) s.xs.push_back(i / 29.0 * 10);
  for (int j = 0; j < 30; ++j) s.ys.push_back(j / 29.0 * 5);
  for (double y : s.ys) {
    for (double x : s.xs) s.risk.push_back(1 / (1 + std::exp(-(-3 + 0.4 * x + 0.5 * y))));
  }
  const auto lines = contourAt(s, 0.5);
  EXPECT_EQ(lines.size(), std::size_t{1});
  EXPECT_TRUE(lines[0].size() > 20);
  for (const auto& [x, y] : lines[0]) EXPECT_TRUE(std::abs(-3 + 0.4 * x + 0.5 * y) < 1e-9);
  EXPECT_TRUE(contourAt(s, 0.999999).empty());
}

TEST(PredictorSpace, CurveCrossings) {
  RiskCurveData c;
  c.x = {0, 1, 2, 3};
  c.risk = {0.1, 0.3, 0.5, 0.2};
  const auto x = crossings(c, 0.4);
  EXPECT_EQ(x.size(), std::size_t{2});
  EXPECT_TRUE(std::abs(x[0] - 1.5) < 1e-12);
  EXPECT_TRUE(std::abs(x[1] - (2 + 1.0 / 3)) < 1e-12);
}

TEST(Readings, HierarchyReading) {
  Calibration c;
  c.interceptCi = {-0.1, 0.1};
  c.slope = 0.95;
  c.slopeCi = {0.8, 1.1};
  EXPECT_EQ(readCalibrationHierarchy(c).level, std::string("weak"));
  c.slopeCi = {0.6, 0.9};
  c.slope = 0.75;
  const HierarchyReading r = readCalibrationHierarchy(c);
  EXPECT_EQ(r.level, std::string("mean"));
  EXPECT_TRUE(r.explanation.find("too extreme") != std::string::npos);
  c.interceptCi = {-0.5, -0.2};
  c.intercept = -0.35;
  EXPECT_EQ(readCalibrationHierarchy(c).level, std::string("none"));
  EXPECT_TRUE(readCalibrationHierarchy(c).explanation.find("too high") != std::string::npos);
}

TEST(Readings, SizeWarningsAreWordedOnce) {
  // Each shortfall once, from core/metrics/size_warnings.h; the reading adds only the
  // apparent-performance note.
  EXPECT_EQ(sizeWarningTexts(40, 460).size(), std::size_t{2});
  EXPECT_EQ(sizeWarningTexts(150, 4850).size(), std::size_t{1});
  EXPECT_TRUE(sizeWarningTexts(400, 4600).empty());
  EXPECT_TRUE(sizeWarningText(SizeWarning::FewEventsOrNonEvents, 40, 460, false).find("40") ==
              std::string::npos);
  CohortSummary small{500, 40, 0.08, false};
  EXPECT_TRUE(readingWarnings(small).empty());
  CohortSummary apparent{5000, 400, 0.08, true};
  EXPECT_EQ(readingWarnings(apparent).size(), std::size_t{1});
}

}  // namespace
}  // namespace calivera
