#include "app/cli/commands.h"

#include <algorithm>
#include <filesystem>
#include <iostream>
#include <string>

#include "app/cli/fit_command.h"
#include "app/cli/internal_command.h"
#include "app/cli/pool_command.h"
#include "app/cli/predictor_space_command.h"
#include "app/cli/run_command.h"
#include "app/cli/summarize_command.h"
#include "app/cli/update_command.h"
#include "app/cli/validate_command.h"
#include "core/present/caution.h"
#include "core/util/errors.h"

namespace calivera::cli {

// Each command's file defines its entry point; register it here, one line each.
const std::vector<Command>& allCommands() {
  static const std::vector<Command> commands = {
      {"fit", "fit a logistic model to a cohort and write a model file", runFitCommand},
      {"validate", "performance of a model or risk column on a cohort", runValidateCommand},
      {"update", "update a model on local data (intercept, recalibrate, refit)", runUpdateCommand},
      {"internal", "bootstrap optimism correction of a locally fitted model", runInternalCommand},
      {"run", "run a study saved by the workstation, with all its settings", runRunCommand},
      {"predictor-space", "predicted risk against one or two predictors, others held fixed",
       runPredictorSpaceCommand},
      {"summarize", "one site's validation as an aggregate-only summary for pooling",
       runSummarizeCommand},
      {"pool", "pool site summaries across sites (random-effects meta-analysis)", runPoolCommand},
  };
  return commands;
}

int runReportingErrors(int (*body)(const std::vector<std::string>&),
                       const std::vector<std::string>& words) {
  try {
    // `calivera COMMAND -h` asks for the command's help like --help.
    if (words.size() == 1 && words[0] == "-h") return body({"--help"});
    return body(words);
  } catch (const InputError& error) {
    std::cerr << "error: " << error.what() << '\n';
    return 2;
  } catch (const AnalysisError& error) {
    std::cerr << "error: " << error.what() << '\n';
    return 1;
  } catch (const Cancelled&) {
    std::cerr << "error: cancelled\n";
    return 1;
  } catch (const std::exception& error) {
    std::cerr << "error: " << error.what() << '\n';
    return 1;
  }
}

std::string unknownCommandMessage(const std::string& word) {
  if (word.empty() || word[0] == '-') return {};
  std::error_code ignored;
  if (word.find('/') != std::string::npos || word.find('.') != std::string::npos ||
      std::filesystem::exists(word, ignored)) {
    return {};  // a file to open in the workstation
  }
  std::string known;
  for (const Command& command : allCommands()) {
    known += (known.empty() ? "" : ", ") + std::string(command.name);
  }
  return "unknown command '" + word + "' (commands: " + known +
         "; 'calivera --help' describes them)";
}

void printUsage() {
  std::cout << "Calivera " << CALIVERA_VERSION
            << " - validate a clinical risk-prediction model on a local cohort\n\n"
               "usage: calivera                      open the workstation\n"
               "       calivera COMMAND [options]    run headless\n\n"
               "commands:\n";
  std::size_t width = 0;  // the longest command name ("predictor-space") sets the column
  for (const Command& command : allCommands()) {
    width = std::max(width, std::string(command.name).size());
  }
  for (const Command& command : allCommands()) {
    const std::string name = command.name;
    std::cout << "  " << name << std::string(width + 2 - name.size(), ' ') << command.summary
              << '\n';
  }
  std::cout << "\nRun 'calivera COMMAND --help' for a command's options.\n" << kCautionText << '\n';
}

}  // namespace calivera::cli
