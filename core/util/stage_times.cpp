#include "core/util/stage_times.h"

#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <mutex>
#include <string>

namespace calivera {
namespace {

using Clock = std::chrono::steady_clock;

bool enabled() {
  static const bool on = std::getenv("CALIVERA_STAGE_TIMES") != nullptr;
  return on;
}

}  // namespace

void markStage(std::string_view stage) {
  if (!enabled()) return;
  static std::mutex mutex;
  static const Clock::time_point first = Clock::now();
  static Clock::time_point previous = first;
  const std::lock_guard<std::mutex> lock(mutex);
  const Clock::time_point now = Clock::now();
  const auto ms = [](Clock::duration d) {
    return std::chrono::duration<double, std::milli>(d).count();
  };
  const std::string name(stage);
  std::fprintf(stderr, "stage %-28s %9.1f ms  (at %9.1f ms)\n", name.c_str(), ms(now - previous),
               ms(now - first));
  previous = now;
}

}  // namespace calivera
