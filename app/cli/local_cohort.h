#pragma once
// Shared by the update and internal commands: the patients a model is updated or internally
// validated on are the analysed patients of the one validation run of that model on --data
// (core/metrics/validation_run.h), selected exactly as `validate` and the workstation select
// them: complete cases over the model's columns and the outcome, unknown category levels refused.

#include <ostream>
#include <string>

#include "app/cli/arguments.h"
#include "core/study/study_analysis.h"

namespace calivera::cli {

// Options --data, --outcome and those of data_options.h (--delimiter, --missing, --event-value);
// `developmentData`: the user states the cohort is the model's development data. Throws
// InputError naming the file, column and value for bad input.
CohortData loadLocalCohort(const Arguments& args, const std::string& modelPath,
                           bool developmentData = false);

// "data: PATH (sha256 ...)\n  n rows read, k excluded (column: m missing, ...), n analysed, e
// events".
void printExclusions(std::ostream& out, const CohortData& cohort);

}  // namespace calivera::cli
