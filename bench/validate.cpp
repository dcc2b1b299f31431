// Timing of validate() on 10^6 simulated patients with a risk column: the metrics alone, per
// part, and end to end through a CSV file (read, select, validate). Prints figures only.
#include <chrono>
#include <cmath>
#include <cstdio>
#include <ctime>
#include <filesystem>
#include <fstream>
#include <random>
#include <string>

#include "core/metrics/auc_delong.h"
#include "core/metrics/calibration_regression.h"
#include "core/metrics/decision_curve.h"
#include "core/metrics/hosmer_lemeshow.h"
#include "core/metrics/loess_calibration.h"
#include "core/metrics/roc_curve.h"
#include "core/metrics/sorted_cohort.h"
#include "core/metrics/threshold_table.h"
#include "core/metrics/validation.h"
#include "core/metrics/validation_run.h"

using namespace calivera;
using Clock = std::chrono::steady_clock;

namespace {

double secondsSince(Clock::time_point start) {
  return std::chrono::duration<double>(Clock::now() - start).count();
}

// Wall time and process CPU time: the machine is shared, so CPU time is the steadier figure for
// the single-threaded metrics (the CSV parse is multi-threaded and its CPU time sums threads).
template <typename F>
double timed(const char* label, F&& f) {
  const auto start = Clock::now();
  const std::clock_t cpuStart = std::clock();
  f();
  const double s = secondsSince(start);
  const double cpu = static_cast<double>(std::clock() - cpuStart) / CLOCKS_PER_SEC;
  std::printf("  %-36s wall %7.3f s   cpu %7.3f s\n", label, s, cpu);
  return s;
}

}  // namespace

int main(int argc, char** argv) {
  const std::size_t n = argc > 1 ? std::stoul(argv[1]) : 1000000;
  std::mt19937_64 generator(42);
  std::normal_distribution<double> lpDraw(-1.5, 1.3);
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  ValidationInput input;
  input.risk.reserve(n);
  input.outcome.reserve(n);
  for (std::size_t i = 0; i < n; ++i) {
    const double p = 1.0 / (1.0 + std::exp(-lpDraw(generator)));
    input.risk.push_back(p);
    input.outcome.push_back(unit(generator) < 0.9 * p + 0.02 ? 1.0 : 0.0);
  }
  std::printf("validate benchmark, n = %zu patients (risk column route)\n", n);
  std::printf("parts:\n");
  SortedCohort sorted;
  std::vector<double> lp(n);
  for (std::size_t i = 0; i < n; ++i) lp[i] = std::log(input.risk[i] / (1 - input.risk[i]));
  const std::vector<double> thresholds = thresholdRange(0.01, 0.99, 0.01);
  timed("sort (shared)", [&] { sorted = sortCohort(input.risk, input.outcome); });
  timed("AUC + DeLong SE", [&] { aucWithDelong(sorted); });
  timed("ROC curve + thinning", [&] { thinRocCurve(rocCurve(sorted), 2000); });
  timed("calibration intercept + slope", [&] { calibrationRegression(lp, input.outcome); });
  timed("loess (500-point grid)", [&] { loessCalibration(sorted, LoessOptions{}); });
  std::vector<std::string> warnings;
  timed("Hosmer-Lemeshow", [&] { hosmerLemeshow(sorted, 10, false, warnings); });
  timed("decision curve + threshold table", [&] {
    decisionCurve(sorted, thresholds);
    thresholdTable(sorted, thresholds);
  });
  std::printf("whole:\n");
  ValidationResult result;
  timed("validate() (all metrics)", [&] { result = validate(input, ValidationOptions{}); });
  std::printf("  AUC %.4f, slope %.3f, ICI %.4f\n", result.discrimination.auc,
              result.calibration.slope, result.calibration.ici);

  const std::string path =
      (std::filesystem::temp_directory_path() / "calivera_bench_validate.csv").string();
  {
    std::ofstream out(path);
    out << "id,outcome,risk\n";
    char line[64];
    for (std::size_t i = 0; i < n; ++i) {
      std::snprintf(line, sizeof line, "%zu,%d,%.10g\n", i + 1, static_cast<int>(input.outcome[i]),
                    input.risk[i]);
      out << line;
    }
  }
  std::printf("end to end (%.1f MB CSV):\n",
              static_cast<double>(std::filesystem::file_size(path)) / 1e6);
  ValidationRequest request;
  request.dataPath = path;
  request.outcome.column = "outcome";
  request.riskColumn = "risk";
  timed("runValidation (read+sha+validate)", [&] { runValidation(request); });
  std::filesystem::remove(path);
  return 0;
}
