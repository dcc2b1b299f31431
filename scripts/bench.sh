#!/usr/bin/env bash
# Runs every benchmark executable and prints its figures. Build first (scripts/build.sh).
set -euo pipefail
cd "$(dirname "$0")/.."
shopt -s nullglob
export QT_QPA_PLATFORM=${QT_QPA_PLATFORM:-offscreen}
benches=(build/bin/calivera_bench_*)
if [ ${#benches[@]} -eq 0 ]; then
  echo "no benchmarks built; run scripts/build.sh first" >&2
  exit 1
fi
echo "date: $(date -u +%Y-%m-%dT%H:%MZ)  cores: $(nproc)  cpu: $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2 | xargs)"
for b in "${benches[@]}"; do
  echo "== $(basename "$b")"
  "$b"
done
