#pragma once
// A site summary (`calivera summarize ... --out SITE.cvsummary`): everything pooling across sites
// needs from one site, as aggregates only, in a JSON file the site can read before sending it.
//
// It holds: counts; the measures with their standard errors and why any cannot be pooled
// (core/sites/site_measures.h); the threshold counts of net benefit at the run's threshold grid;
// per-outcome histograms of the logit of the predicted risk (the linear predictor) in bins of a
// stated width; the Hosmer-Lemeshow group sums; the site's calibration curve read at a fixed grid
// of risks (never at a patient's risk); the model's and the data's fingerprints; the software
// version; and the small-cell suppression applied. No patient row, identifier or single
// patient's value is written.
//
// Small cells (`suppressBelow` N > 0): threshold counts with any cell in (0, N) are withheld;
// histogram bins are merged with their neighbours until each holds 0 or >= N events and 0 or
// >= N non-events (so no count is lost, only resolution); a Hosmer-Lemeshow group whose events
// or non-events lie in (0, N) has its observed count withheld.
//
// Integrity: `content_sha256` is the SHA-256 of the file's JSON without that key, serialised
// compactly with sorted keys; a summary edited by hand or damaged in transit fails the check.

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "core/metrics/validation_run.h"
#include "core/sites/site_measures.h"

namespace calivera {

inline constexpr const char* kSiteSummaryFormat = "calivera-site-summary";
inline constexpr int kSiteSummaryVersion = 1;
inline constexpr std::size_t kMaxSiteSummaryBytes = std::size_t{32} << 20;
inline constexpr std::size_t kMaxSiteNameBytes = 200;
// Histogram bins of logit(risk); risks of exactly 0 or 1 and logits beyond the bound fall in the
// outermost bins (where their order is counted as unknown).
inline constexpr double kDefaultLogitBinWidth = 0.02;
inline constexpr double kLogitBound = 40.0;

struct SummaryOptions {
  std::string site;               // the site's name in every output (non-empty, valid UTF-8)
  std::size_t suppressBelow = 0;  // 0: off; else 2..1000
  double binWidth = kDefaultLogitBinWidth;
  bool isValid() const;
};

// One histogram cell: logits in [fromBin * width, toBin * width) of both outcomes.
struct LogitHistogramCell {
  long long fromBin = 0, toBin = 1;
  std::size_t events = 0, nonEvents = 0;
};

struct SummaryGroup {
  std::size_t n = 0;
  std::optional<std::size_t> observed;  // withheld under small-cell suppression
  double expected = 0.0;
};

struct SiteSummary {
  // What was validated, identical across sites for pooling.
  std::string modelKind;  // "model file" or "risk column"
  std::string modelName;
  std::string modelSha256;  // model file only
  std::string riskColumn;   // risk column only
  std::string outcomeColumn;
  std::string performance;  // "apparent" or "new data"
  // Where it was computed.
  std::string softwareVersion;
  std::string dataSha256;
  std::string analysedSha256;  // model route only
  std::size_t suppressBelow = 0;
  int groups = 10;
  std::vector<double> thresholdGrid;
  double binWidth = kDefaultLogitBinWidth;
  SiteMeasures measures;  // thresholds: every point of thresholdGrid; with its calibration curve
  std::vector<LogitHistogramCell> histogram;
  std::vector<SummaryGroup> hosmerLemeshowGroups;
  double hosmerLemeshowStatistic = 0.0;
  int hosmerLemeshowDf = 0;
  double hosmerLemeshowP = 0.0;
  std::string contentSha256;  // filled when written or read
};

// The summary of a whole validation run as one site.
SiteSummary summarizeRun(const ValidationRun& run, const SummaryOptions& options);

// The file's text (pretty JSON with content_sha256).
std::string siteSummaryText(const SiteSummary& summary);

// Throws InputError naming the file and the field: not a summary, another format version, a
// failed integrity check, a value of the wrong type or out of range, counts that contradict each
// other.
SiteSummary readSiteSummary(const std::string& path);

// The same from text already read (`path` names it in messages). Skipped only by the fuzz target,
// which needs the fields' checks reachable without forging a SHA-256.
enum class IntegrityCheck { Required, SkippedForFuzzing };
SiteSummary parseSiteSummary(const std::string& text, const std::string& path,
                             IntegrityCheck integrity);

// The AUC of every site's patients together from the histograms, with the bound on its error:
// pairs of an event and a non-event whose cells overlap are counted 1/2, and each such pair can
// be off by at most 1/2, so |AUC - binned| <= (1/2) * overlapping pairs / (events * non-events).
struct BinnedAuc {
  double auc = 0.0;
  double errorBound = 0.0;
  std::size_t events = 0, nonEvents = 0;
};
BinnedAuc binnedAuc(const std::vector<const std::vector<LogitHistogramCell>*>& histograms);

}  // namespace calivera
