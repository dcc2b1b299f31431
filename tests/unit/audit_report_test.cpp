// The audit report's Qt-free content (core/report/audit_report.h): block order, identification,
// thresholds, checklist, methods, suppression wording, number formats and SOURCE_DATE_EPOCH.
// Inputs are hand-made result structs: these tests check what the report says about given
// numbers, not the numbers themselves (those are checked in the metrics and reference tests).
#include "core/report/audit_report.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdlib>

#include "core/report/audit_format.h"
#include "core/util/errors.h"

namespace calivera {
namespace {

AuditReportInput minimalInput() {
  AuditReportInput input;
  input.title = "Audit";
  input.createdAt = "2026-12-01 00:00:00 UTC";
  input.softwareVersion = "0.1.0";
  input.cohortFile = {"/home/someone/ward 7/cohort.csv", std::string(64, '1')};
  input.modelFile = {"models/model.json", std::string(64, '2')};
  input.exclusions.rowsRead = 250;
  input.exclusions.rowsExcluded = 50;
  input.exclusions.rowsAnalysed = 200;
  input.exclusions.byColumn = {{"age", 30}, {"creatinine", 25}};
  input.result.cohort.n = 200;
  input.result.cohort.events = 120;
  input.result.cohort.prevalence = 0.6;
  input.result.discrimination.auc = 0.8126;
  input.result.discrimination.aucCi = {0.7512, 0.8611};
  for (const double t : {0.1, 0.2, 0.3}) {
    ThresholdRow row;
    row.threshold = t;
    row.tp = 100;
    row.fn = 20;
    row.fp = 40;
    row.tn = 40;
    input.result.thresholds.push_back(row);
  }
  input.settings.tableThresholds = {0.2};
  return input;
}

std::string allText(const AuditDocument& doc) {
  std::string text = doc.title + "\n" + doc.subtitle + "\n";
  for (const ReportBlock& block : doc.blocks) {
    text += block.text + "\n" + block.table.caption + "\n" + block.table.note + "\n";
    for (const auto& cell : block.table.header) text += cell + "\t";
    for (const auto& row : block.table.rows) {
      for (const auto& cell : row) text += cell + "\t";
      text += "\n";
    }
    for (const auto& caption : block.captions) text += caption + "\n";
  }
  return text;
}

bool contains(const std::string& text, const std::string& part) {
  return text.find(part) != std::string::npos;
}

TEST(AuditReport, StartsWithTheCautionAndRepeatsItInTheDocument) {
  const AuditDocument doc = buildAuditDocument(minimalInput());
  ASSERT_FALSE(doc.blocks.empty());
  EXPECT_EQ(doc.blocks.front().kind, ReportBlock::Kind::Caution);
  EXPECT_EQ(doc.blocks.front().text, auditCautionText());
  EXPECT_EQ(doc.caution, auditCautionText());
  EXPECT_TRUE(contains(auditCautionText(), "do not replace clinical judgment"));
  EXPECT_TRUE(contains(auditCautionText(), "local clinical governance"));
}

TEST(AuditReport, IdentifiesFilesByNameAndFingerprintWithoutFolders) {
  const AuditDocument doc = buildAuditDocument(minimalInput());
  const std::string text = allText(doc);
  EXPECT_TRUE(contains(text, "cohort.csv"));
  EXPECT_FALSE(contains(text, "/home/someone"));  // folders can name people or wards
  EXPECT_TRUE(contains(text, std::string(64, '1')));
  EXPECT_TRUE(contains(text, std::string(64, '2')));
  ASSERT_EQ(doc.footer.size(), 2u);
  EXPECT_TRUE(contains(doc.footer[0], std::string(64, '1')));
  EXPECT_TRUE(contains(doc.footer[1], std::string(64, '2')));
  EXPECT_TRUE(contains(text, "missing value in 'creatinine'\t25"));
  EXPECT_TRUE(contains(text, "Rows read\t250"));
  EXPECT_TRUE(contains(text, "0.813 (0.751 to 0.861)"));
}

TEST(AuditReport, TabulatesExactlyTheSelectedThresholds) {
  AuditReportInput input = minimalInput();
  const std::string text = allText(buildAuditDocument(input));
  EXPECT_TRUE(contains(text, "Thresholds tabulated\t0.20"));
  input.settings.tableThresholds = {0.25};
  EXPECT_THROW(buildAuditDocument(input), InputError);
  input.settings.tableThresholds.clear();  // nothing selected: the few computed rows
  EXPECT_TRUE(
      contains(allText(buildAuditDocument(input)), "Thresholds tabulated\t0.10, 0.20, 0.30"));
}

TEST(AuditReport, ChecklistMarksWhatTheUserMustAdd) {
  const std::string text = allText(buildAuditDocument(minimalInput()));
  EXPECT_TRUE(contains(text, "TRIPOD+AI"));
  EXPECT_TRUE(contains(text, "[to add]\tEligibility criteria"));
  EXPECT_TRUE(contains(text, "[to add]\tKey study dates"));
  EXPECT_TRUE(contains(text, "[to add]\tSetting and location"));
  EXPECT_TRUE(contains(text, "[stated here]\tMissing data"));
}

TEST(AuditReport, MethodsNameTheirSources) {
  const std::string text = allText(buildAuditDocument(minimalInput()));
  for (const char* source : {"DeLong, DeLong & Clarke-Pearson, Biometrics 1988", "Van Calster",
                             "Spiegelhalter, Stat Med 1986", "Austin & Steyerberg, Stat Med 2019",
                             "Hosmer & Lemeshow", "Vickers & Elkin", "Wilson, JASA 1927"}) {
    EXPECT_TRUE(contains(text, source)) << source;
  }
}

TEST(AuditReport, SaysWhetherSuppressionWasApplied) {
  AuditReportInput input = minimalInput();
  EXPECT_TRUE(contains(allText(buildAuditDocument(input)), "Small-cell suppression was off"));
  input.settings.suppressBelow = 10;
  AuditDocument doc = buildAuditDocument(input);
  EXPECT_FALSE(doc.suppressionApplied);
  EXPECT_TRUE(contains(allText(doc), "No count in this report needed to be hidden"));
  input.exclusions.byColumn[1].rowsMissing = 4;
  doc = buildAuditDocument(input);
  EXPECT_TRUE(doc.suppressionApplied);
  EXPECT_TRUE(contains(allText(doc), "missing value in 'creatinine'\t<10"));
  EXPECT_TRUE(contains(allText(doc), "Small-cell suppression was applied"));
}

TEST(AuditReport, HidesPrevalenceWhenEventsAreHidden) {
  AuditReportInput input = minimalInput();
  input.result.cohort.events = 3;
  input.result.cohort.prevalence = 0.015;
  input.settings.suppressBelow = 5;
  input.settings.tableThresholds.clear();
  input.result.thresholds.clear();
  const std::string text = allText(buildAuditDocument(input));
  EXPECT_TRUE(contains(text, "Events\t<5"));
  EXPECT_TRUE(contains(text, "Non-events\ts"));
  EXPECT_TRUE(contains(text, "Prevalence\ts"));
  EXPECT_FALSE(contains(text, "1.5%"));
  EXPECT_FALSE(contains(text, "3 events"));
}

TEST(AuditFormat, FixedDecimalsIntervalsAndThresholds) {
  EXPECT_EQ(formatFixed(-0.0001, 3), "0.000");
  EXPECT_EQ(formatFixed(0.81249, 3), "0.812");
  EXPECT_EQ(formatFixed(std::nan(""), 3), "not defined");
  EXPECT_EQ(formatWithCi(1.5, {1.25, 1.75}, 2), "1.50 (1.25 to 1.75)");
  EXPECT_EQ(formatThreshold(0.1), "0.10");
  EXPECT_EQ(formatThreshold(0.075), "0.075");
  EXPECT_EQ(formatPercent(0.4025, 1), "40.2%");
}

TEST(AuditReport, TimestampsFollowSourceDateEpoch) {
  EXPECT_EQ(formatUtcTimestamp(0), "1970-01-01 00:00:00 UTC");
  EXPECT_EQ(formatUtcTimestamp(1764547200), "2025-12-01 00:00:00 UTC");
  const char* previous = std::getenv("SOURCE_DATE_EPOCH");
  const std::string saved = previous ? previous : "";
  setenv("SOURCE_DATE_EPOCH", "1764547200", 1);
  EXPECT_EQ(reportTimestamp(), 1764547200);
  setenv("SOURCE_DATE_EPOCH", "yesterday", 1);
  EXPECT_THROW(reportTimestamp(), InputError);
  setenv("SOURCE_DATE_EPOCH", "-5", 1);
  EXPECT_THROW(reportTimestamp(), InputError);
  if (previous) {
    setenv("SOURCE_DATE_EPOCH", saved.c_str(), 1);
  } else {
    unsetenv("SOURCE_DATE_EPOCH");
  }
}

}  // namespace
// Every chart caption states the threshold its marker shows (issue 12): the first tabulated
// threshold whose counts are shown.
TEST(AuditReport, ChartCaptionsStateTheMarkedThreshold) {
  const AuditDocument doc = buildAuditDocument(minimalInput());
  int charts = 0;
  for (const ReportBlock& block : doc.blocks) {
    if (block.kind != ReportBlock::Kind::ChartPair) continue;
    ++charts;
    ASSERT_EQ(block.captions.size(), 1u);
    EXPECT_TRUE(contains(block.captions[0], "marks threshold 0.200")) << block.captions[0];
  }
  EXPECT_EQ(charts, 4);
}

// The first page (issue 12): the result in brief, in the measure catalog's words, with the
// performance basis and the main warnings, then sign-off lines that are the settings' names or
// blank lines to sign, and the study file's fingerprint when the run came from a study.
TEST(AuditReport, FirstPageSummarisesAndLeavesLinesToSign) {
  AuditReportInput input = minimalInput();
  const AuditDocument blank = buildAuditDocument(input);
  const std::string text = allText(blank);
  EXPECT_LT(text.find("The result in brief"), text.find("1  What was validated"));
  EXPECT_TRUE(contains(text, "Discrimination\tAUC (c-statistic) 0.813 (95% CI 0.751 to 0.861)"));
  EXPECT_TRUE(contains(text, "new data (external validation)"));
  EXPECT_TRUE(contains(text, "At threshold 0.200: net benefit"));
  EXPECT_TRUE(contains(text, "Analyst\t______________________________"));
  EXPECT_TRUE(contains(text, "Clinical governance\t______________________________"));
  EXPECT_FALSE(contains(text, "Study file"));

  input.signOff = {"A. Analyst", "R. <Reviewer>"};
  input.studyFile = FileFingerprint{"/home/someone/ward.cvstudy", std::string(64, 'c')};
  input.settings.apparent = true;
  const std::string filled = allText(buildAuditDocument(input));
  EXPECT_TRUE(contains(filled, "Analyst\tA. Analyst\t"));
  EXPECT_TRUE(contains(filled, "Reviewer\tR. <Reviewer>\t"));  // escaped by the PDF writer
  EXPECT_TRUE(contains(filled, "Study file\tward.cvstudy, SHA-256 " + std::string(64, 'c')));
  EXPECT_FALSE(contains(filled, "/home/someone"));
  EXPECT_TRUE(contains(filled, "apparent performance (the cohort is the development data)"));
}

// The report says it is not tagged for accessibility (Qt's PDF writer cannot tag), not silent.
TEST(AuditReport, SaysItIsNotTagged) {
  EXPECT_TRUE(contains(allText(buildAuditDocument(minimalInput())),
                       "Accessibility: this PDF is not tagged"));
}

}  // namespace calivera
