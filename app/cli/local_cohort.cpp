#include "app/cli/local_cohort.h"

#include <algorithm>

#include "app/cli/data_options.h"
#include "core/data/csv_reader.h"
#include "core/model/linear_predictor.h"
#include "core/util/errors.h"
#include "core/util/sha256.h"

namespace calivera::cli {

LocalCohort loadLocalCohort(const Arguments& args, const Model& model) {
  LocalCohort cohort;
  cohort.path = args.required("--data");
  cohort.table = readCsvFile(cohort.path, csvOptionsFrom(args)).table;
  cohort.sha256 = sha256OfFile(cohort.path);
  OutcomeSpec outcome{args.required("--outcome"), eventValueFrom(args)};
  std::vector<std::string> columns = requiredColumns(model);
  if (std::find(columns.begin(), columns.end(), outcome.column) == columns.end()) {
    columns.push_back(outcome.column);
  }
  cohort.selection = selectCompleteCases(cohort.table, columns);
  if (cohort.selection.rows.empty()) {
    throw AnalysisError(cohort.path + ": no row is complete in the columns the model needs");
  }
  cohort.outcome = outcomeValues(cohort.table, outcome, cohort.selection.rows);
  for (double y : cohort.outcome) cohort.events += y > 0.5 ? 1 : 0;
  return cohort;
}

void printExclusions(std::ostream& out, const LocalCohort& cohort) {
  const ExclusionReport& e = cohort.selection.exclusions;
  out << "data: " << cohort.path << " (sha256 " << cohort.sha256 << ")\n"
      << "  " << e.rowsRead << " rows read, " << e.rowsExcluded << " excluded for missing values";
  bool first = true;
  for (const auto& c : e.byColumn) {
    if (c.rowsMissing == 0) continue;
    out << (first ? " (" : ", ") << c.column << ": " << c.rowsMissing;
    first = false;
  }
  out << (first ? "" : ")") << ", " << e.rowsAnalysed << " analysed, " << cohort.events
      << " events\n";
}

}  // namespace calivera::cli
