#pragma once
// The uncertainty options of `calivera validate` (bootstrap intervals, model comparison,
// subgroups, sample-size adequacy), kept apart from the validate command's own options:
//   --bootstrap B          percentile bootstrap 95% CIs and bands from B resamples
//   --seed S               bootstrap seed (default 1); same seed, same result for any --threads
//   --threads N            bootstrap threads (default: all cores)
//   --compare MODEL.json   compare a further model on the same patients (repeatable; a second
//                          --model does the same)
//   --subgroup COLUMN      every measure per level of COLUMN (repeatable)
//   --size-thresholds T,.. thresholds for the net-benefit sample-size criterion

#include <cstdint>
#include <optional>
#include <ostream>
#include <string>

#include "app/cli/arguments.h"
#include "core/uncertainty/uncertainty_run.h"

namespace calivera::cli {

void addUncertaintyOptions(OptionSpec& spec);

// Throws InputError naming the option for a bad value. Every --model after the first becomes a
// comparison model.
UncertaintyRequest uncertaintyRequest(const Arguments& args);

// --seed and --threads (shared by the bootstrap and --impute); std::nullopt when not given.
// Throw InputError for a value out of range.
std::optional<std::uint64_t> seedOption(const Arguments& args,
                                        const std::string& option = "--seed");
std::optional<unsigned> threadsOption(const Arguments& args);

// The first --model (the validated one); std::nullopt without --model.
std::optional<std::string> primaryModelPath(const Arguments& args);

// Text summary: the sample-size verdict (printed before the results), then intervals,
// comparison and subgroups.
void printSampleSizeSummary(std::ostream& out, const UncertaintyResults& results);
void printUncertaintySummary(std::ostream& out, const UncertaintyResults& results);

// The validation JSON with the uncertainty keys added (indented, trailing newline).
std::string validationJsonText(const ValidationRun& run, const UncertaintyResults& results);

// Help lines for the options above.
const char* uncertaintyOptionsHelp();

}  // namespace calivera::cli
