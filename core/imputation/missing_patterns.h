#pragma once
// Which combinations of the analysis's columns are missing together, and how often: the
// missingness report that reporting guidance asks for (TRIPOD+AI, Collins et al., BMJ 2024,
// item on missing data). A pattern is the set of columns missing on a row; each is counted with
// the rows whose outcome is known and their events, so a pattern whose event rate differs from
// the complete rows' shows that complete cases are not a random part of the cohort.

#include <cstddef>
#include <string>
#include <vector>

#include "core/data/cohort.h"
#include "core/data/table.h"

namespace calivera {

struct MissingPattern {
  std::vector<std::string> missingColumns;  // empty: the complete rows
  std::size_t rows = 0;
  std::size_t outcomeKnown = 0;  // rows of the pattern whose outcome is recorded
  std::size_t events = 0;        // among them
};

inline constexpr std::size_t kMaxReportedPatterns = 20;

// The patterns over `columns` (the outcome first, as the analysis lists them), most frequent
// first (ties: fewer missing columns first, then by name), at most kMaxReportedPatterns; the
// rows of the patterns left out are not lost: `othersRows` counts them.
struct MissingPatternReport {
  std::vector<MissingPattern> patterns;
  std::size_t othersRows = 0;
  std::size_t otherPatterns = 0;
};

MissingPatternReport missingPatterns(const Table& table, const std::vector<std::string>& columns,
                                     const OutcomeSpec& outcome);

}  // namespace calivera
