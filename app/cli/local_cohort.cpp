#include "app/cli/local_cohort.h"

#include <memory>

#include "app/cli/data_options.h"
#include "core/metrics/validation_run.h"

namespace calivera::cli {

CohortData loadLocalCohort(const Arguments& args, const std::string& modelPath,
                           bool developmentData) {
  ValidationRequest request;
  request.dataPath = args.required("--data");
  request.csv = csvOptionsFrom(args);
  request.database = databaseSelectionFrom(args);
  request.outcome = OutcomeSpec{args.required("--outcome"), eventValueFrom(args)};
  request.modelPath = modelPath;
  request.developmentData = developmentData;
  return CohortData{std::make_shared<const ValidationRun>(runValidation(request))};
}

void printExclusions(std::ostream& out, const CohortData& cohort) {
  const ValidationRun& run = *cohort.run;
  const ExclusionReport& e = run.cohort.exclusions;
  out << "data: " << run.request.dataPath << (run.database ? " (result sha256 " : " (sha256 ")
      << run.dataSha256 << ")\n"
      << "  " << e.rowsRead << " rows read, " << e.rowsExcluded << " excluded for missing values";
  bool first = true;
  for (const auto& c : e.byColumn) {
    if (c.rowsMissing == 0) continue;
    out << (first ? " (" : ", ") << c.column << ": " << c.rowsMissing;
    first = false;
  }
  out << (first ? "" : ")") << ", " << e.rowsAnalysed << " analysed, " << run.result.cohort.events
      << " events\n";
}

}  // namespace calivera::cli
