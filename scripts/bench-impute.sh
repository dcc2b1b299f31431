#!/usr/bin/env bash
# Whole-process benchmark of validation with missing predictor values (issue targets: --impute 20
# on 100,000 patients with 5 incomplete predictors under 10 s; pooling 50 stacked copies of
# 100,000 patients under 2 s). Each command runs as its own process under /usr/bin/time,
# interleaved with bench/whole/peer.py doing the same in pandas / scikit-learn, REPS times each;
# the table gives medians, the ratio Calivera / peer and the load average before each row:
#   validate --impute M     against IterativeImputer run M times, each copy validated, pooled
#   --imputation-column     M' stacked copies against pandas splitting the file and pooling them,
#                           with the 20-predictor model and again with a 6-predictor one
#
#   bash scripts/bench-impute.sh
#   CALIVERA_BENCH_ROWS=5000 CALIVERA_BENCH_COPIES=3 CALIVERA_BENCH_REPS=1 bash scripts/bench-impute.sh
#
# Sizes: CALIVERA_BENCH_ROWS (100000), _MISSING incomplete predictors (5), _IMPUTE M (20),
# _ITERATIONS K (10), _COPIES stacked (50); CALIVERA_BENCH_THREADS passes --threads (default: all
# cores). The model is fitted on the complete cohort (bench/whole/make_cohort.py) and validated on
# the same patients with values of x1..x5 blanked (--missing); the stacked file
# (bench/whole/make_stacked.py) holds that cohort COPIES + 1 times (51 x 100,000 rows: 0.8 GB).
# All are made once into CALIVERA_BENCH_DATA (default build/bench-data). At full size the peer's
# imputation takes minutes per run.
set -euo pipefail
cd "$(dirname "$0")/.."
ROWS=${CALIVERA_BENCH_ROWS:-100000}
MISSING=${CALIVERA_BENCH_MISSING:-5}
IMPUTE=${CALIVERA_BENCH_IMPUTE:-20}
ITERATIONS=${CALIVERA_BENCH_ITERATIONS:-10}
COPIES=${CALIVERA_BENCH_COPIES:-50}
REPS=${CALIVERA_BENCH_REPS:-3}
DATA=${CALIVERA_BENCH_DATA:-build/bench-data}
BIN=build/bin/calivera
PY=/usr/bin/python3
PEER=bench/whole/peer.py
OUT=${CALIVERA_BENCH_OUT:-build/bench-impute.md}
THREADS=(${CALIVERA_BENCH_THREADS:+--threads "$CALIVERA_BENCH_THREADS"})

# cohort, model, timed, row, peer_prerequisites: shared with the other bench scripts.
source scripts/bench-lib.sh
peer_prerequisites
mkdir -p "$DATA"
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT

made() {  # file command... : runs the command with file.part as its last argument, once
  local file=$1
  shift
  if [ ! -s "$file" ]; then
    echo "generating $file" >&2
    "$@" "$file.part"
    mv "$file.part" "$file"
  fi
}

fitted=$(model "$(cohort "$ROWS")")
incomplete="$DATA/cohort_${ROWS}m${MISSING}.csv"
stacked="$DATA/cohort_${ROWS}m${MISSING}s${COPIES}.csv"
made "$incomplete" $PY bench/whole/make_cohort.py "$ROWS" --missing "$MISSING"
made "$stacked" $PY bench/whole/make_stacked.py "$incomplete" "$COPIES"
# The same copies with a 6-predictor model's columns only (imputation, y, x1..x6): the file's
# width, not the number of copies, sets the reading time that dominates pooling.
narrow="$DATA/cohort_${ROWS}m${MISSING}s${COPIES}x6.csv"
fields=$(head -1 "$stacked" | tr ',' '\n' | grep -nxE 'imputation|y|x[1-6]' | cut -d: -f1 | paste -sd,)
made "$narrow" bash -c 'cut -d, -f"$1" "$2" > "$3"' _ "$fields" "$stacked"
narrowModel="${fitted%.model.json}.x1-x6.model.json"
if [ ! -s "$narrowModel" ]; then
  "$BIN" fit --data "${fitted%.model.json}.csv" --outcome y --predictors x1,x2,x3,x4,x5,x6 \
    --out "$narrowModel" >/dev/null
fi

{
  echo "Imputation benchmark, $(date -u +%Y-%m-%d), $(nproc) cores, $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2 | xargs),"
  echo "medians of $REPS interleaved runs; $MISSING of 20 predictors incomplete; peer = bench/whole/peer.py (pandas $($PY -c 'import pandas; print(pandas.__version__)'), scikit-learn $($PY -c 'import sklearn; print(sklearn.__version__)'))."
  echo
  echo "| workload | rows | Calivera | peak memory | peer | peer memory | ratio | load |"
  echo "| --- | --- | --- | --- | --- | --- | --- | --- |"
} | tee "$OUT"
row "validate --impute $IMPUTE --impute-iterations $ITERATIONS" "$ROWS" \
  "$BIN" validate --data "$incomplete" --outcome y --model "$fitted" --impute "$IMPUTE" \
  --impute-iterations "$ITERATIONS" --seed 1 "${THREADS[@]}" --json "$TMP/v.json" -- \
  $PY $PEER impute "$incomplete" "$fitted" "$IMPUTE" "$ITERATIONS"
row "validate --imputation-column ($COPIES stacked copies)" "$ROWS x $((COPIES + 1))" \
  "$BIN" validate --data "$stacked" --outcome y --model "$fitted" \
  --imputation-column imputation --json "$TMP/s.json" -- \
  $PY $PEER pool-stacked "$stacked" "$fitted" imputation
row "validate --imputation-column ($COPIES stacked copies, 6-predictor model)" \
  "$ROWS x $((COPIES + 1))" \
  "$BIN" validate --data "$narrow" --outcome y --model "$narrowModel" \
  --imputation-column imputation --json "$TMP/n.json" -- \
  $PY $PEER pool-stacked "$narrow" "$narrowModel" imputation
echo "table written to $OUT"
