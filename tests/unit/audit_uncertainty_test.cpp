// The audit report's uncertainty sections (core/report/audit_uncertainty.h) on a real run:
// birthwt (MASS::birthwt, Debian r-cran-mass) validated with a model fitted by core's
// fitCohortModel, compared with a second fitted model, subgroups by smoke and race, and a seeded
// bootstrap, all from core's runUncertainty. Every number the document prints is checked against
// the UncertaintyResults it came from, formatted as the report formats it; with suppression,
// small subgroup counts and the metrics of their levels must be hidden.
#include <gtest/gtest.h>

#include <algorithm>
#include <set>

#include "core/report/audit_format.h"
#include "core/report/audit_run.h"
#include "core/report/audit_suppression.h"
#include "tests/unit/birthwt_run.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

struct Fixture {
  ValidationRun run;
  UncertaintyResults uncertainty;
  std::string folder;  // where the model files were: must never appear in the report
};

const Fixture& fixture() {
  static const Fixture f = [] {
    const testing::TempDir dir("audit_uncertainty");
    const std::string full = dir.file("full.json"), small = dir.file("small.json");
    testing::writeBirthwtModel(full, {"age", "lwt", "race", "smoke", "ht", "ui"}, "full model");
    testing::writeBirthwtModel(small, {"lwt", "smoke"}, "weight and smoking");
    Fixture out{testing::birthwtRun(full), {}, dir.file("")};
    UncertaintyRequest request;
    request.bootstrapReplicates = 40;
    request.seed = 5;
    request.threads = 2;
    request.compareModelPaths = {small};
    request.subgroupColumns = {"smoke", "race"};
    request.sampleSize.netBenefitThresholds = {0.2};
    out.uncertainty = runUncertainty(out.run, request);
    return out;
  }();
  return f;
}

AuditDocument document(std::size_t suppressBelow) {
  const Fixture& f = fixture();
  AuditReportInput input = auditInputFromRun(f.run, "Uncertainty", suppressBelow, f.uncertainty);
  input.createdAt = "2026-12-02 00:00:00 UTC";
  return buildAuditDocument(input);
}

const ReportTable& tableCaptioned(const AuditDocument& doc, const std::string& part) {
  for (const ReportBlock& block : doc.blocks) {
    if (block.kind == ReportBlock::Kind::Table &&
        block.table.caption.find(part) != std::string::npos) {
      return block.table;
    }
  }
  static const ReportTable none;
  ADD_FAILURE() << "no table captioned '" << part << "'";
  return none;
}

std::ptrdiff_t headingIndex(const AuditDocument& doc, const std::string& text) {
  for (std::size_t i = 0; i < doc.blocks.size(); ++i) {
    if (doc.blocks[i].kind == ReportBlock::Kind::Heading && doc.blocks[i].text == text) {
      return static_cast<std::ptrdiff_t>(i);
    }
  }
  return -1;
}

std::string allText(const AuditDocument& doc) {
  std::string text;
  for (const ReportBlock& block : doc.blocks) {
    text += block.text + "\n" + block.table.caption + "\n" + block.table.note + "\n";
    for (const auto& cell : block.table.header) text += cell + "\t";
    for (const auto& row : block.table.rows) {
      for (const auto& cell : row) text += cell + "\t";
    }
  }
  return text;
}

std::string stacked(double value, const Interval& ci, int decimals) {
  return formatFixed(value, decimals) + "\n(" + formatFixed(ci.lo, decimals) + "\u2013" +
         formatFixed(ci.hi, decimals) + ")";
}

TEST(AuditUncertainty, SampleSizeComesBeforeTheResultsWithRileyCriteria) {
  const AuditDocument doc = document(0);
  const std::ptrdiff_t sampleSize = headingIndex(doc, "Is the cohort large enough? (sample size)");
  ASSERT_GE(sampleSize, 0);
  EXPECT_LT(sampleSize, headingIndex(doc, "2  Results"));
  const SampleSizeAssessment& a = fixture().uncertainty.sampleSize;
  const ReportTable& rules = tableCaptioned(doc, "rules of thumb");
  ASSERT_EQ(rules.rows.size(), a.rules.size());
  for (std::size_t i = 0; i < a.rules.size(); ++i) {
    EXPECT_EQ(rules.rows[i][0], a.rules[i].rule);
    EXPECT_EQ(rules.rows[i][1], "59 events, 130 non-events");  // birthwt: 59 low birth weights
    EXPECT_EQ(rules.rows[i][2], a.rules[i].met ? "yes" : "no");
  }
  const ReportTable& criteria = tableCaptioned(doc, "precision-based minimum");
  ASSERT_EQ(criteria.rows.size(), a.criteria.size());
  ASSERT_EQ(a.criteria.size(), 4u);  // O/E, slope, C, net benefit at 0.2
  for (std::size_t i = 0; i < a.criteria.size(); ++i) {
    const SampleSizeCriterion& c = a.criteria[i];
    ASSERT_TRUE(c.achievedCiWidth.has_value()) << c.criterion;  // bootstrap gives the NB width
    EXPECT_EQ(criteria.rows[i], (std::vector<std::string>{
                                    c.criterion, formatFixed(c.targetCiWidth, 2),
                                    formatFixed(c.requiredN, 0), formatFixed(c.requiredEvents, 0),
                                    formatFixed(*c.achievedCiWidth, 3), c.met ? "yes" : "no"}));
  }
  EXPECT_FALSE(a.adequate);
  EXPECT_NE(allText(doc).find("Verdict: the cohort (n = 189, 59 events) is smaller than needed"),
            std::string::npos);
}

TEST(AuditUncertainty, SummaryShowsTheBootstrapIntervalsBesideTheAnalyticOnes) {
  const AuditDocument doc = document(0);
  const ValidationBootstrap& b = *fixture().uncertainty.bootstrap;
  const ReportTable& summary = tableCaptioned(doc, "Performance summary");
  ASSERT_EQ(summary.header.size(), 4u);
  EXPECT_EQ(summary.header[2], "Bootstrap 95% CI");
  const auto cell = [&](const std::string& measure) {
    for (const auto& row : summary.rows) {
      if (row[0] == measure) return row[2];
    }
    return std::string("(missing)");
  };
  EXPECT_EQ(cell("AUC (c-statistic)"), formatInterval(b.auc.ci, 3));
  EXPECT_EQ(cell("Calibration intercept"), formatInterval(b.calibrationIntercept.ci, 3));
  EXPECT_EQ(cell("Calibration slope"), formatInterval(b.calibrationSlope.ci, 3));
  EXPECT_EQ(cell("Observed / expected"), formatInterval(b.oeRatio.ci, 3));
  EXPECT_EQ(cell("ICI / E50 / E90 / Emax"),
            "ICI " + formatInterval(b.ici.ci, 3) + "\nE90 " + formatInterval(b.e90.ci, 3));
  EXPECT_EQ(cell("Brier score (scaled)"),
            formatInterval(b.brier.ci, 3) + "\n(" + formatInterval(b.brierScaled.ci, 3) + ")");
  EXPECT_NE(summary.note.find("40 resamples of the patients (seed 5)"), std::string::npos);
  EXPECT_NE(summary.note.find(b.run.failed == 0 ? "no replicate failed" : "failed"),
            std::string::npos);
}

TEST(AuditUncertainty, ComparisonTablesCarryTheComparisonsNumbers) {
  const AuditDocument doc = document(0);
  const UncertaintyResults& u = fixture().uncertainty;
  const ModelComparison& c = *u.comparison;
  const ReportTable& models = tableCaptioned(doc, "Models compared");
  ASSERT_EQ(models.rows.size(), 2u);
  for (std::size_t m = 0; m < 2; ++m) {
    EXPECT_EQ(models.rows[m][2],
              formatWithCi(c.aucs[m], u.comparedResults[m].discrimination.aucCi, 3));
  }
  EXPECT_EQ(models.rows[1][0], "weight and smoking");
  EXPECT_EQ(models.rows[1][1], "small.json\n" + u.comparedModels[0].sha256);
  EXPECT_EQ(allText(doc).find(fixture().folder), std::string::npos);  // file names only

  const ReportTable& delong = tableCaptioned(doc, "Paired DeLong test");
  ASSERT_EQ(delong.rows.size(), 1u);
  const PairedAucTest& t = c.pairs[0].auc;
  EXPECT_EQ(delong.rows[0],
            (std::vector<std::string>{
                "full model vs weight and smoking", formatWithCi(t.difference, t.differenceCi, 3),
                formatFixed(t.z, 2), formatFixed(t.pValue, 3), formatFixed(t.correlation, 3)}));

  // No reasonable range and a 99-threshold grid: the customary tabulated thresholds.
  const ReportTable& nb = tableCaptioned(doc, "Net-benefit difference");
  std::vector<std::vector<std::string>> expected;
  for (const NetBenefitDifferencePoint& p : c.pairs[0].netBenefit) {
    for (const double t : {0.05, 0.1, 0.2, 0.3, 0.5}) {
      if (std::abs(p.threshold - t) > 1e-9) continue;
      expected.push_back({formatThreshold(t), formatFixed(p.netBenefitFirst, 4),
                          formatFixed(p.netBenefitSecond, 4), formatWithCi(p.difference, p.ci, 4)});
    }
  }
  EXPECT_EQ(nb.rows, expected);
  EXPECT_EQ(expected.size(), 5u);
}

TEST(AuditUncertainty, SubgroupTablesShowEveryLevel) {
  const AuditDocument doc = document(0);
  const UncertaintyResults& u = fixture().uncertainty;
  ASSERT_EQ(u.subgroups.size(), 2u);
  for (const SubgroupAnalysis& analysis : u.subgroups) {
    const ReportTable& table = tableCaptioned(doc, "Subgroups by '" + analysis.column + "'");
    ASSERT_EQ(table.rows.size(), analysis.levels.size());
    for (std::size_t l = 0; l < analysis.levels.size(); ++l) {
      const SubgroupResult& level = analysis.levels[l];
      ASSERT_TRUE(level.metrics);
      const Calibration& cal = level.metrics->calibration;
      EXPECT_EQ(
          table.rows[l],
          (std::vector<std::string>{
              level.level, std::to_string(level.n), std::to_string(level.events),
              stacked(level.metrics->discrimination.auc, level.metrics->discrimination.aucCi, 3),
              stacked(cal.intercept, cal.interceptCi, 2), stacked(cal.slope, cal.slopeCi, 2),
              stacked(cal.oeRatio, cal.oeCi, 2), "too small to judge"}));
    }
  }
  const std::string text = allText(doc);
  for (const char* source : {"Efron, Ann Stat 1979", "Efron & Tibshirani", "DeLong, DeLong",
                             "Riley et al., Stat Med 2021", "TRIPOD+AI), BMJ 2024"}) {
    EXPECT_NE(text.find(source), std::string::npos) << source;
  }
  const ReportTable& checklist = tableCaptioned(doc, "Checklist");
  const auto item = std::find_if(checklist.rows.begin(), checklist.rows.end(), [](const auto& r) {
    return r[1].find("Subgroup") != std::string::npos;
  });
  ASSERT_NE(item, checklist.rows.end());
  EXPECT_EQ((*item)[0], "[covered]");
}

TEST(AuditUncertainty, TablesAreNumberedInReadingOrder) {
  const AuditDocument doc = document(0);
  int expected = 0;
  for (const ReportBlock& block : doc.blocks) {
    if (block.kind != ReportBlock::Kind::Table) continue;
    const std::string prefix = "Table " + std::to_string(++expected) + ". ";
    EXPECT_EQ(block.table.caption.rfind(prefix, 0), 0u) << block.table.caption;
  }
  EXPECT_GT(expected, 12);
}

TEST(AuditUncertainty, SuppressionHidesSmallSubgroupCountsAndWithholdsTheirMetrics) {
  // birthwt race=black: 26 patients, 11 events; with counts below 12 hidden its events are a
  // primary suppression, and complements follow within the level and across the levels.
  const AuditDocument doc = document(12);
  const ReportTable& race = tableCaptioned(doc, "Subgroups by 'race'");
  ASSERT_EQ(race.rows.size(), 3u);
  EXPECT_EQ(race.rows[0][0], "black");
  EXPECT_EQ(race.rows[0][2], "<12");
  EXPECT_EQ(race.rows[0][3], "withheld");
  EXPECT_EQ(race.rows[0][7], "withheld: small counts");
  const std::set<std::string> hiddenMarks{"<12", kComplementaryMark};
  int hiddenLevels = 0;
  for (const auto& row : race.rows) {
    const bool withheld = row[3] == "withheld";
    hiddenLevels += withheld ? 1 : 0;
    // A level with a hidden count shows no measure; counts from 1 to 11 are never printed.
    EXPECT_EQ(withheld, hiddenMarks.count(row[1]) + hiddenMarks.count(row[2]) > 0 ||
                            row[7] == "withheld: small counts");
    for (const std::size_t k : {1u, 2u}) {
      if (hiddenMarks.count(row[k])) continue;
      const long value = std::stol(row[k]);
      EXPECT_TRUE(value == 0 || value >= 12) << row[0] << ": " << row[k];
    }
  }
  EXPECT_GE(hiddenLevels, 2);  // one hidden events cell in a column needs a complement
  // No level's warning text shows its hidden counts ("(11 / 15)").
  EXPECT_EQ(race.note.find("black"), std::string::npos);
  EXPECT_NE(allText(doc).find("its measures are withheld"), std::string::npos);

  // The charts' overlays and bands leave out what the suppressed chart data leave out.
  const UncertaintyResults& u = fixture().uncertainty;
  ASSERT_EQ(doc.comparisons.size(), 1u);
  for (const DecisionCurvePoint& p : doc.comparisons[0].chartData.decisionCurve) {
    for (const ThresholdRow& row : u.comparedResults[1].thresholds) {
      if (std::abs(row.threshold - p.threshold) > 1e-12) continue;
      for (const std::size_t count : {row.tp, row.fp, row.fn, row.tn}) {
        EXPECT_TRUE(count == 0 || count >= 12) << p.threshold;
      }
    }
  }
  EXPECT_LT(doc.comparisons[0].chartData.decisionCurve.size(),
            u.comparedResults[1].decisionCurve.size());
  for (const BandPoint& p : doc.netBenefitBand) {
    EXPECT_TRUE(std::any_of(doc.chartData.decisionCurve.begin(), doc.chartData.decisionCurve.end(),
                            [&](const DecisionCurvePoint& d) { return d.threshold == p.x; }));
  }
  EXPECT_LT(doc.netBenefitBand.size(), u.bootstrap->netBenefit.size());
}

TEST(AuditUncertainty, WithoutUncertaintyTheReportHasNoneOfItsSections) {
  const Fixture& f = fixture();
  AuditReportInput input = auditInputFromRun(f.run, "Plain", 0);
  const AuditDocument doc = buildAuditDocument(input);
  EXPECT_EQ(headingIndex(doc, "Is the cohort large enough? (sample size)"), -1);
  EXPECT_EQ(headingIndex(doc, "Subgroups"), -1);
  EXPECT_TRUE(doc.comparisons.empty());
  EXPECT_TRUE(doc.netBenefitBand.empty());
  EXPECT_EQ(tableCaptioned(doc, "Performance summary").header.size(), 3u);
  EXPECT_EQ(tableCaptioned(doc, "At the selected thresholds").caption.rfind("Table 6. ", 0), 0u);
}

}  // namespace
}  // namespace calivera
