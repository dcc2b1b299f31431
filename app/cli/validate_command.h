#pragma once
// `calivera validate`: validation of a model (file) or of a risk column on a cohort CSV. Its
// parts are shared with `calivera run`, which executes a saved study as exactly the validate
// request the study stands for (core/study/reproduce_command.h), so both give the same outputs.

#include <cstddef>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "app/cli/arguments.h"
#include "core/metrics/validation_run.h"
#include "core/report/audit_report.h"
#include "core/uncertainty/uncertainty_run.h"

namespace calivera::cli {

// What a validation writes; nothing given: the text summary on stdout.
struct ValidateOutputs {
  std::optional<std::string> jsonPath;
  std::optional<std::string> csvDir;
  std::optional<std::string> pdfPath;
  std::string title;    // the report's title
  std::string analyst;  // the sign-off lines' names; empty: blank lines
  std::string reviewer;
  // The saved study the run came from (calivera run), named with its fingerprint in the report.
  std::optional<FileFingerprint> studyFile;
  std::size_t suppressBelow = 0;  // 0: off
  std::string paper = "a4";       // "a4" or "letter"
  std::optional<Interval> reasonable;
  // The report's threshold table rows; empty: defaultTableThresholds (core/report/audit_report.h).
  std::vector<double> tableThresholds;
};

void addValidateOptions(OptionSpec& spec);
// --suppress-below N within kSuppressBelowLimit; throws InputError naming the option.
std::size_t suppressBelowFrom(const std::string& value);
// Throw InputError naming the option for a bad value.
ValidationRequest validationRequestFrom(const Arguments& arguments);
ValidateOutputs validateOutputsFrom(const Arguments& arguments);

// Runs the validation and the uncertainty request and writes `outputs`; the summary ends with the
// reproducing command line (`reproduceLine`, or the validate line of the request when empty) and
// the caution. Returns the exit status (0); throws the core errors.
// `afterRun` is called with the validation run before anything is computed further or written.
int executeValidation(const ValidationRequest& request, const UncertaintyRequest& uncertainty,
                      const ValidateOutputs& outputs, const std::string& reproduceLine = {},
                      const std::function<void(const ValidationRun&)>& afterRun = {});

int runValidateCommand(const std::vector<std::string>& words);

}  // namespace calivera::cli
