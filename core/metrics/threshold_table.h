#pragma once
// Classification table at each risk threshold (flag risk >= t): confusion counts, sensitivity,
// specificity, PPV and NPV with Wilson 95% intervals (Wilson, JASA 1927), and per-1000-patient
// counts a clinician can read directly: flagged, events caught (TP), events missed (FN) and
// flagged without an event (FP) per 1000 patients. A ratio with an empty denominator (e.g. PPV
// when nobody is flagged) is NaN with the interval [0, 1].

#include <cstddef>
#include <vector>

#include "core/metrics/sorted_cohort.h"
#include "core/metrics/validation.h"

namespace calivera {

ThresholdRow thresholdRowFromCounts(double threshold, std::size_t tp, std::size_t fp,
                                    std::size_t tn, std::size_t fn);

std::vector<ThresholdRow> thresholdTable(const SortedCohort& sorted,
                                         const std::vector<double>& thresholds);

// The threshold table's rows when none are selected: every computed threshold when there are at
// most 12, else those of 0.05, 0.1, 0.2, 0.3 and 0.5 that were computed (never a 99-row table).
// The command line, the workstation's export dialog and the pooled net benefit across sites
// (core/sites/site_pooling.h) start from this.
std::vector<double> defaultTableThresholds(const std::vector<ThresholdRow>& all);

}  // namespace calivera
