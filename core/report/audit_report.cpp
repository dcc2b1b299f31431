#include "core/report/audit_report.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <cstdlib>
#include <ctime>
#include <string_view>

#include "core/data/cohort_file.h"
#include "core/metrics/size_warnings.h"
#include "core/present/caution.h"
#include "core/present/measures.h"
#include "core/present/number_text.h"
#include "core/present/wording.h"
#include "core/report/audit_blocks.h"
#include "core/report/audit_disclosure.h"
#include "core/report/audit_format.h"
#include "core/report/audit_methods.h"
#include "core/report/audit_missing.h"
#include "core/report/audit_overview.h"
#include "core/report/audit_sites.h"
#include "core/report/audit_uncertainty.h"
#include "core/util/errors.h"
#include "core/util/shown_text.h"

namespace calivera {

const std::string& auditCautionText() {
  static const std::string text = kCautionText;
  return text;
}

std::string formatUtcTimestamp(long long secondsSinceEpoch) {
  const std::time_t time = static_cast<std::time_t>(secondsSinceEpoch);
  std::tm utc{};
  gmtime_r(&time, &utc);
  char buffer[40];
  std::strftime(buffer, sizeof buffer, "%Y-%m-%d %H:%M:%S UTC", &utc);
  return buffer;
}

long long reportTimestamp() {
  const char* epoch = std::getenv("SOURCE_DATE_EPOCH");
  if (epoch == nullptr || *epoch == '\0') return static_cast<long long>(std::time(nullptr));
  const std::string_view text(epoch);
  long long value = 0;
  const auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), value);
  if (error != std::errc() || end != text.data() + text.size() || value < 0) {
    throw InputError("environment variable SOURCE_DATE_EPOCH: '" + std::string(text) +
                     "' is not a non-negative integer number of seconds");
  }
  return value;
}

namespace {

using Kind = ReportBlock::Kind;

ReportTable keyValueTable(std::string caption) {
  ReportTable table;
  table.caption = std::move(caption);
  table.header = {"Item", "Value"};
  table.widths = {0.36, 0.64};
  table.align = {CellAlign::Left, CellAlign::Left};
  return table;
}

std::string orDash(const std::optional<std::string>& text) {
  return text ? *text : "not stated";
}

std::string orDash(const std::optional<long long>& value) {
  return value ? std::to_string(*value) : "not stated";
}

}  // namespace

namespace {

std::string thresholdList(const std::vector<double>& thresholds) {
  if (thresholds.empty()) return "none";
  std::string text;
  for (std::size_t i = 0; i < thresholds.size(); ++i) {
    text += (i ? ", " : "") + formatThreshold(thresholds[i]);
  }
  return text;
}

// The rows of result.thresholds the report tabulates, in the order the user selected them.
std::vector<ThresholdRow> selectTableRows(const AuditReportInput& input) {
  const auto& all = input.result.thresholds;
  std::vector<double> wanted = input.settings.tableThresholds;
  if (wanted.empty()) wanted = defaultTableThresholds(all);
  std::vector<ThresholdRow> rows;
  for (const double t : wanted) {
    const auto row = std::find_if(all.begin(), all.end(), [&](const ThresholdRow& r) {
      return std::abs(r.threshold - t) < 1e-9;
    });
    if (row == all.end()) {
      throw InputError("report threshold " + formatThreshold(t) +
                       " is not among the thresholds of the validation run");
    }
    rows.push_back(*row);
  }
  return rows;
}

// A query is shown whole up to this many characters (it is what was run).
constexpr std::size_t kReportQueryChars = 600;

void addIdentification(const AuditReportInput& input, const DisclosurePlan& plan,
                       const std::vector<ThresholdRow>& tableRows,
                       std::vector<ReportBlock>& blocks) {
  blocks.push_back(reportHeading("1  What was validated"));
  ReportTable cohort =
      keyValueTable(std::string(kTablePrefix) + (input.database ? "Cohort source" : "Cohort file"));
  if (input.database) {
    const DatabaseProvenance& db = *input.database;
    cohort.rows.push_back({"Source", "PostgreSQL " + reportName(db.serverVersion) + " database"});
    cohort.rows.push_back({"Server", reportName(db.server)});
    cohort.rows.push_back({"Database", reportName(db.database)});
    if (!db.selection.table.empty()) {
      cohort.rows.push_back({"Table", reportName(db.selection.table)});
    } else {
      cohort.rows.push_back({"Query", visibleName(db.selection.query, kReportQueryChars)});
    }
    cohort.rows.push_back({"Rows fetched", std::to_string(db.rows)});
    cohort.rows.push_back({"Result fingerprint", input.cohortFile.sha256});
    cohort.rows.push_back({"Fingerprint rule", kDatabaseFingerprintRule});
  } else {
    cohort.rows.push_back({"File name", fileNameOnly(input.cohortFile.name)});
    cohort.rows.push_back({"Format", cohortFileFormat(input.cohortFile.name)});
    cohort.rows.push_back({"SHA-256", input.cohortFile.sha256});
  }
  if (!input.analysedSha256.empty()) {
    cohort.rows.push_back({"Analysed-data fingerprint", input.analysedSha256});
  }
  cohort.rows.push_back({"Rows read", plan.rowsRead()});
  cohort.rows.push_back({"Rows excluded", plan.rowsExcluded()});
  for (std::size_t k = 0; k < input.exclusions.byColumn.size(); ++k) {
    cohort.rows.push_back({"  missing value in '" + input.exclusions.byColumn[k].column + "'",
                           plan.excludedByColumn(k)});
  }
  cohort.rows.push_back({"Rows analysed (n)", plan.rowsAnalysed()});
  cohort.rows.push_back({"Events", plan.events()});
  cohort.rows.push_back({"Non-events", plan.nonEvents()});
  cohort.rows.push_back({"Prevalence", plan.eventsHidden()
                                           ? std::string(kComplementaryMark)
                                           : formatPercent(input.result.cohort.prevalence, 1)});
  if (!input.exclusions.byColumn.empty()) {
    cohort.note =
        "A row missing a value in any column the model or the outcome uses is excluded "
        "(complete-case analysis); a row can be missing in several columns.";
  }
  blocks.push_back(reportTable(cohort));

  const Model& model = input.model;
  ReportTable modelTable =
      keyValueTable(std::string(kTablePrefix) + "Model file and development record");
  modelTable.rows.push_back({"File name", fileNameOnly(input.modelFile.name)});
  modelTable.rows.push_back({"SHA-256", input.modelFile.sha256});
  modelTable.rows.push_back(
      {"Model name", model.name.empty() ? "not stated" : reportName(model.name)});
  modelTable.rows.push_back(
      {"Outcome predicted", model.outcome.empty() ? "not stated" : model.outcome});
  std::string terms;
  for (const Term& term : model.terms) terms += (terms.empty() ? "" : ", ") + term.name;
  modelTable.rows.push_back(
      {"Terms (" + std::to_string(model.terms.size()) + ")", terms.empty() ? "none" : terms});
  const DevelopmentRecord& dev = model.development;
  modelTable.rows.push_back({"Development: patients", orDash(dev.n)});
  modelTable.rows.push_back({"Development: events", orDash(dev.events)});
  modelTable.rows.push_back({"Development data SHA-256", orDash(dev.dataSha256)});
  modelTable.rows.push_back({"Development analysed-data fingerprint", orDash(dev.analysedSha256)});
  modelTable.rows.push_back({"Development: software", orDash(dev.software)});
  modelTable.rows.push_back({"Development: method", orDash(dev.method)});
  modelTable.rows.push_back({"Development: description", orDash(dev.description)});
  if (model.provenance) modelTable.rows.push_back({"Updates (provenance)", *model.provenance});
  blocks.push_back(reportTable(modelTable));

  const AuditSettings& s = input.settings;
  ReportTable settings = keyValueTable(std::string(kTablePrefix) + "Settings of this validation");
  settings.rows.push_back(
      {"Outcome column", s.outcomeColumn.empty() ? "not stated" : s.outcomeColumn});
  settings.rows.push_back(
      {"Event value", s.eventValue ? *s.eventValue : "1 (outcome column holds 0 and 1)"});
  settings.rows.push_back(
      {"Type of validation", s.apparent ? "apparent (the cohort is the development data)"
                                        : "external (fixed model applied to this cohort)"});
  settings.rows.push_back({"Risk groups (Hosmer-Lemeshow)", std::to_string(s.groups)});
  std::vector<double> tabulated;
  for (const ThresholdRow& row : tableRows) tabulated.push_back(row.threshold);
  settings.rows.push_back({"Thresholds tabulated", thresholdList(tabulated)});
  settings.rows.push_back(
      {"Reasonable threshold range", s.reasonableThresholds
                                         ? formatThreshold(s.reasonableThresholds->lo) + " to " +
                                               formatThreshold(s.reasonableThresholds->hi)
                                         : "not set"});
  settings.rows.push_back({"Small-cell suppression",
                           s.suppressBelow >= 2
                               ? "counts from 1 to " + std::to_string(s.suppressBelow - 1) +
                                     " hidden (shown as <" + std::to_string(s.suppressBelow) + ")"
                               : "off"});
  for (const auto& [name, value] : s.other) settings.rows.push_back({name, value});
  blocks.push_back(reportTable(settings));
}

std::string aucReading(const Discrimination& d) {
  const long pairs = std::lround(d.auc * 100.0);
  return "In about " + std::to_string(pairs) +
         " of 100 pairs of one patient with and one without the event, the patient with the "
         "event had the higher predicted risk (0.5 is chance, 1 is perfect).";
}

std::string interceptReading(const Calibration& c) {
  if (c.interceptCi.lo <= 0.0 && c.interceptCi.hi >= 0.0) {
    return "Target 0. The interval includes 0: no clear overall over- or under-prediction.";
  }
  return c.intercept > 0.0
             ? "Target 0. Above 0: events were more frequent than predicted (under-prediction)."
             : "Target 0. Below 0: events were less frequent than predicted (over-prediction).";
}

std::string slopeReading(const Calibration& c) {
  if (c.slopeCi.lo <= 1.0 && c.slopeCi.hi >= 1.0) {
    return "Target 1. The interval includes 1: no clear sign that predicted risks are too "
           "extreme or too moderate.";
  }
  return c.slope < 1.0 ? "Target 1. Below 1: predicted risks are too extreme (high risks too "
                         "high, low risks too low)."
                       : "Target 1. Above 1: predicted risks are too moderate (spread too "
                         "little).";
}

// The bootstrap percentile CIs as a column beside the analytic ones: one cell per summary row,
// given with the row itself (never matched by its label), "-" where no interval is computed.
void addBootstrapColumn(const ValidationBootstrap& b, const std::vector<std::string>& cells,
                        ReportTable& table) {
  table.header.insert(table.header.begin() + 2, "Bootstrap 95% CI");
  table.widths = {0.21, 0.25, 0.18, 0.36};
  table.align.insert(table.align.begin() + 2, CellAlign::Left);
  for (std::size_t i = 0; i < table.rows.size(); ++i) {
    table.rows[i].insert(table.rows[i].begin() + 2, i < cells.size() ? cells[i] : "-");
  }
  table.note = bootstrapNote(b);
}

void addSummary(const AuditReportInput& input, const DisclosurePlan& plan,
                std::vector<ReportBlock>& blocks) {
  const ValidationResult& r = input.result;
  const Calibration& c = r.calibration;
  ReportTable table;
  table.caption = std::string(kTablePrefix) + "Performance summary (95% confidence intervals)";
  table.header = {"Measure", "Estimate (95% CI)", "Reading"};
  table.widths = {0.24, 0.28, 0.48};
  table.align = {CellAlign::Left, CellAlign::Left, CellAlign::Left};
  const ValidationBootstrap* boot =
      input.uncertainty && input.uncertainty->bootstrap ? &*input.uncertainty->bootstrap : nullptr;
  const std::string hidden = kComplementaryMark;
  // Labels, decimals and values from the one catalog of measures (core/present/measures.h).
  const auto m = [](const char* key) -> const Measure& { return measureByKey(key); };
  const auto text = [&](const char* key) { return measureText(m(key), r); };
  const auto withCi = [&](const char* key) {
    const Measure& measure = m(key);
    return formatWithCi(measure.estimate(r), measure.interval(r), measure.decimals);
  };
  const auto bootCi = [&](const char* key) {
    return boot ? bootstrapCiText(boot->*(m(key).bootstrap), m(key).decimals) : std::string();
  };
  std::vector<std::string> bootCells;
  const auto add = [&](std::vector<std::string> row, std::string bootCell) {
    table.rows.push_back(std::move(row));
    bootCells.push_back(bootCell.empty() ? "-" : std::move(bootCell));
  };
  add({m("auc").label, withCi("auc"), aucReading(r.discrimination)}, bootCi("auc"));
  add({m("discrimination_slope").label, text("discrimination_slope"),
       "Mean predicted risk of patients with the event minus that of patients without it."},
      {});
  add({m("calibration_intercept").label, withCi("calibration_intercept"), interceptReading(c)},
      bootCi("calibration_intercept"));
  add({m("calibration_slope").label, withCi("calibration_slope"), slopeReading(c)},
      bootCi("calibration_slope"));
  add({m("oe_ratio").label, plan.eventsHidden() ? hidden : withCi("oe_ratio"),
       "Observed events per predicted event (target 1)."},
      plan.eventsHidden() && boot ? hidden : bootCi("oe_ratio"));
  add({m("spiegelhalter_z").label,
       text("spiegelhalter_z") + " (p " + (c.spiegelhalterP < kPValueFloor ? "" : "= ") +
           text("spiegelhalter_p") + ")",
       "Tests whether squared errors exceed what the predicted risks imply."},
      {});
  add({"ICI / E50 / E90 / Emax",
       text("ici") + " / " + text("e50") + " / " + text("e90") + " / " + text("emax"),
       "On average predicted risk differs from the smoothed observed risk by " +
           formatFixed(c.ici * 100.0, 1) + " percentage points."},
      boot ? "ICI " + bootCi("ici") + "\nE90 " + bootCi("e90") : std::string());
  add({std::string(m("brier").label) + " (scaled)",
       text("brier") + " (" + (plan.eventsHidden() ? hidden : text("brier_scaled")) + ")",
       "Mean squared error of the risks (0 is perfect); scaled: share of the error of a "
       "prevalence-only model removed."},
      boot ? bootCi("brier") + "\n(" + (plan.eventsHidden() ? hidden : bootCi("brier_scaled")) + ")"
           : std::string());
  const HosmerLemeshow& hl = r.hosmerLemeshow;
  add({"Hosmer-Lemeshow",
       "chi-square " + text("hosmer_lemeshow_statistic") + ", df " + text("hosmer_lemeshow_df") +
           ", p " + (hl.pValue < kPValueFloor ? "" : "= ") + text("hosmer_lemeshow_p"),
       hl.pValue < 0.05 ? "Grouped observed and expected events differ more than chance "
                          "explains; read with the calibration curve."
                        : "No clear difference between grouped observed and expected events; "
                          "the test has little power in small cohorts."},
      {});
  if (!c.hierarchyLevel.empty()) {
    add({"Calibration level", c.hierarchyLevel,
         "Level reached on the calibration hierarchy (Van Calster et al. 2016)."},
        {});
  }
  if (boot) addBootstrapColumn(*boot, bootCells, table);
  blocks.push_back(reportTable(table));
}

void addCharts(const AuditDocument& doc, std::vector<ReportBlock>& blocks) {
  const std::vector<std::pair<ChartKind, std::string>> charts = {
      {ChartKind::Roc,
       "Figure 1. ROC curve: sensitivity against 1 - specificity over all "
       "thresholds, with the chance diagonal"},
      {ChartKind::Calibration,
       "Figure 2. Calibration: smoothed observed risk and risk groups (95% CI) against "
       "predicted risk; on the diagonal predicted equals observed; the strip below 0 shows how "
       "many patients have each predicted risk"},
      {ChartKind::DecisionCurve,
       doc.reasonableThresholds
           ? "Figure 3. Decision curve: net benefit of the model, of treating all and of treating "
             "none; the shaded band is the reasonable threshold range"
           : "Figure 3. Decision curve: net benefit of the model, of treating all and of treating "
             "none (no reasonable threshold range was set)"},
      {ChartKind::RiskDistribution, "Figure 4. Distribution of predicted risk by outcome"},
  };
  // Every chart marks the same threshold (render/report/report_charts.cpp): say which.
  const auto marker = [&doc](ChartKind kind) -> std::string {
    if (!doc.markedThreshold) {
      return "; no threshold is marked (the counts of every tabulated threshold are hidden)";
    }
    return (kind == ChartKind::Roc ? "; the square marks threshold "
                                   : "; the line marks threshold ") +
           formatNumber(doc.markedThreshold->threshold, 3);
  };
  for (const auto& [kind, caption] : charts) {
    ReportBlock block;
    block.kind = Kind::ChartPair;
    block.charts = {kind};
    block.captions = {caption + marker(kind)};
    if (doc.suppressionApplied && kind != ChartKind::Roc) {
      block.captions[0] += kind == ChartKind::RiskDistribution
                               ? " (bins with hidden counts drawn empty)"
                               : " (drawn from the suppressed values)";
    }
    blocks.push_back(block);
  }
}

void addHosmerLemeshow(const AuditReportInput& input, const DisclosurePlan& plan,
                       std::vector<ReportBlock>& blocks) {
  const auto& groups = input.result.hosmerLemeshow.groups;
  if (groups.empty()) return;
  ReportTable table;
  table.caption = std::string(kTablePrefix) + "Risk groups (Hosmer-Lemeshow)";
  table.header = {"Group",      "Risk range",      "n",         "Events",
                  "Non-events", "Expected events", "Mean risk", "Observed proportion (95% CI)"};
  table.widths = {0.07, 0.17, 0.08, 0.09, 0.11, 0.12, 0.10, 0.26};
  table.align = {CellAlign::Right, CellAlign::Left,  CellAlign::Right, CellAlign::Right,
                 CellAlign::Right, CellAlign::Right, CellAlign::Right, CellAlign::Left};
  for (std::size_t g = 0; g < groups.size(); ++g) {
    const CalibrationGroup& group = groups[g];
    table.rows.push_back(
        {std::to_string(g + 1),
         formatFixed(group.riskLo, 3) + " to " + formatFixed(group.riskHi, 3), plan.groupN(g),
         plan.groupEvents(g), plan.groupNonEvents(g),
         plan.groupSizeHidden(g) ? std::string(kComplementaryMark) : formatFixed(group.expected, 1),
         formatFixed(group.meanRisk, 3),
         plan.groupProportionHidden(g)
             ? std::string(kComplementaryMark)
             : formatWithCi(group.observedProportion, group.observedCi, 3)});
  }
  blocks.push_back(reportTable(table));
}

void addThresholdTable(const std::vector<ThresholdRow>& rows, const DisclosurePlan& plan,
                       std::vector<ReportBlock>& blocks) {
  if (rows.empty()) return;
  ReportTable table;
  table.caption = std::string(kTablePrefix) +
                  "At the selected thresholds (flagged: predicted risk at or above)";
  table.header = {"Threshold",   "TP",          "FP",  "FN",  "TN",
                  "Sensitivity", "Specificity", "PPV", "NPV", "Flagged per 1000"};
  table.widths = {0.10, 0.06, 0.06, 0.06, 0.06, 0.14, 0.14, 0.14, 0.14, 0.10};
  table.align = std::vector<CellAlign>(table.header.size(), CellAlign::Right);
  const std::string hidden = kComplementaryMark;
  for (std::size_t i = 0; i < rows.size(); ++i) {
    const ThresholdRow& row = rows[i];
    const bool h = plan.rowHidden(i);
    auto rate = [&](double value, const Interval& ci) {
      // Estimate over its interval: the narrow rate columns never break inside a number.
      return h ? hidden
               : formatFixed(value, 3) + "\n(" + formatFixed(ci.lo, 3) + "\u2013" +
                     formatFixed(ci.hi, 3) + ")";
    };
    table.rows.push_back({formatThreshold(row.threshold), plan.rowTp(i), plan.rowFp(i),
                          plan.rowFn(i), plan.rowTn(i), rate(row.sensitivity, row.sensitivityCi),
                          rate(row.specificity, row.specificityCi), rate(row.ppv, row.ppvCi),
                          rate(row.npv, row.npvCi),
                          h ? hidden : formatFixed(row.flaggedPer1000, 1)});
  }
  table.note =
      "TP, FP, FN, TN: true and false positives and negatives. Rates with Wilson 95% "
      "intervals.";
  blocks.push_back(reportTable(table));
}

std::vector<std::string> reportWarnings(const AuditReportInput& input) {
  std::vector<std::string> warnings;
  const CohortSummary& cohort = input.result.cohort;
  const std::size_t nonEvents = cohort.n - cohort.events;
  const std::size_t below = input.settings.suppressBelow;
  const bool hideCounts = below >= 2 && (cohort.events < below || nonEvents < below);
  // The run's own warnings (below) already hold the sample-size warnings of
  // core/metrics/size_warnings.h, worded once; with hidden counts they are worded without them.
  std::vector<std::string> runWarnings = input.result.warnings;
  if (hideCounts) {
    for (const SizeWarning w : sizeWarningsFor(cohort.events, nonEvents)) {
      const std::string shown = sizeWarningText(w, cohort.events, nonEvents, true);
      for (std::string& text : runWarnings) {
        if (text == shown) text = sizeWarningText(w, cohort.events, nonEvents, false);
      }
    }
  }
  const bool pipelineNamesExclusions =
      input.exclusions.rowsExcluded > 0 &&
      std::find(runWarnings.begin(), runWarnings.end(), exclusionWarning(input.exclusions)) !=
          runWarnings.end();
  if (input.exclusions.rowsExcluded > 0 && !pipelineNamesExclusions) {
    const std::size_t excluded = input.exclusions.rowsExcluded;
    warnings.push_back(
        (below >= 2 && excluded < below ? "Fewer than " + std::to_string(below)
                                        : std::to_string(excluded)) +
        " rows were excluded for missing values (complete-case analysis); if missingness is "
        "related to the outcome, performance on the analysed rows can differ from the whole "
        "cohort.");
  }
  for (const std::string& warning : runWarnings) {
    warnings.push_back(below >= 2 ? suppressSmallNumbersInText(warning, below) : warning);
  }
  return warnings;
}

void addMethods(const AuditReportInput& input, std::vector<ReportBlock>& blocks) {
  blocks.push_back(reportHeading("3  Methods"));
  for (const MethodParagraph& method : auditMethodParagraphs()) {
    blocks.push_back(reportHeading(method.title, 2));
    blocks.push_back(reportParagraph(method.text + " Source: " + method.reference));
  }
  if (input.uncertainty) {
    for (ReportBlock& block : uncertaintyMethods(*input.uncertainty)) blocks.push_back(block);
  }
}

void addChecklist(const AuditReportInput& input, std::vector<ReportBlock>& blocks) {
  blocks.push_back(reportHeading("4  Reporting checklist (oriented on TRIPOD and TRIPOD+AI)"));
  blocks.push_back(reportParagraph(
      "Items of the TRIPOD statement (Collins et al., BMJ 2015;350:g7594) and its update for "
      "prediction models using regression or machine learning, TRIPOD+AI (Collins et al., BMJ "
      "2024;385:e078378), as they apply to a validation. Items marked [to add] are not known to "
      "this software and must be supplied by the user with the report."));
  ReportTable table;
  table.caption = std::string(kTablePrefix) + "Checklist";
  table.header = {"Status", "Item", "Where covered / what to add"};
  table.widths = {0.13, 0.45, 0.42};
  table.align = {CellAlign::Left, CellAlign::Left, CellAlign::Left};
  const bool subgroups = input.uncertainty && !input.uncertainty->subgroups.empty();
  for (const ChecklistItem& item :
       auditChecklist(input.settings.apparent, subgroups,
                      input.imputed ? input.imputed->method : std::string())) {
    table.rows.push_back(
        {checklistStatusText(item.status == ChecklistStatus::Covered), item.topic, item.where});
  }
  blocks.push_back(reportTable(table));
}

void addAbout(const AuditReportInput& input, const AuditDocument& doc, const DisclosurePlan& plan,
              std::vector<ReportBlock>& blocks) {
  blocks.push_back(reportHeading("5  About this report"));
  blocks.push_back(reportParagraph(
      "Privacy: the report holds aggregates only (counts, proportions, curves). No value of an "
      "individual row of the cohort file, identifier or otherwise, is printed."));
  if (plan.active()) {
    std::string text =
        "Small-cell suppression was applied: counts from 1 to " + std::to_string(plan.below() - 1) +
        " are shown as <" + std::to_string(plan.below()) + ", and further counts marked " +
        kComplementaryMark +
        " are hidden so that no hidden count can be recomputed from row or column totals. Rates, "
        "intervals and expected counts derived from a hidden count are hidden as well; ROC and "
        "decision-curve points whose confusion counts include a count below " +
        std::to_string(plan.below()) +
        " are left out of the charts, and risk-distribution bins "
        "with hidden counts are drawn empty.";
    if (input.uncertainty) {
      text +=
          " The same rule covers the subgroup counts (a subgroup with a hidden count has its "
          "measures withheld) and the number of patients the model comparison rests on; a "
          "net-benefit difference at a threshold where a model's confusion counts include a "
          "count below " +
          std::to_string(plan.below()) + " is withheld, and the charts leave those points out.";
    }
    if (!doc.suppressionApplied) text += " No count in this report needed to be hidden.";
    blocks.push_back(reportParagraph(text));
  } else {
    blocks.push_back(reportParagraph("Small-cell suppression was off: all counts are shown."));
  }
  blocks.push_back(reportParagraph(
      "Reproducibility: the same input files (identified by the SHA-256 fingerprints in every "
      "footer) and the same settings give the same report. Software: Calivera " +
      input.softwareVersion + "."));
  // Qt 6.4's PDF writer (QPdfWriter) offers PDF 1.4, PDF/A-1b and 1.6 output and no way to write
  // a structure tree, so the report cannot be tagged; say so rather than let a reader assume it.
  blocks.push_back(reportParagraph(
      "Accessibility: this PDF is not tagged (the PDF writer used offers no document structure "
      "tags). Its text is real text that can be selected, searched and read aloud; each chart "
      "is described by its caption and its numbers are in the tables."));
}

// "Table #. " captions become "Table 1. ", "Table 2. ", ... in reading order.
}  // namespace

AuditDocument buildAuditDocument(const AuditReportInput& input) {
  const std::vector<ThresholdRow> tableRows = selectTableRows(input);
  const DisclosurePlan plan(
      input.result, input.exclusions, tableRows, input.settings.suppressBelow,
      input.uncertainty ? disclosureExtras(*input.uncertainty) : DisclosureExtras{});
  AuditDocument doc;
  doc.title = input.title.empty() ? std::string(kDefaultAuditTitle)
                                  : visibleName(input.title, kReportTitleChars);
  doc.subtitle = "Created " + input.createdAt + "  |  Calivera " + input.softwareVersion;
  doc.caution = auditCautionText();
  doc.footer = {
      "Cohort " + cohortShortName(input) + "  SHA-256 " + input.cohortFile.sha256,
      "Model " + fileNameOnly(input.modelFile.name) + "  SHA-256 " + input.modelFile.sha256};
  doc.suppressBelow = plan.active() ? plan.below() : 0;
  doc.suppressionApplied = plan.anyHidden();
  doc.chartData = plan.chartData(input.result);
  doc.reasonableThresholds = input.settings.reasonableThresholds;
  addUncertaintyChartData(input, doc);
  for (std::size_t i = 0; i < tableRows.size() && !doc.markedThreshold; ++i) {
    if (!plan.rowHidden(i)) doc.markedThreshold = tableRows[i];
  }

  std::vector<ReportBlock>& blocks = doc.blocks;
  ReportBlock caution;
  caution.kind = Kind::Caution;
  caution.text = doc.caution;
  blocks.push_back(caution);
  std::vector<std::string> warnings = reportWarnings(input);
  if (input.uncertainty) {
    for (std::string& w : uncertaintyWarnings(*input.uncertainty, plan)) warnings.push_back(w);
  }
  // The first page: the result in brief and the sign-off lines, then the full sections.
  addOverview(input, doc, plan, warnings, blocks);
  addSignOff(input, blocks);
  addIdentification(input, plan, tableRows, blocks);
  if (input.uncertainty) addSampleSizeSection(*input.uncertainty, plan, blocks);

  blocks.push_back(reportHeading("2  Results"));
  addSummary(input, plan, blocks);
  addCharts(doc, blocks);
  addHosmerLemeshow(input, plan, blocks);
  addThresholdTable(tableRows, plan, blocks);
  addMissingDataSection(input, plan, blocks);
  if (input.uncertainty) {
    std::vector<double> tabulated;
    for (const ThresholdRow& row : tableRows) tabulated.push_back(row.threshold);
    addComparisonSection(input, plan, tabulated, blocks);
    addSubgroupSection(*input.uncertainty, plan, blocks);
    if (input.uncertainty->sites) {
      addSiteSection(*input.uncertainty->sites, input.settings.suppressBelow, blocks);
    }
  }
  blocks.push_back(reportHeading("Warnings", 2));
  if (warnings.empty()) blocks.push_back(reportParagraph("None."));
  for (const std::string& warning : warnings) blocks.push_back(reportParagraph("- " + warning));

  addMethods(input, blocks);
  addChecklist(input, blocks);
  addAbout(input, doc, plan, blocks);
  numberTables(blocks);
  return doc;
}

void numberTables(std::vector<ReportBlock>& blocks) {
  const std::string prefix = kTablePrefix;
  int number = 0;
  for (ReportBlock& block : blocks) {
    if (block.kind != ReportBlock::Kind::Table || block.table.caption.rfind(prefix, 0) != 0)
      continue;
    block.table.caption.replace(0, prefix.size(), "Table " + std::to_string(++number) + ". ");
  }
}

std::string cohortShortName(const AuditReportInput& input) {
  if (!input.database) return fileNameOnly(input.cohortFile.name);
  const DatabaseProvenance& db = *input.database;
  const std::string database = "PostgreSQL database '" + reportName(db.database) + "'";
  return db.selection.table.empty()
             ? "a query of " + database
             : "table '" + reportName(db.selection.table) + "' of " + database;
}

}  // namespace calivera
