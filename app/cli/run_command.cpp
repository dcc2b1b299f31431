#include "app/cli/run_command.h"

#include <filesystem>
#include <iostream>

#include "app/cli/arguments.h"
#include "app/cli/validate_command.h"
#include "core/study/reproduce_command.h"
#include "core/study/study_file.h"
#include "core/util/errors.h"
#include "core/util/sha256.h"

namespace calivera::cli {
namespace {

constexpr const char* kHelp =
    "usage: calivera run STUDY.cvstudy [--json REPORT.json] [--csv-dir DIR]\n"
    "                    [--pdf REPORT.pdf [--title TEXT] [--suppress-below N] [--paper "
    "a4|letter]\n"
    "                     [--report-thresholds T1,T2,...]]\n\n"
    "Runs a study saved by the workstation, headless, with all its settings: the cohort and its\n"
    "import settings, the model file (or the model fitted in the workstation), the column\n"
    "mapping, risk groups, the development-data statement, bootstrap, comparison, subgroups and\n"
    "sample-size thresholds. Outputs and exit statuses are those of `calivera validate`; the\n"
    "summary ends with the validate command line that gives the same numbers. The PDF shades the\n"
    "study's reasonable threshold range and uses the report settings the workstation last\n"
    "exported with (title, names, table thresholds, suppression, paper); an option given here "
    "wins.\n\n"
    "  --json FILE          write the full report as JSON instead of the summary on stdout\n"
    "  --csv-dir DIR        also write every table as CSV into DIR\n"
    "  --pdf FILE           also write the audit report as PDF (aggregates only)\n"
    "  --title TEXT         the report's title\n"
    "  --analyst NAME, --reviewer NAME\n"
    "                       names on the report's sign-off lines\n"
    "  --suppress-below N   in the report, show counts from 1 to N-1 as <N\n"
    "  --paper SIZE         a4 (default) or letter\n"
    "  --report-thresholds T1,T2,...\n"
    "                       the rows of the report's threshold table\n";

}  // namespace

int runRunCommand(const std::vector<std::string>& words) {
  OptionSpec spec;
  spec.valued = {"--json",  "--csv-dir",           "--pdf",     "--title",   "--suppress-below",
                 "--paper", "--report-thresholds", "--analyst", "--reviewer"};
  spec.flags = {"--help"};
  const Arguments arguments(words, spec);
  if (arguments.has("--help")) {
    std::cout << kHelp;
    return 0;
  }
  if (arguments.positional().size() != 1) {
    throw InputError(arguments.positional().empty()
                         ? "give the study file: calivera run STUDY.cvstudy"
                         : "give one study file (got '" + arguments.positional()[1] + "' too)");
  }
  const std::string studyPath = arguments.positional().front();
  const StudyState study = readStudyFile(studyPath);
  // An input that changed since the study was saved still runs (the fingerprints in every output
  // are those of the files as read now), but the user is told before anything else.
  for (const std::string& note : study.pathNotes) {
    std::cerr << "warning: " << studyPath << ": " << note << '\n';
  }
  if (study.data && !study.data->database && !std::filesystem::exists(study.data->path)) {
    std::cerr << "warning: " << studyPath << ": cohort data " << study.data->path << " missing\n";
  }
  const StudyRequests requests = studyRequests(study);
  ValidateOutputs outputs = validateOutputsFrom(arguments);
  if (outputs.pdfPath) {
    outputs.reasonable = Interval{study.analysis.reasonableLo, study.analysis.reasonableHi};
    // The study's report settings (as the workstation last exported), unless an option is given.
    const ReportSettings& report = study.report;
    if (!arguments.has("--title")) outputs.title = report.title;
    if (!arguments.has("--suppress-below")) outputs.suppressBelow = report.suppressBelow;
    if (!arguments.has("--paper")) outputs.paper = report.paper;
    if (!arguments.has("--report-thresholds")) outputs.tableThresholds = report.thresholds;
    if (!arguments.has("--analyst")) outputs.analyst = report.analyst;
    if (!arguments.has("--reviewer")) outputs.reviewer = report.reviewer;
    // The report names the study it ran, by name and fingerprint.
    outputs.studyFile = FileFingerprint{studyPath, sha256OfFile(studyPath)};
  }
  // Inputs changed since the study was saved: checked once the run has read (and hashed) the
  // cohort, so a large cohort is hashed once.
  const auto warnChanged = [&](const ValidationRun& run) {
    for (const InputCheck& check : checkInputs(study, run.dataSha256)) {
      std::cerr << "warning: " << studyPath << ": " << check.role << " " << check.path << " "
                << check.problem << '\n';
    }
  };
  return executeValidation(requests.validation, requests.uncertainty, outputs,
                           reproduceCommandLine(study), warnChanged);
}

}  // namespace calivera::cli
