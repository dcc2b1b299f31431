#pragma once
// Entry point of the desktop workstation, called by `calivera` when no headless command is given.

namespace calivera::ui {

int runWorkstation(int argc, char** argv);

}  // namespace calivera::ui
