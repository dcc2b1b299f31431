#!/usr/bin/env bash
# One command from a fresh clone to the whole test suite: install, build, run every test; then
# the core and command-line suite under AddressSanitizer and UndefinedBehaviorSanitizer, and each
# fuzzer for a bounded time (FUZZ_SECONDS, default 60). The main suite runs last, so its summary
# closes the output.
set -euo pipefail
cd "$(dirname "$0")/.."
# install-deps.sh installs the PostgreSQL 15 server, so the database tests must run here rather
# than report skipped (tests/database/with_postgres.sh); CALIVERA_REQUIRE_POSTGRES=0 allows the
# skip on a machine that cannot start a server.
export CALIVERA_REQUIRE_POSTGRES="${CALIVERA_REQUIRE_POSTGRES:-1}"
bash scripts/install-deps.sh
bash scripts/build.sh -DCALIVERA_WERROR=ON
bash scripts/sanitize.sh
bash scripts/fuzz.sh "${FUZZ_SECONDS:-60}"
export QT_QPA_PLATFORM=offscreen
ctest --test-dir build --output-on-failure -j 2
