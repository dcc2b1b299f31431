#pragma once
// A set of site summaries (`.cvsites`): the workstation's study of its own kind for pooling sites
// that send aggregates only (core/sites/summary_pooling.h). It names each summary file with the
// SHA-256 it had when the set was saved, the thresholds net benefit is pooled at, and the report's
// title; no result is stored, so opening the set pools the summaries again and a summary changed
// since the set was saved is refused rather than pooled silently. `calivera pool --set F`
// reproduces what the workstation shows.
//
// Paths inside the set's folder are written relative to it (the set and its summaries move
// together); others as absolute paths.

#include <cstddef>
#include <string>
#include <vector>

#include "core/sites/summary_pooling.h"
#include "core/util/progress.h"

namespace calivera {

inline constexpr const char* kSummarySetFormat = "calivera-site-summary-set";
inline constexpr int kSummarySetVersion = 1;
inline constexpr std::size_t kMaxSummarySetBytes = std::size_t{4} << 20;
// The most summaries one pool reads (`calivera pool` and a set alike).
inline constexpr std::size_t kMaxPooledSummaries = 10000;

struct SummarySetEntry {
  std::string path;    // absolute or relative to the working directory, as the caller gave it
  std::string sha256;  // of the file's bytes when the set was saved; empty: not yet checked
};

struct SummarySet {
  std::vector<SummarySetEntry> summaries;
  std::vector<double> netBenefitThresholds;  // empty: the default report thresholds
  std::string title;                         // the report's title; empty: the default
  // At least two summaries, at most kMaxPooledSummaries, each threshold in (0, 1), a title of at
  // most kMaxReportTitleBytes.
  bool isValid() const;
};

// The set's file text for a set saved at `setPath` (pretty JSON).
std::string summarySetText(const SummarySet& set, const std::string& setPath);

// Throws InputError naming the file and the field. Paths come back resolved against the set's
// folder.
SummarySet readSummarySet(const std::string& path);
// The same from text already read (`path` names it in messages and anchors relative paths).
SummarySet parseSummarySet(const std::string& text, const std::string& path);

// Reads each summary (readSiteSummary) and hashes its bytes; an entry with a recorded SHA-256
// that differs is refused naming the file. `progress` is called after each file; false cancels
// (throws Cancelled).
std::vector<SummaryFile> loadSummaryFiles(const std::vector<SummarySetEntry>& entries,
                                          const ProgressCallback& progress);

}  // namespace calivera
