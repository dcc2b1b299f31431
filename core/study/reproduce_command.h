#pragma once
// The one `calivera validate ...` command line that reproduces a validation: built from the
// parsed request (the command line prints it under its own summary) or from a study (the
// workstation's "Reproduce" action, and `calivera run`, which executes exactly this request).
// Options at their defaults are left out, so the line stays short; every setting the numbers
// depend on is written out. Words are quoted for a POSIX shell only where they need it.

#include <optional>
#include <string>
#include <vector>

#include "core/metrics/validation_run.h"
#include "core/study/study.h"
#include "core/uncertainty/uncertainty_run.h"

namespace calivera {

// Where a model fitted in the workstation is written by the fit step of the reproducing line.
inline constexpr const char* kFittedModelFile = "fitted_model.json";

// The report options that `validate --pdf` takes; only written when a PDF is asked for.
struct ReportCommandOptions {
  std::optional<Interval> reasonableRange;
};

// Words after `calivera validate` (no output options). A request whose model is held in memory
// (fitted in the workstation) is written with --model kFittedModelFile.
std::vector<std::string> validateCommandWords(const ValidationRequest& validation,
                                              const UncertaintyRequest& uncertainty);

// Words after `calivera fit` that fit the study's model again into kFittedModelFile; none when
// the study's model comes from a file.
std::optional<std::vector<std::string>> fitCommandWords(const StudyState& study);

// The study as the command line's requests: the cohort and model files (or the fitted model held
// in the study), import settings, column mapping, groups, development-data statement, bootstrap,
// comparison, subgroups and sample-size thresholds. Throws InputError when the study has no
// cohort, outcome or model yet.
struct StudyRequests {
  ValidationRequest validation;
  UncertaintyRequest uncertainty;
};
StudyRequests studyRequests(const StudyState& study);

// One line for a POSIX shell: "calivera validate --data ... " (prefixed with the fit step and
// "&&" for a fitted model).
std::string reproduceCommandLine(const StudyState& study);
// The `calivera predictor-space ...` line for the study's Predictor space view (the chosen
// predictors, the values held by the user, the study's threshold); none before a predictor is
// chosen or for a risk column.
std::optional<std::string> predictorSpaceCommandLine(const StudyState& study);
// Words after `calivera pool`: `--set SET` when given, then each further summary's path, then the
// net benefit thresholds when chosen.
std::vector<std::string> poolCommandWords(const std::optional<std::string>& setPath,
                                          const std::vector<std::string>& summaryPaths,
                                          const std::vector<double>& netBenefitThresholds);
std::string commandLine(const std::string& command, const std::vector<std::string>& words);
std::string shellQuoted(const std::string& word);

}  // namespace calivera
