#!/usr/bin/env bash
# One command from a fresh clone to the whole test suite: install, build, run every test; then
# the core and command-line suite under AddressSanitizer and UndefinedBehaviorSanitizer, and each
# fuzzer for a bounded time (FUZZ_SECONDS, default 60). The main suite runs last, so its summary
# closes the output.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/install-deps.sh
bash scripts/build.sh -DCALIVERA_WERROR=ON
bash scripts/sanitize.sh
bash scripts/fuzz.sh "${FUZZ_SECONDS:-60}"
export QT_QPA_PLATFORM=offscreen
ctest --test-dir build --output-on-failure -j 2
