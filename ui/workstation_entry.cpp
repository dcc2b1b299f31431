#include "ui/workstation_entry.h"

#include <QApplication>
#include <QFileInfo>
#include <QTimer>
#include <cstdlib>
#include <iostream>
#include <string>

#include "ui/main_window.h"

namespace calivera::ui {

namespace {

// Without a display Qt would abort with a terse platform-plugin error; explain the choices instead.
bool displayAvailable() {
  auto set = [](const char* name) {
    const char* v = std::getenv(name);
    return v != nullptr && *v != '\0';
  };
  return set("DISPLAY") || set("WAYLAND_DISPLAY") || set("QT_QPA_PLATFORM");
}

constexpr const char* kNoDisplay =
    "calivera: no display found (DISPLAY and WAYLAND_DISPLAY are unset), so the workstation "
    "cannot open a window.\n"
    "  - To run the analysis without a window, use a headless command, e.g.\n"
    "      calivera validate --data cohort.csv --model model.json --outcome died\n"
    "    (`calivera --help` lists every command).\n"
    "  - To run the workstation without a screen (tests, screenshots), set\n"
    "      QT_QPA_PLATFORM=offscreen calivera ...\n";

constexpr const char* kUsage =
    "usage: calivera                       open the workstation\n"
    "       calivera STUDY.cvstudy         open a saved study\n"
    "       calivera --data COHORT.csv [--model MODEL.json] [--outcome COLUMN] [--event VALUE]\n"
    "                                      open the workstation with these inputs\n";

struct EntryOptions {
  QString study, data, model, outcome, event;
};

// Returns false (after printing why) on an unknown option or a missing value.
bool parse(const QStringList& args, EntryOptions& out) {
  for (int i = 1; i < args.size(); ++i) {
    const QString& a = args[i];
    auto value = [&](QString& target) {
      if (i + 1 >= args.size()) {
        std::cerr << "calivera: " << a.toStdString() << " needs a value\n" << kUsage;
        return false;
      }
      target = args[++i];
      return true;
    };
    if (a == "--data") {
      if (!value(out.data)) return false;
    } else if (a == "--model") {
      if (!value(out.model)) return false;
    } else if (a == "--outcome") {
      if (!value(out.outcome)) return false;
    } else if (a == "--event") {
      if (!value(out.event)) return false;
    } else if (!a.startsWith("--") && out.study.isEmpty()) {
      out.study = a;
    } else {
      std::cerr << "calivera: unknown option or command '" << a.toStdString() << "'\n" << kUsage;
      return false;
    }
  }
  if (!out.study.isEmpty() && !out.data.isEmpty()) {
    std::cerr << "calivera: give either a study file or --data, not both\n" << kUsage;
    return false;
  }
  if (out.data.isEmpty() && (!out.model.isEmpty() || !out.outcome.isEmpty())) {
    std::cerr << "calivera: --model and --outcome need --data\n" << kUsage;
    return false;
  }
  return true;
}

}  // namespace

int runWorkstation(int argc, char** argv) {
  if (!displayAvailable()) {
    std::cerr << kNoDisplay;
    return 2;
  }
  QApplication app(argc, argv);
  QApplication::setApplicationName(QStringLiteral("Calivera"));
  QApplication::setOrganizationName(QStringLiteral("Calivera"));
  EntryOptions options;
  if (!parse(QApplication::arguments(), options)) return 2;

  MainWindow window;
  window.restoreWindowState();
  window.show();
  if (!options.study.isEmpty()) {
    window.controller().openStudy(options.study);
  } else if (!options.data.isEmpty()) {
    ImportSettings settings;
    settings.outcomeColumn = options.outcome.toStdString();
    if (!options.event.isEmpty()) settings.eventValue = options.event.toStdString();
    window.controller().openInputs(options.data, options.model, settings);
  }
  return QApplication::exec();
}

}  // namespace calivera::ui
