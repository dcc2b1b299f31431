#!/usr/bin/env bash
# Whole-process benchmark (issue 13): what a user waits for. Each command runs as its own
# process under /usr/bin/time (wall time, peak resident memory), interleaved with a peer doing
# the same work in pandas / numpy / scikit-learn (bench/whole/peer.py), REPS times each; the
# table gives medians, the ratio Calivera / peer and the load average before each row.
#
#   bash scripts/bench-whole.sh            # 100,000 and 1,000,000 rows
#   CALIVERA_BENCH_SIZES="100000 1000000 10000000" bash scripts/bench-whole.sh
#
# Needs a built tree (scripts/build.sh) and Debian's python3-pandas and python3-sklearn (installed
# here when missing and run as root). Cohorts are synthetic (bench/whole/make_cohort.py) and are
# generated once into CALIVERA_BENCH_DATA (default build/bench-data; 10^7 rows take 1.6 GB).
# CALIVERA_BENCH_RESAMPLING=no leaves out the two 200-resample rows (at 100,000 rows), e.g. for
# a run at 10^7 rows only. With CALIVERA_STAGE_TIMES=1 set, Calivera also prints where its time
# goes.
set -euo pipefail
cd "$(dirname "$0")/.."
SIZES=${CALIVERA_BENCH_SIZES:-"100000 1000000"}
REPS=${CALIVERA_BENCH_REPS:-3}
DATA=${CALIVERA_BENCH_DATA:-build/bench-data}
BIN=build/bin/calivera
PY=/usr/bin/python3
PEER=bench/whole/peer.py
OUT=${CALIVERA_BENCH_OUT:-build/bench-whole.md}

# cohort, model, timed, row, peer_prerequisites: shared with the other bench scripts.
source scripts/bench-lib.sh
peer_prerequisites
mkdir -p "$DATA"
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT

{
  echo "Whole-process benchmark, $(date -u +%Y-%m-%d), $(nproc) cores, $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2 | xargs),"
  echo "medians of $REPS interleaved runs; peer = bench/whole/peer.py (pandas $($PY -c 'import pandas; print(pandas.__version__)'), scikit-learn $($PY -c 'import sklearn; print(sklearn.__version__)'))."
  echo
  echo "| workload | rows | Calivera | peak memory | peer | peer memory | ratio | load |"
  echo "| --- | --- | --- | --- | --- | --- | --- | --- |"
} | tee "$OUT"

for n in $SIZES; do
  data=$(cohort "$n")
  fitted=$(model "$data")
  row "validate --risk" "$n" "$BIN" validate --data "$data" --outcome y --risk risk \
    --json "$TMP/v.json" -- $PY $PEER validate-risk "$data"
  row "validate --model (20 terms)" "$n" "$BIN" validate --data "$data" --outcome y \
    --model "$fitted" --json "$TMP/v.json" -- $PY $PEER validate-model "$data" "$fitted"
  row "fit (20 predictors)" "$n" "$BIN" fit --data "$data" --outcome y \
    --predictors "$(seq -s, -f 'x%g' 1 20)" --out "$TMP/m.json" -- $PY $PEER fit "$data" "$TMP/p.json"
done
if [ "${CALIVERA_BENCH_RESAMPLING:-yes}" = no ]; then
  echo "table written to $OUT"
  exit 0
fi
data=$(cohort 100000)
row "validate --bootstrap 200" 100000 "$BIN" validate --data "$data" --outcome y --risk risk \
  --bootstrap 200 --seed 1 --json "$TMP/v.json" -- $PY $PEER validate-bootstrap "$data" 200
data=$(cohort 100000 10)
fitted=$(model "$data")
row "internal --bootstrap 200 (10 predictors)" 100000 "$BIN" internal --data "$data" --outcome y \
  --model "$fitted" --bootstrap 200 --json "$TMP/i.json" -- $PY $PEER internal "$data" 200
echo "table written to $OUT"
