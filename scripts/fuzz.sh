#!/usr/bin/env bash
# Builds the libFuzzer targets with clang (address and undefined-behaviour sanitizers) into
# ./build-fuzz and runs each for SECONDS (default 60) from its seed corpus in fuzz/corpus/.
# New inputs go to build-fuzz/corpus-NAME (never into the repository's seeds); a crash leaves
# its input as build-fuzz/crash-* and fails the script.
#   bash scripts/fuzz.sh            # 60 s per target, as CI runs it
#   bash scripts/fuzz.sh 3600       # an hour per target, to fuzz longer
set -euo pipefail
cd "$(dirname "$0")/.."
seconds=${1:-60}
CC=clang CXX=clang++ cmake -S . -B build-fuzz -G Ninja -DCMAKE_BUILD_TYPE=None \
  -DCMAKE_CXX_FLAGS="-O1 -gline-tables-only" \
  -DCALIVERA_FUZZ=ON -DCALIVERA_BUILD_UI=OFF -DBUILD_TESTING=OFF >/dev/null
cmake --build build-fuzz -j "$(nproc 2>/dev/null || echo 2)" \
  --target calivera_fuzz_csv calivera_fuzz_model calivera_fuzz_study calivera_fuzz_summary
export ASAN_OPTIONS=detect_leaks=1:abort_on_error=1
export UBSAN_OPTIONS=halt_on_error=1:print_stacktrace=1
for name in csv model study summary; do
  corpus=build-fuzz/corpus-$name
  mkdir -p "$corpus"
  echo "fuzzing the $name reader for ${seconds}s"
  (cd build-fuzz && ./bin/calivera_fuzz_$name -max_total_time="$seconds" -timeout=10 \
    -rss_limit_mb=2048 -max_len=65536 -print_final_stats=1 \
    "corpus-$name" "../fuzz/corpus/$name" 2>&1 | tail -n 12)
done
