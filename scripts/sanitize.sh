#!/usr/bin/env bash
# AddressSanitizer (with LeakSanitizer) and UndefinedBehaviorSanitizer (gcc,
# -fsanitize=address,undefined) over two suites; any report fails the run:
#   1. the core and command-line suite, in ./build-asan (UI off);
#   2. the workstation's Qt tests, offscreen, in ./build-asan-ui (UI on, only the Qt test targets:
#      the GoogleTest suite already ran in 1).
set -euo pipefail
cd "$(dirname "$0")/.."
jobs="$(nproc 2>/dev/null || echo 2)"
export ASAN_OPTIONS=detect_leaks=1:abort_on_error=1
export UBSAN_OPTIONS=halt_on_error=1:print_stacktrace=1
# Leaks inside Debian libraries (each explained in the file) are not ours to fix.
export LSAN_OPTIONS="suppressions=$PWD/scripts/lsan-suppressions.txt"

cmake -S . -B build-asan -G Ninja -DCMAKE_BUILD_TYPE=None -DCMAKE_CXX_FLAGS="-O1 -g1" \
  -DCALIVERA_SANITIZE=ON \
  -DCALIVERA_BUILD_UI=OFF -DCALIVERA_WERROR=ON >/dev/null
cmake --build build-asan -j "$jobs" --target calivera calivera_tests calivera_database_tests
ctest --test-dir build-asan --output-on-failure -j "$jobs"

cmake -S . -B build-asan-ui -G Ninja -DCMAKE_BUILD_TYPE=None -DCMAKE_CXX_FLAGS="-O1 -g1" \
  -DCALIVERA_SANITIZE=ON \
  -DCALIVERA_BUILD_UI=ON -DCALIVERA_WERROR=ON >/dev/null
cmake --build build-asan-ui -j "$jobs" --target calivera calivera_ui_tests
QT_QPA_PLATFORM=offscreen ctest --test-dir build-asan-ui --output-on-failure -L ui -j "$jobs"
