// calivera: with a command word it runs headless; otherwise it opens the workstation.
#include <string>
#include <vector>

#include "app/cli/commands.h"
#ifdef CALIVERA_HAVE_UI
#include "ui/workstation_entry.h"
#endif

int main(int argc, char** argv) {
  const std::vector<std::string> words(argv + 1, argv + argc);
  if (!words.empty()) {
    if (words[0] == "--help" || words[0] == "-h" || words[0] == "help") {
      calivera::cli::printUsage();
      return 0;
    }
    for (const auto& command : calivera::cli::allCommands()) {
      if (words[0] == command.name) {
        return calivera::cli::runReportingErrors(
            command.run, std::vector<std::string>(words.begin() + 1, words.end()));
      }
    }
  }
#ifdef CALIVERA_HAVE_UI
  return calivera::ui::runWorkstation(argc, argv);
#else
  calivera::cli::printUsage();
  return words.empty() ? 0 : 2;
#endif
}
