#include "ui/workstation_entry.h"

#include <iostream>

#include "app/cli/commands.h"

namespace calivera::ui {

// Replaced by the main window once the workstation lands; until then the usage text is shown.
int runWorkstation(int, char**) {
  cli::printUsage();
  return 0;
}

}  // namespace calivera::ui
