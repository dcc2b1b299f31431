#include "core/report/audit_overview.h"

#include "core/metrics/decision_curve.h"
#include "core/present/measures.h"
#include "core/present/number_text.h"
#include "core/report/audit_blocks.h"
#include "core/report/audit_format.h"

namespace calivera {

namespace {

// A blank to sign on: the printed form is filled by hand when the settings name no one.
constexpr const char* kBlankLine = "______________________________";

std::string withCi(const char* key, const ValidationResult& r) {
  const Measure& m = measureByKey(key);
  return std::string(m.label) + " " + measureWithCiText(m, r);
}

}  // namespace

void addOverview(const AuditReportInput& input, const AuditDocument& doc,
                 const DisclosurePlan& plan, const std::vector<std::string>& warnings,
                 std::vector<ReportBlock>& blocks) {
  const ValidationResult& r = input.result;
  blocks.push_back(reportHeading("Summary of the evidence"));
  ReportTable table;
  table.caption = std::string(kTablePrefix) + "The result in brief (details in Sections 1 to 3)";
  table.header = {"Question", "What this validation found"};
  table.widths = {0.26, 0.74};
  table.align = {CellAlign::Left, CellAlign::Left};
  const std::string model =
      reportName(input.model.name.empty() ? fileNameOnly(input.modelFile.name) : input.model.name);
  table.rows.push_back(
      {"What was validated",
       model + " (" + fileNameOnly(input.modelFile.name) + "), on " + cohortShortName(input) +
           ": " + plan.rowsAnalysed() + " patients, " + plan.events() + " with the event; " +
           (input.settings.apparent ? "apparent performance (the cohort is the development data)"
                                    : "new data (external validation)")});
  if (input.studyFile) {
    table.rows.push_back({"Study file", fileNameOnly(input.studyFile->name) + ", SHA-256 " +
                                            input.studyFile->sha256});
  }
  table.rows.push_back({"Discrimination", withCi("auc", r)});
  std::string calibration = withCi("calibration_slope", r) + "; " +
                            withCi("calibration_intercept", r) + "; " + withCi("oe_ratio", r);
  if (!r.calibration.hierarchyLevel.empty()) {
    calibration += "; calibration hierarchy: " + r.calibration.hierarchyLevel;
  }
  table.rows.push_back({"Calibration", calibration});
  if (doc.markedThreshold) {
    const ThresholdRow& row = *doc.markedThreshold;
    const DecisionCurvePoint nb = netBenefitAt(row.threshold, row.tp, row.fp, row.tn, row.fn);
    table.rows.push_back(
        {"Clinical utility", "At threshold " + formatNumber(row.threshold, 3) + ": net benefit " +
                                 formatNumber(nb.netBenefit, 4) + " (treat everyone " +
                                 formatNumber(nb.netBenefitTreatAll, 4) +
                                 ", treat no one 0); the decision curve " +
                                 "and the threshold table give the other thresholds"});
  } else {
    table.rows.push_back({"Clinical utility",
                          "not summarised here: the counts of every tabulated threshold are "
                          "hidden (small-cell suppression)"});
  }
  if (input.uncertainty) {
    table.rows.push_back({"Enough patients?", input.uncertainty->sampleSize.verdict});
  }
  std::string listed;
  for (std::size_t i = 0; i < warnings.size() && i < kOverviewWarnings; ++i) {
    listed += (listed.empty() ? "" : " ") + ("(" + std::to_string(i + 1) + ") ") + warnings[i];
  }
  if (warnings.size() > kOverviewWarnings) {
    listed += " (and " + std::to_string(warnings.size() - kOverviewWarnings) +
              " more: Section 2, Warnings)";
  }
  table.rows.push_back({"Main warnings", warnings.empty() ? "none" : listed});
  table.note =
      "Evidence about this model on this cohort for local clinical governance; it is not an "
      "approval to use the model.";
  blocks.push_back(reportTable(std::move(table)));
}

void addSignOff(const AuditReportInput& input, std::vector<ReportBlock>& blocks) {
  ReportTable table;
  table.caption = std::string(kTablePrefix) + "Review and sign-off";
  table.header = {"Role", "Name", "Signature and date"};
  table.widths = {0.26, 0.37, 0.37};
  table.align = {CellAlign::Left, CellAlign::Left, CellAlign::Left};
  const auto name = [](const std::string& given) {
    return given.empty() ? std::string(kBlankLine) : reportName(given);
  };
  table.rows = {{"Analyst", name(input.signOff.analyst), kBlankLine},
                {"Reviewer", name(input.signOff.reviewer), kBlankLine},
                {"Clinical governance", kBlankLine, kBlankLine}};
  table.note =
      "A signature records that the evidence was read and reviewed; any use of the model in "
      "care is decided under local governance and regulations.";
  blocks.push_back(reportTable(std::move(table)));
}

}  // namespace calivera
