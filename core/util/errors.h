#pragma once
// Error kinds at the input boundary. The command line maps InputError to exit status 2 and
// AnalysisError to exit status 1; the workstation shows either as a message and keeps the study.

#include <stdexcept>
#include <string>

namespace calivera {

// The user's input is malformed: a file, a field, an option. The message names the file, line and
// column (or the JSON field / option) so the user can find and fix it.
class InputError : public std::runtime_error {
 public:
  using std::runtime_error::runtime_error;
};

// The input is well formed but the analysis cannot be completed honestly (separation without
// Firth, one outcome class only, non-convergence).
class AnalysisError : public std::runtime_error {
 public:
  using std::runtime_error::runtime_error;
};

// A long computation was cancelled through its progress callback.
class Cancelled : public std::runtime_error {
 public:
  Cancelled() : std::runtime_error("cancelled") {}
};

}  // namespace calivera
