#pragma once
// The workstation's uncertainty run as plain functions over core (no Qt), safe on a worker thread:
// the analysis the window holds (CohortData and its ValidationResult) becomes core's
// UncertaintySubject, and core's runUncertainty (core/uncertainty/uncertainty_run.h) does the
// rest, so the numbers equal `calivera validate --bootstrap B --seed S --compare M --subgroup C`.

#include <memory>
#include <string>

#include "core/study/study.h"
#include "core/study/study_analysis.h"
#include "core/uncertainty/uncertainty_run.h"
#include "core/util/progress.h"

namespace calivera {

// The core request for `settings`; sample size always, the rest as asked.
UncertaintyRequest uncertaintyRequest(const UncertaintySettings& settings,
                                      const ProgressCallback& progress);

// Runs core's runUncertainty on the analysed cohort. `result` is validate(cohort.input(),
// cohort.options()). Throws InputError (unreadable compared model, missing subgroup column),
// AnalysisError, Cancelled.
UncertaintyResults computeUncertainty(const CohortData& cohort, const ValidationResult& result,
                                      const UncertaintySettings& settings,
                                      const ProgressCallback& progress);

// The settings with each compared model's SHA-256 (as core read it) filled in from `results`.
UncertaintySettings withComparedHashes(UncertaintySettings settings,
                                       const UncertaintyResults& results);

// A fingerprint of everything the validation result depends on (cohort contents, model,
// mapping, outcome coding, groups, apparent): equal basis, equal result. Not the threshold or
// the reasonable range, which only change how results are shown.
std::string validationBasis(const StudyState& study);

}  // namespace calivera
