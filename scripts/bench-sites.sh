#!/usr/bin/env bash
# Whole-process benchmark of validation across sites (issue 15): what a user waits for, each
# command its own process under /usr/bin/time, interleaved with the peer stated on its row:
#   summarize   against validate on the same 10^6-row cohort (the target: no dearer);
#   pool        of 100 site summaries against validate --cluster on the same patients in one
#               file (the target: under a second).
#
#   bash scripts/bench-sites.sh
#
# Needs a built tree (scripts/build.sh). Cohorts are synthetic (bench/whole/make_cohort.py),
# made once into CALIVERA_BENCH_DATA (default build/bench-data); the 100 sites are its rows dealt
# round-robin (site = row number mod 100), 10,000 patients each.
set -euo pipefail
cd "$(dirname "$0")/.."
REPS=${CALIVERA_BENCH_REPS:-3}
DATA=${CALIVERA_BENCH_DATA:-build/bench-data}
BIN=build/bin/calivera
PY=/usr/bin/python3
OUT=${CALIVERA_BENCH_OUT:-build/bench-sites.md}
[ -x "$BIN" ] || { echo "no $BIN; run scripts/build.sh first" >&2; exit 1; }
mkdir -p "$DATA"
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
source scripts/bench-lib.sh

n=1000000
data=$(cohort "$n")
fitted=$(model "$data")
sites="$DATA/sites100"
if [ ! -s "$sites/site_99.cvsummary" ]; then
  echo "splitting $data into 100 sites and summarizing each" >&2
  rm -rf "$sites"
  mkdir -p "$sites"
  awk -F, -v dir="$sites" 'NR == 1 { header = $0; print $0 ",site" > (dir "/all.csv"); next }
    { s = (NR - 2) % 100; f = dir "/site_" s ".csv";
      if (!(f in seen)) { print header > f; seen[f] = 1 }
      print $0 > f; print $0 ",S" s > (dir "/all.csv") }' "$data"
  for s in $(seq 0 99); do
    "$BIN" summarize --data "$sites/site_$s.csv" --outcome y --model "$fitted" --site "S$s" \
      --out "$sites/site_$s.cvsummary" >/dev/null
  done
fi

{
  echo "Sites benchmark, $(date -u +%Y-%m-%d), $(nproc) cores, medians of $REPS interleaved runs."
  echo
  echo "| workload | rows | Calivera | peak memory | peer (stated) | peer memory | ratio | load |"
  echo "| --- | --- | --- | --- | --- | --- | --- | --- |"
} | tee "$OUT"
row "summarize --model (20 terms); peer: validate --model" "$n" \
  "$BIN" summarize --data "$data" --outcome y --model "$fitted" --out "$TMP/s.cvsummary" -- \
  "$BIN" validate --data "$data" --outcome y --model "$fitted" --json "$TMP/v.json"
row "summarize --risk; peer: validate --risk" "$n" \
  "$BIN" summarize --data "$data" --outcome y --risk risk --out "$TMP/r.cvsummary" -- \
  "$BIN" validate --data "$data" --outcome y --risk risk --json "$TMP/v.json"
summaries=()
for s in $(seq 0 99); do summaries+=("$sites/site_$s.cvsummary"); done
row "pool 100 summaries; peer: validate --cluster (100 sites, one file)" "$n" \
  "$BIN" pool "${summaries[@]}" --json "$TMP/p.json" -- \
  "$BIN" validate --data "$sites/all.csv" --outcome y --model "$fitted" --cluster site \
  --json "$TMP/c.json"
echo "table written to $OUT"
