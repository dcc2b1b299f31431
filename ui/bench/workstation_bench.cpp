// Benchmark of the workstation (figures printed, not a test): time to open the sample study and
// show every view, and the cost of a threshold move at 1,000,000 simulated patients — the update of
// every linked view (markers, confusion and natural-frequency panel, table highlight, predictor
// view), and the same plus a full repaint of the linked-views page; the uncertainty run (bootstrap
// and subgroups) on the sample study and a threshold move with its results shown. Run offscreen:
//   QT_QPA_PLATFORM=offscreen build/bin/calivera_bench_workstation [patients]
#include <QApplication>
#include <QElapsedTimer>
#include <QTemporaryDir>
#include <QTest>
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <random>
#include <vector>

#include "core/model/model_io.h"
#include "ui/async/background_job.h"
#include "ui/main_window.h"

using namespace calivera;
using namespace calivera::ui;

namespace {

void waitFor(MainWindow& w) {
  while (w.controller().job()->isRunning()) QTest::qWait(5);
}

void writeCohort(const std::string& path, long n) {
  std::mt19937 rng(5);
  std::normal_distribution<double> age(62, 11), marker(1.5, 0.8);
  std::uniform_real_distribution<double> u(0, 1);
  std::ofstream out(path);
  out << "age,sex,marker,died\n";
  for (long i = 0; i < n; ++i) {
    const double a = age(rng), m = marker(rng);
    const bool male = u(rng) < 0.5;
    const double lp = -6.5 + 0.07 * a + 0.45 * male + 0.3 * m;
    out << std::round(a * 10) / 10 << ',' << (male ? "male" : "female") << ','
        << std::round(m * 100) / 100 << ',' << (u(rng) < 1 / (1 + std::exp(-lp)) ? 1 : 0) << '\n';
  }
}

Model model() {
  Model m;
  m.name = "bench";
  m.intercept.coefficient = -6.5;
  auto term = [](const char* name, TransformKind kind, double b) {
    Term t;
    t.name = name;
    t.variable = name;
    t.kind = kind;
    t.estimate.coefficient = b;
    return t;
  };
  m.terms = {term("age", TransformKind::Linear, 0.07), term("marker", TransformKind::Linear, 0.3)};
  Term male = term("sex", TransformKind::Indicator, 0.45);
  male.name = "sex=male";
  male.level = "male";
  m.terms.push_back(male);
  return m;
}

struct Stats {
  double mean = 0, max = 0;
};

Stats stats(const std::vector<double>& v) {
  Stats s;
  for (double x : v) {
    s.mean += x / static_cast<double>(v.size());
    s.max = std::max(s.max, x);
  }
  return s;
}

}  // namespace

int main(int argc, char** argv) {
  QApplication app(argc, argv);
  const long patients = argc > 1 ? std::atol(argv[1]) : 1000000;

  {
    MainWindow w;
    w.resize(1280, 800);
    w.show();
    if (!QTest::qWaitForWindowExposed(&w)) return 1;
    QElapsedTimer t;
    t.start();
    w.controller().openStudy(QStringLiteral(CALIVERA_SOURCE_DIR "/resources/sample_study.cvstudy"));
    waitFor(w);
    (void)w.grab();  // lays out and paints every visible view
    std::printf("open sample study and show all views: %.0f ms (%zu patients)%s\n",
                static_cast<double>(t.nsecsElapsed()) / 1e6,
                w.controller().study().result ? w.controller().study().result->cohort.n : 0,
                w.controller().study().result ? "" : " FAILED");
    UncertaintySettings u;
    u.bootstrapReplicates = 200;
    u.subgroupColumns = {"site"};
    t.restart();
    w.controller().runUncertainty(u);
    waitFor(w);
    const bool ok = w.controller().study().uncertainty && w.controller().study().uncertainty->bootstrap;
    std::printf(
        "bootstrap (200 resamples, all cores) and subgroups by site on the sample study, shown: "
        "%.0f ms%s\n",
        static_cast<double>(t.nsecsElapsed()) / 1e6,
        ok ? "" : qPrintable(" FAILED: " + w.messageText()));
    std::vector<double> update;
    for (int i = 0; i < 100; ++i) {
      w.controller().setThreshold(0.02 + 0.9 * i / 99.0);
      update.push_back(w.lastThresholdUpdateMs());
    }
    const Stats s = stats(update);
    std::printf(
        "threshold move on the sample study with bands, overlays and subgroups shown: mean %.2f "
        "ms, max %.2f ms\n",
        s.mean, s.max);
  }

  QTemporaryDir dir;
  const std::string csv = dir.filePath("bench.csv").toStdString();
  const std::string json = dir.filePath("bench.json").toStdString();
  writeCohort(csv, patients);
  writeModelFile(json, model());
  MainWindow w;
  w.resize(1280, 800);
  w.show();
  if (!QTest::qWaitForWindowExposed(&w)) return 1;
  ImportSettings settings;
  settings.outcomeColumn = "died";
  QElapsedTimer t;
  t.start();
  w.controller().openInputs(QString::fromStdString(csv), QString::fromStdString(json), settings);
  waitFor(w);
  std::printf("read, validate and show %ld patients: %.0f ms%s\n", patients,
              static_cast<double>(t.nsecsElapsed()) / 1e6,
              w.controller().study().result ? "" : qPrintable(" FAILED: " + w.messageText()));
  QWidget* page = w.findChild<QWidget*>(QStringLiteral("linkedViewsPage"));
  std::vector<double> update, withPaint;
  for (int i = 0; i < 200; ++i) {
    const double threshold = 0.02 + 0.9 * i / 199.0;
    QElapsedTimer m;
    m.start();
    w.controller().setThreshold(threshold);
    update.push_back(w.lastThresholdUpdateMs());
    page->repaint();  // synchronous paint of the four charts and the panel
    withPaint.push_back(static_cast<double>(m.nsecsElapsed()) / 1e6);
  }
  const Stats u = stats(update), p = stats(withPaint);
  std::printf(
      "threshold move at %ld patients, every linked view updated: mean %.2f ms, max %.2f ms\n",
      patients, u.mean, u.max);
  std::printf(
      "threshold move including a full repaint of the linked views: mean %.2f ms, max %.2f ms\n",
      p.mean, p.max);
  return 0;
}
