#pragma once
// The audit report's sections from the uncertainty layer (core/uncertainty/uncertainty_run.h):
//   sample-size adequacy (rules of thumb; precision-based sizes of Riley et al., Stat Med
//     2021;40:4230-51, with the widths this cohort achieved), placed before the results;
//   bootstrap percentile 95% CIs beside the analytic CIs of the performance summary;
//   model comparison (AUCs, paired DeLong test, net-benefit differences with bootstrap CIs over
//     the clinically reasonable range), compared model files by file name and SHA-256 only;
//   subgroups (TRIPOD+AI, Collins et al., BMJ 2024;385:e078378): n, events, AUC, calibration
//     intercept and slope and O/E per level;
//   their methods with published sources, and what the charts draw (bands, overlays).
// Every count they print passes through the report's DisclosurePlan (audit_disclosure.h): with
// suppression on, a level with a hidden count shows "<N" or "s" and its metrics are withheld, a
// net-benefit row at a threshold with a confusion count below N is withheld, and the report says
// so. Captions start with kTablePrefix (numbered by buildAuditDocument).

#include <string>
#include <vector>

#include "core/report/audit_disclosure.h"
#include "core/report/audit_report.h"

namespace calivera {

// The counts the uncertainty sections publish, for the disclosure plan.
DisclosureExtras disclosureExtras(const UncertaintyResults& results);

// "Is the cohort large enough?" (a level-2 section): verdict, rules of thumb, precision criteria.
void addSampleSizeSection(const UncertaintyResults& results, const DisclosurePlan& plan,
                          std::vector<ReportBlock>& blocks);

// The bootstrap CI of one estimate as printed beside the analytic CI ("0.651 to 0.802").
std::string bootstrapCiText(const BootstrapEstimate& estimate, int decimals);
// The sentence under the performance summary: replicates, seed, failed replicates.
std::string bootstrapNote(const ValidationBootstrap& bootstrap);

// `tabulated`: the thresholds of the threshold table (used when no reasonable range is set).
void addComparisonSection(const AuditReportInput& input, const DisclosurePlan& plan,
                          const std::vector<double>& tabulated, std::vector<ReportBlock>& blocks);
void addSubgroupSection(const UncertaintyResults& results, const DisclosurePlan& plan,
                        std::vector<ReportBlock>& blocks);

// Warnings of the bootstrap and the comparison, with small numbers suppressed as the plan says.
std::vector<std::string> uncertaintyWarnings(const UncertaintyResults& results,
                                             const DisclosurePlan& plan);

// Methods paragraphs for what was computed (bootstrap, comparison, subgroups, sample size).
std::vector<ReportBlock> uncertaintyMethods(const UncertaintyResults& results);

// Fills doc.calibrationBand, doc.netBenefitBand and doc.comparisons (after doc.chartData).
void addUncertaintyChartData(const AuditReportInput& input, AuditDocument& doc);

}  // namespace calivera
