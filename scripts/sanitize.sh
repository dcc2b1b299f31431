#!/usr/bin/env bash
# The core and command-line test suite under AddressSanitizer and UndefinedBehaviorSanitizer
# (gcc, -fsanitize=address,undefined), in ./build-asan. Any report fails the run.
set -euo pipefail
cd "$(dirname "$0")/.."
cmake -S . -B build-asan -G Ninja -DCMAKE_BUILD_TYPE=None -DCMAKE_CXX_FLAGS="-O1 -g1" \
  -DCALIVERA_SANITIZE=ON \
  -DCALIVERA_BUILD_UI=OFF -DCALIVERA_WERROR=ON >/dev/null
cmake --build build-asan -j "$(nproc 2>/dev/null || echo 2)" --target calivera calivera_tests
export ASAN_OPTIONS=detect_leaks=1:abort_on_error=1
export UBSAN_OPTIONS=halt_on_error=1:print_stacktrace=1
ctest --test-dir build-asan --output-on-failure -j "$(nproc 2>/dev/null || echo 2)"
