// The real `calivera --help`, `--version` and a mistyped command word: the overview lists every
// command (the longest name, "predictor-space", once made it crash) and ends with the caution.
#include <gtest/gtest.h>

#include <string>

#include "app/cli/commands.h"
#include "core/present/caution.h"
#include "tests/unit/cli_run.h"

namespace calivera {
namespace {

using testing::runCalivera;

TEST(Usage, HelpListsEveryCommandAndEndsWithTheCaution) {
  for (const char* word : {"--help", "-h", "help"}) {
    const testing::CliRun run = runCalivera({word});
    ASSERT_EQ(run.status, 0) << word << ": " << run.err;
    for (const cli::Command& command : cli::allCommands()) {
      EXPECT_NE(run.out.find("  " + std::string(command.name) + "  "), std::string::npos)
          << command.name;
    }
    EXPECT_EQ(run.out.substr(run.out.size() - std::string(kCautionText).size() - 1),
              std::string(kCautionText) + "\n");
  }
}

TEST(Usage, VersionAndAMistypedCommand) {
  const testing::CliRun version = runCalivera({"--version"});
  EXPECT_EQ(version.status, 0);
  EXPECT_EQ(version.out, std::string("calivera ") + CALIVERA_VERSION + "\n");
  const testing::CliRun typo = runCalivera({"valdiate"});
  EXPECT_EQ(typo.status, 2);
  EXPECT_NE(typo.err.find("unknown command 'valdiate'"), std::string::npos) << typo.err;
}

}  // namespace
}  // namespace calivera
