// Cohort import speed and memory: writes a deterministic N-row numeric cohort CSV (a 0/1 outcome
// and 21 predictors with realistic decimals) to the temporary folder, then times readCsvFile for
// N = 100,000 and 1,000,000 and prints the load time and the peak resident memory.
//
// Peak memory per load is read from /proc/self/status (VmHWM) after resetting it through
// /proc/self/clear_refs; getrusage's ru_maxrss (process peak, never reset) is printed at the end.

#include <sys/resource.h>

#include <algorithm>
#include <charconv>
#include <chrono>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <random>
#include <string>
#include <vector>

#include "core/data/csv_reader.h"

namespace {

constexpr int kPredictors = 21;

// Appends `value` with `decimals` digits after the point.
void appendFixed(std::string& out, double value, int decimals) {
  char buffer[32];
  const auto result =
      std::to_chars(buffer, buffer + sizeof buffer, value, std::chars_format::fixed, decimals);
  out.append(buffer, result.ptr);
}

// With `quoted`, the header names are written in quotes, which sends the file through the
// sequential RFC 4180 path instead of the parallel quote-free one.
std::filesystem::path writeCohort(std::size_t rows, bool quoted) {
  const std::filesystem::path path = std::filesystem::temp_directory_path() /
                                     ("calivera_bench_load_" + std::to_string(rows) + ".csv");
  std::ofstream out(path, std::ios::binary | std::ios::trunc);
  std::mt19937_64 random(12345);
  std::normal_distribution<double> normal(0.0, 1.0);
  std::uniform_real_distribution<double> uniform(0.0, 1.0);
  const std::string quote = quoted ? "\"" : "";
  std::string buffer = quote + "outcome" + quote;
  for (int k = 1; k <= kPredictors; ++k) buffer += "," + quote + "x" + std::to_string(k) + quote;
  buffer += '\n';
  for (std::size_t r = 0; r < rows; ++r) {
    buffer += uniform(random) < 0.2 ? '1' : '0';
    for (int k = 0; k < kPredictors; ++k) {
      buffer += ',';
      switch (k % 3) {
        case 0:  // a measurement such as blood pressure or a laboratory value
          appendFixed(buffer, 120.0 + 25.0 * normal(random), 2);
          break;
        case 1:  // a standardised score
          appendFixed(buffer, normal(random), 4);
          break;
        default:  // a concentration
          appendFixed(buffer, 10.0 + 80.0 * uniform(random), 3);
          break;
      }
    }
    buffer += '\n';
    if (buffer.size() > (1U << 20)) {
      out.write(buffer.data(), static_cast<std::streamsize>(buffer.size()));
      buffer.clear();
    }
  }
  out.write(buffer.data(), static_cast<std::streamsize>(buffer.size()));
  return path;
}

// Resets the kernel's peak-RSS mark for this process (Linux >= 4.0); false when not possible.
bool resetPeakMemory() {
  std::ofstream clear("/proc/self/clear_refs");
  clear << "5";
  return static_cast<bool>(clear);
}

// Peak resident memory in MiB since the last reset (VmHWM), or -1 when unknown.
double cpuSeconds() {
  rusage usage{};
  getrusage(RUSAGE_SELF, &usage);
  const auto seconds = [](const timeval& t) { return t.tv_sec + t.tv_usec / 1e6; };
  return seconds(usage.ru_utime) + seconds(usage.ru_stime);
}

// A memory figure of /proc/self/status in MiB ("VmHWM:" peak since the last reset, "VmRSS:"
// now), or -1 when unknown.
double statusMiB(const std::string& key) {
  std::ifstream status("/proc/self/status");
  std::string line;
  while (std::getline(status, line)) {
    if (line.rfind(key, 0) == 0) return std::stod(line.substr(key.size())) / 1024.0;
  }
  return -1.0;
}

// The machine is shared; the figures mean little without knowing how busy it was.
std::string loadAverage() {
  std::ifstream in("/proc/loadavg");
  std::string one;
  in >> one;
  return one.empty() ? "unknown" : one;
}

void measure(std::size_t rows, bool quoted, int repeats) {
  const std::filesystem::path path = writeCohort(rows, quoted);
  const double fileMiB = static_cast<double>(std::filesystem::file_size(path)) / (1024.0 * 1024.0);
  const double numericMiB = static_cast<double>(rows) * (kPredictors + 1) * 8 / (1024.0 * 1024.0);
  double best = 1e30;
  double bestCpu = 1e30;
  double peak = 0.0;
  double before = 0.0;
  unsigned threads = 0;
  for (int repeat = 0; repeat < repeats; ++repeat) {
    const bool reset = resetPeakMemory();
    before = statusMiB("VmRSS:");
    const double cpuStart = cpuSeconds();
    const auto start = std::chrono::steady_clock::now();
    const calivera::CsvReadResult result = calivera::readCsvFile(path.string(), {});
    const std::chrono::duration<double> elapsed = std::chrono::steady_clock::now() - start;
    best = std::min(best, elapsed.count());
    bestCpu = std::min(bestCpu, cpuSeconds() - cpuStart);
    if (reset) peak = std::max(peak, statusMiB("VmHWM:"));
    threads = result.threadsUsed;
    if (result.table.rowCount != rows) std::cerr << "row count mismatch\n";
  }
  std::filesystem::remove(path);
  std::printf(
      "%9zu rows x %d columns, file %.1f MiB: load %.3f s wall (best of %d, %u threads, "
      "%.0f MiB/s), %.3f s CPU; peak RSS %.1f MiB (%.1f before) = %.2f x the numeric data "
      "(%.1f MiB)\n",
      rows, kPredictors + 1, fileMiB, best, repeats, threads, fileMiB / best, bestCpu, peak, before,
      peak / numericMiB, numericMiB);
}

}  // namespace

int main(int argc, char** argv) {
  std::printf("calivera_bench_load: readCsvFile on generated numeric cohorts (load average %s)\n",
              loadAverage().c_str());
  if (argc > 1) {  // one size only, e.g. for a profiler
    measure(std::stoul(argv[1]), false, 3);
  } else {
    measure(100000, false, 3);
    measure(1000000, false, 3);
    std::printf("same cohorts with quoted header names (sequential path):\n");
    measure(100000, true, 1);
    measure(1000000, true, 1);
  }
  rusage usage{};
  getrusage(RUSAGE_SELF, &usage);
  std::printf("process peak RSS (getrusage ru_maxrss): %.1f MiB\n",
              static_cast<double>(usage.ru_maxrss) / 1024.0);
  return 0;
}
