// calivera: with a command word it runs headless; otherwise it opens the workstation.
#include <iostream>
#include <string>
#include <string_view>
#include <vector>

#include "app/cli/commands.h"
#include "app/heap_policy.h"
#include "core/util/stage_times.h"
#ifdef CALIVERA_HAVE_UI
#include "ui/workstation_entry.h"
#endif

namespace {

bool namesCommand(const char* word) {
  for (const auto& command : calivera::cli::allCommands()) {
    if (std::string_view(command.name) == word) return true;
  }
  return false;
}

}  // namespace

int main(int argc, char** argv) {
  calivera::applyHeapPolicy(argc > 1 && namesCommand(argv[1]) ? calivera::ProcessKind::Command
                                                              : calivera::ProcessKind::Workstation);
  calivera::markStage("process start");
  const std::vector<std::string> words(argv + 1, argv + argc);
  if (!words.empty()) {
    if (words[0] == "--help" || words[0] == "-h" || words[0] == "help") {
      calivera::cli::printUsage();
      return 0;
    }
    if (words[0] == "--version") {
      std::cout << "calivera " << CALIVERA_VERSION << '\n';
      return 0;
    }
    for (const auto& command : calivera::cli::allCommands()) {
      if (words[0] == command.name) {
        return calivera::cli::runReportingErrors(
            command.run, std::vector<std::string>(words.begin() + 1, words.end()));
      }
    }
    // A bare word that is neither a command nor a file (a study to open) is a mistyped command:
    // say so here rather than let the workstation report an unrelated problem.
    if (const std::string hint = calivera::cli::unknownCommandMessage(words[0]); !hint.empty()) {
      std::cerr << "error: " << hint << '\n';
      return 2;
    }
  }
#ifdef CALIVERA_HAVE_UI
  return calivera::ui::runWorkstation(argc, argv);
#else
  calivera::cli::printUsage();
  return words.empty() ? 0 : 2;
#endif
}
