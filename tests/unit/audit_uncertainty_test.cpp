// The audit report's uncertainty sections (core/report/audit_uncertainty.h) on a real run:
// birthwt (MASS::birthwt, Debian r-cran-mass) validated with a model fitted by core's
// fitCohortModel, compared with a second fitted model, subgroups by smoke and race, and a seeded
// bootstrap, all from core's runUncertainty. Every number the document prints is checked against
// the UncertaintyResults it came from, formatted as the report formats it; with suppression,
// small subgroup counts and the metrics of their levels must be hidden. The CSV tables
// (core/report/uncertainty_tables.h) must hold the same results, read back from their text.
#include <gtest/gtest.h>

#include <algorithm>
#include <filesystem>
#include <map>
#include <set>

#include "core/present/measures.h"
#include "core/present/wording.h"
#include "core/report/audit_format.h"
#include "core/report/audit_run.h"
#include "core/report/audit_suppression.h"
#include "core/report/uncertainty_tables.h"
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
    EXPECT_EQ(rules.rows[i][2], sizeCriterionText(a.rules[i].met));
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
                                    formatFixed(*c.achievedCiWidth, 3), sizeCriterionText(c.met)}));
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
  // Each with its decimals from the catalog of measures (core/present/measures.h): the distances
  // and the Brier score have 4, so 0.0301 does not print as 0.030.
  EXPECT_EQ(measureByKey("ici").decimals, 4);
  EXPECT_EQ(cell("ICI / E50 / E90 / Emax"),
            "ICI " + formatInterval(b.ici.ci, 4) + "\nE90 " + formatInterval(b.e90.ci, 4));
  EXPECT_EQ(cell("Brier score (scaled)"),
            formatInterval(b.brier.ci, 4) + "\n(" + formatInterval(b.brierScaled.ci, 3) + ")");
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
              stacked(cal.oeRatio, cal.oeCi, 2), "too few patients"}));
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
  EXPECT_EQ((*item)[0], "[stated here]");
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

TEST(AuditUncertainty, ComparisonOnFewerPatientsSaysHowManyFewerUnlessThatIsHidden) {
  // The comparison's row count as core reports it when a compared model needs a column that some
  // rows lack (birthwt has none missing, so the count is set here: the wording is under test).
  const Fixture& f = fixture();
  UncertaintyResults fewer = f.uncertainty;
  fewer.comparisonRows = 180;
  AuditReportInput input = auditInputFromRun(f.run, "Fewer", 0, fewer);
  EXPECT_NE(allText(buildAuditDocument(input))
                .find("The comparison rests on 180 patients complete in every column a compared "
                      "model uses, 9 fewer than the validation"),
            std::string::npos);
  input.settings.suppressBelow = 11;  // 9 fewer is a small count, and 180 would reveal it
  const std::string hidden = allText(buildAuditDocument(input));
  EXPECT_NE(hidden.find("rests on fewer patients than the validation (how many is hidden"),
            std::string::npos);
  EXPECT_EQ(hidden.find("180"), std::string::npos);
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
  // Tables 1 and 2 are the first page's summary and sign-off (core/report/audit_overview.h).
  EXPECT_EQ(tableCaptioned(doc, "At the selected thresholds").caption.rfind("Table 8. ", 0), 0u);
}

// A CSV table as rows of fields (quotes as RFC 4180 writes them), header first.
std::vector<std::vector<std::string>> parseCsv(const std::string& text) {
  std::vector<std::vector<std::string>> rows(1);
  std::string field;
  bool quoted = false;
  for (std::size_t i = 0; i < text.size(); ++i) {
    const char c = text[i];
    if (quoted) {
      if (c == '"' && i + 1 < text.size() && text[i + 1] == '"') {
        field += '"';
        ++i;
      } else if (c == '"') {
        quoted = false;
      } else {
        field += c;
      }
    } else if (c == '"') {
      quoted = true;
    } else if (c == ',') {
      rows.back().push_back(field);
      field.clear();
    } else if (c == '\n') {
      rows.back().push_back(field);
      field.clear();
      rows.emplace_back();
    } else {
      field += c;
    }
  }
  rows.pop_back();  // after the last line break
  return rows;
}

// One table keyed by header: rows[i]["name"].
std::vector<std::map<std::string, std::string>> csvTable(const std::string& name) {
  for (const auto& [file, text] : uncertaintyTables(fixture().uncertainty)) {
    if (file != name) continue;
    const auto rows = parseCsv(text);
    std::vector<std::map<std::string, std::string>> out;
    for (std::size_t r = 1; r < rows.size(); ++r) {
      EXPECT_EQ(rows[r].size(), rows[0].size()) << name << " row " << r;
      std::map<std::string, std::string>& row = out.emplace_back();
      for (std::size_t k = 0; k < rows[0].size() && k < rows[r].size(); ++k) {
        row[rows[0][k]] = rows[r][k];
      }
    }
    return out;
  }
  ADD_FAILURE() << "no table " << name;
  return {};
}

// The CSV writes 10 significant digits; an undefined value is an empty field.
void expectValue(const std::string& field, double value, const std::string& what) {
  if (!std::isfinite(value)) {
    EXPECT_EQ(field, "") << what;
    return;
  }
  ASSERT_FALSE(field.empty()) << what;
  EXPECT_NEAR(std::stod(field), value, 1e-9 * std::max(1.0, std::abs(value))) << what;
}

TEST(UncertaintyTables, EveryComputedPartHasItsTable) {
  std::vector<std::string> names;
  for (const auto& table : uncertaintyTables(fixture().uncertainty)) names.push_back(table.first);
  EXPECT_EQ(names, (std::vector<std::string>{"sample_size.csv", "bootstrap_intervals.csv",
                                             "calibration_band.csv", "net_benefit_band.csv",
                                             "compared_models.csv", "model_comparison_auc.csv",
                                             "model_comparison_net_benefit.csv", "subgroups.csv"}));
  UncertaintyResults sizeOnly;
  sizeOnly.sampleSize = fixture().uncertainty.sampleSize;
  ASSERT_EQ(uncertaintyTables(sizeOnly).size(), 1u);
}

TEST(UncertaintyTables, BootstrapAndBandTablesHoldTheBootstrapResults) {
  const ValidationBootstrap& b = *fixture().uncertainty.bootstrap;
  const auto rows = csvTable("bootstrap_intervals.csv");
  ASSERT_EQ(rows.size(), 8u);
  std::size_t checked = 0;
  const auto check = [&](const std::string& name, const BootstrapEstimate& e) {
    const auto row = std::find_if(rows.begin(), rows.end(),
                                  [&](const auto& r) { return r.at("statistic") == name; });
    ASSERT_NE(row, rows.end()) << name;
    expectValue(row->at("estimate"), e.estimate, name);
    expectValue(row->at("ci_lo"), e.ci.lo, name);
    expectValue(row->at("ci_hi"), e.ci.hi, name);
    EXPECT_EQ(row->at("replicates_used"), std::to_string(e.replicatesUsed));
    EXPECT_EQ(row->at("replicates"), "40");
    EXPECT_EQ(row->at("seed"), "5");
    EXPECT_EQ(row->at("failed"), std::to_string(b.run.failed));
    ++checked;
  };
  check("auc", b.auc);
  check("brier", b.brier);
  check("brier_scaled", b.brierScaled);
  check("calibration_intercept", b.calibrationIntercept);
  check("calibration_slope", b.calibrationSlope);
  check("oe_ratio", b.oeRatio);
  check("ici", b.ici);
  check("e90", b.e90);
  EXPECT_EQ(checked, 8u);
  for (const auto& [file, band, x] :
       {std::tuple{"net_benefit_band.csv", &b.netBenefit, "threshold"},
        std::tuple{"calibration_band.csv", &b.calibrationCurve, "risk"}}) {
    const auto table = csvTable(file);
    ASSERT_EQ(table.size(), band->size()) << file;
    for (std::size_t i = 0; i < table.size(); ++i) {
      auto row = table[i];
      expectValue(row[x], (*band)[i].x, file);
      expectValue(row["estimate"], (*band)[i].estimate, file);
      expectValue(row["ci_lo"], (*band)[i].ci.lo, file);
      expectValue(row["ci_hi"], (*band)[i].ci.hi, file);
      EXPECT_EQ(row["replicates_used"], std::to_string((*band)[i].replicatesUsed));
    }
  }
}

TEST(UncertaintyTables, ComparisonTablesHoldTheComparison) {
  const UncertaintyResults& u = fixture().uncertainty;
  const ModelComparison& c = *u.comparison;
  auto models = csvTable("compared_models.csv");
  ASSERT_EQ(models.size(), 2u);
  EXPECT_EQ(models[1]["file"], "small.json");
  EXPECT_EQ(models[1]["sha256"], u.comparedModels[0].sha256);
  for (std::size_t m = 0; m < 2; ++m) {
    expectValue(models[m]["auc"], c.aucs[m], "auc");
    expectValue(models[m]["auc_ci_lo"], u.comparedResults[m].discrimination.aucCi.lo, "lo");
    EXPECT_EQ(models[m]["comparison_rows"], "189");
  }
  auto auc = csvTable("model_comparison_auc.csv");
  ASSERT_EQ(auc.size(), 1u);
  const PairedAucTest& t = c.pairs[0].auc;
  EXPECT_EQ(auc[0]["first"], "full model");
  EXPECT_EQ(auc[0]["second"], "weight and smoking");
  expectValue(auc[0]["auc_difference"], t.difference, "difference");
  expectValue(auc[0]["se"], t.se, "se");
  expectValue(auc[0]["ci_lo"], t.differenceCi.lo, "ci_lo");
  expectValue(auc[0]["ci_hi"], t.differenceCi.hi, "ci_hi");
  expectValue(auc[0]["z"], t.z, "z");
  expectValue(auc[0]["p_value"], t.pValue, "p");
  expectValue(auc[0]["correlation"], t.correlation, "correlation");
  const auto nb = csvTable("model_comparison_net_benefit.csv");
  const auto& points = c.pairs[0].netBenefit;
  ASSERT_EQ(nb.size(), points.size());
  for (std::size_t i = 0; i < nb.size(); ++i) {
    auto row = nb[i];
    expectValue(row["threshold"], points[i].threshold, "threshold");
    expectValue(row["net_benefit_first"], points[i].netBenefitFirst, "first");
    expectValue(row["net_benefit_second"], points[i].netBenefitSecond, "second");
    expectValue(row["difference"], points[i].difference, "difference");
    expectValue(row["ci_lo"], points[i].ci.lo, "lo");
    expectValue(row["ci_hi"], points[i].ci.hi, "hi");
  }
}

TEST(UncertaintyTables, SubgroupAndSampleSizeTablesHoldTheirResults) {
  const UncertaintyResults& u = fixture().uncertainty;
  const auto subgroups = csvTable("subgroups.csv");
  std::size_t r = 0;
  for (const SubgroupAnalysis& analysis : u.subgroups) {
    for (const SubgroupResult& level : analysis.levels) {
      ASSERT_LT(r, subgroups.size());
      auto row = subgroups[r++];
      EXPECT_EQ(row["column"], analysis.column);
      EXPECT_EQ(row["level"], level.level);
      EXPECT_EQ(row["n"], std::to_string(level.n));
      EXPECT_EQ(row["events"], std::to_string(level.events));
      EXPECT_EQ(row["too_small"], level.tooSmall ? "yes" : "no");
      const ValidationResult& m = *level.metrics;
      expectValue(row["auc"], m.discrimination.auc, level.level);
      expectValue(row["calibration_slope"], m.calibration.slope, level.level);
      expectValue(row["slope_ci_hi"], m.calibration.slopeCi.hi, level.level);
      expectValue(row["oe_ratio"], m.calibration.oeRatio, level.level);
      expectValue(row["auc_bootstrap_lo"], level.bootstrap->auc.ci.lo, level.level);
      EXPECT_NE(row["warnings"].find("fewer than 100 events or non-events"), std::string::npos);
    }
  }
  EXPECT_EQ(r, subgroups.size());
  const SampleSizeAssessment& a = u.sampleSize;
  const auto size = csvTable("sample_size.csv");
  ASSERT_EQ(size.size(), a.rules.size() + a.criteria.size() + 1);
  for (std::size_t i = 0; i < a.criteria.size(); ++i) {
    auto row = size[a.rules.size() + i];
    EXPECT_EQ(row["kind"], "criterion");
    EXPECT_EQ(row["name"], a.criteria[i].criterion);
    expectValue(row["required_n"], a.criteria[i].requiredN, a.criteria[i].criterion);
    expectValue(row["achieved_ci_width"], *a.criteria[i].achievedCiWidth, a.criteria[i].criterion);
  }
  auto verdict = size.back();
  EXPECT_EQ(verdict["kind"], "verdict");
  EXPECT_EQ(verdict["name"], a.verdict);
  EXPECT_EQ(verdict["met"], "no");
}

TEST(UncertaintyTables, AFailedWriteLeavesNoTable) {
  const testing::TempDir dir("uncertainty_tables");
  const std::filesystem::path folder = std::filesystem::path(dir.file("tables"));
  // A folder where the last table goes makes that write fail after the others succeeded.
  std::filesystem::create_directories(folder / "subgroups.csv");
  EXPECT_ANY_THROW(writeValidationTables(folder.string(), fixture().run, fixture().uncertainty));
  std::vector<std::string> left;
  for (const auto& entry : std::filesystem::directory_iterator(folder)) {
    left.push_back(entry.path().filename().string());
  }
  EXPECT_EQ(left, std::vector<std::string>{"subgroups.csv"});
  std::filesystem::remove(folder / "subgroups.csv");
  writeValidationTables(folder.string(), fixture().run, fixture().uncertainty);
  EXPECT_TRUE(std::filesystem::exists(folder / "subgroups.csv"));
  EXPECT_TRUE(std::filesystem::exists(folder / "thresholds.csv"));
}

}  // namespace
}  // namespace calivera
