#pragma once
// The headless commands. Each takes the words after the command name and returns the exit
// status: 0 success, 1 analysis could not be completed, 2 bad usage or bad input.

#include <string>
#include <vector>

namespace calivera::cli {

struct Command {
  const char* name;
  const char* summary;
  int (*run)(const std::vector<std::string>& words);
};

// Every command, in the order the usage text lists them.
const std::vector<Command>& allCommands();

// Runs `body`, mapping InputError to "error: ..." and exit 2, AnalysisError (and other failures)
// to "error: ..." and exit 1.
int runReportingErrors(int (*body)(const std::vector<std::string>&),
                       const std::vector<std::string>& words);

void printUsage();

// Non-empty when `word` (the first argument) is neither a command, an option nor a file the
// workstation could open: the message names the word and the commands.
std::string unknownCommandMessage(const std::string& word);

}  // namespace calivera::cli
