#pragma once
// The audit report as plain content, free of Qt: what was validated (files, fingerprints,
// exclusions, settings), the results with plain-language readings, methods with their sources,
// a TRIPOD / TRIPOD+AI oriented checklist and warnings. The PDF renderer in render/report lays
// these blocks out; it adds no numbers of its own.
//
// Privacy: the document holds aggregates only (counts, rates, curves); no row-level value of the
// cohort is ever copied into it. With suppression on (AuditSettings::suppressBelow >= 2), every
// count passes through the disclosure plan (audit_disclosure.h) and the chart data are rebuilt
// from the suppressed values.
//
// Uncertainty (AuditReportInput::uncertainty, core/uncertainty/uncertainty_run.h), when given:
// sample-size adequacy before the results, bootstrap CIs beside the analytic ones, a model
// comparison and a subgroup section, their methods with sources; every count they add goes
// through the same disclosure plan.

#include <cstddef>
#include <memory>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "core/data/cohort.h"
#include "core/data/database_source.h"
#include "core/imputation/imputed_validation.h"
#include "core/imputation/missing_patterns.h"
#include "core/metrics/threshold_table.h"  // defaultTableThresholds
#include "core/metrics/validation.h"
#include "core/model/model.h"
#include "core/report/site_curves.h"
#include "core/report/site_forest.h"
#include "core/uncertainty/uncertainty_run.h"

namespace calivera {

struct FileFingerprint {
  std::string name;    // file name as the user gave it (no folders: they can name people)
  std::string sha256;  // lowercase hex
};

struct AuditSettings {
  std::string outcomeColumn;
  std::optional<std::string> eventValue;
  int groups = 10;
  bool apparent = false;
  std::vector<double> tableThresholds;           // rows of the threshold table, as selected
  std::optional<Interval> reasonableThresholds;  // clinically reasonable range for net benefit
  std::size_t suppressBelow = 0;                 // 0: off; N: counts 1..N-1 shown as "<N"
  // Any further setting of the run, printed as given (name, value).
  std::vector<std::pair<std::string, std::string>> other;
};

// Who prepared and who reviewed the report (the report settings); empty: a blank line to sign.
struct ReportSignOff {
  std::string analyst;
  std::string reviewer;
};

struct AuditReportInput {
  std::string title;
  std::string createdAt;  // as printed, e.g. "2026-12-01 22:40:00 UTC"
  std::string softwareVersion;
  FileFingerprint cohortFile;  // for a database: its URI and the result's fingerprint
  // A PostgreSQL source: where the rows came from; null for a file.
  std::shared_ptr<const DatabaseProvenance> database;
  std::string analysedSha256;  // analysed-data fingerprint; empty for a risk column
  ExclusionReport exclusions;
  FileFingerprint modelFile;
  Model model;
  AuditSettings settings;
  ValidationResult result;
  // The uncertainty layer's results for the same run (comparedModels' paths are reduced to file
  // names in the report); absent: the report has no uncertainty sections.
  std::optional<UncertaintyResults> uncertainty;
  // The saved study the run came from (calivera run, or the workstation's saved and unchanged
  // study); absent for a run from command-line options.
  std::optional<FileFingerprint> studyFile;
  ReportSignOff signOff;
  // Which analysed columns are missing together; with stacked imputed copies, their pooling.
  MissingPatternReport missingPatterns;
  std::shared_ptr<const ImputedValidation> imputed;
};

// The cohort as the report names it in a sentence or a footer: the file's name without folders,
// or "table 'T' of PostgreSQL database 'D'" / "a query of PostgreSQL database 'D'".
std::string cohortShortName(const AuditReportInput& input);

enum class CellAlign { Left, Right };

struct ReportTable {
  std::string caption;
  std::vector<std::string> header;
  std::vector<std::vector<std::string>> rows;
  std::vector<double> widths;    // relative column widths, one per header cell
  std::vector<CellAlign> align;  // one per header cell
  std::string note;              // printed under the table
};

enum class ChartKind { Roc, Calibration, DecisionCurve, RiskDistribution };

struct ReportBlock {
  // Forest: a forest plot of one measure pooled across sites (core/report/site_forest.h).
  // SiteCurves: every site's calibration curve on one set of axes (core/report/site_curves.h).
  enum class Kind { Heading, Paragraph, Caution, Table, ChartPair, PageBreak, Forest, SiteCurves };
  Kind kind = Kind::Paragraph;
  int level = 1;                             // Heading: 1 section, 2 subsection
  std::string text;                          // Heading, Paragraph, Caution
  ReportTable table;                         // Table
  std::vector<ChartKind> charts;             // ChartPair: one or two charts side by side
  std::vector<std::string> captions;         // ChartPair: one per chart
  std::optional<ForestPlot> forest;          // Forest
  std::optional<SiteCurvesPlot> siteCurves;  // SiteCurves
};

struct AuditDocument {
  std::string title;
  std::string subtitle;             // date, software
  std::string caution;              // also in every page footer
  std::vector<std::string> footer;  // the two fingerprint lines
  std::vector<ReportBlock> blocks;
  // What the charts draw: the validation result with suppressed bins and points removed.
  ValidationResult chartData;
  // Where the charts mark a threshold: the first tabulated row whose counts are shown.
  std::optional<ThresholdRow> markedThreshold;
  std::optional<Interval> reasonableThresholds;  // shaded on the decision curve
  std::size_t suppressBelow = 0;
  bool suppressionApplied = false;  // at least one count was hidden

  // What the charts draw of the uncertainty layer (empty when not computed):
  std::vector<BandPoint> calibrationBand;  // bootstrap band of the smoothed calibration curve
  std::vector<BandPoint> netBenefitBand;   // at the decision-curve points chartData keeps
  struct Overlay {
    std::string name;
    ValidationResult chartData;  // validated on the comparison rows, suppressed like chartData
  };
  std::vector<Overlay> comparisons;  // the further models (not the validated one), in order
};

// The report's title when none is given.
inline constexpr const char* kDefaultAuditTitle = "Model validation audit report";

// The caution statement printed on the first page and in every footer.
const std::string& auditCautionText();

// Throws InputError when a selected table threshold is not among result.thresholds (the caller
// validates with the thresholds it wants tabulated).
AuditDocument buildAuditDocument(const AuditReportInput& input);

// "2026-12-01 22:40:00 UTC" for seconds since the epoch.
std::string formatUtcTimestamp(long long secondsSinceEpoch);

// SOURCE_DATE_EPOCH (reproducible-builds.org) when set to a valid integer, else the current time.
// Throws InputError naming the variable when it is set but not a non-negative integer.
long long reportTimestamp();

}  // namespace calivera
