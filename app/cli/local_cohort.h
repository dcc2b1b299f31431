#pragma once
// Shared by the update and internal commands: the local cohort a model is refitted or updated
// on — the CSV, complete cases over the model's columns and the outcome (exclusions counted per
// column), the 0/1 outcome and the file's SHA-256.

#include <cstdint>
#include <optional>
#include <ostream>
#include <string>
#include <vector>

#include "app/cli/arguments.h"
#include "core/data/cohort.h"
#include "core/data/table.h"
#include "core/model/model.h"

namespace calivera::cli {

struct LocalCohort {
  std::string path;
  std::string sha256;
  Table table;
  AnalysisRows selection;
  std::vector<double> outcome;  // per selected row
  std::size_t events = 0;
};

// Options --data, --outcome and those of data_options.h (--delimiter, --missing, --event-value).
// Throws InputError naming the file, column and value for bad input.
LocalCohort loadLocalCohort(const Arguments& args, const Model& model);

// "n rows read, k excluded (column: m missing, ...), n analysed, e events".
void printExclusions(std::ostream& out, const LocalCohort& cohort);

}  // namespace calivera::cli
