#!/usr/bin/env bash
# PostgreSQL row mode against the CSV route (issue 16): the same synthetic cohort
# (bench/whole/make_cohort.py) as a CSV file and as a table in a throwaway PostgreSQL 15 server
# (tests/database/with_postgres.sh starts and stops it), each validated by its own calivera
# process under /usr/bin/time, REPS interleaved runs; the table gives medians of wall time and
# peak memory and their ratio (scripts/bench-lib.sh's row, with the CSV route as the peer).
#
#   bash scripts/bench-database.sh                           # 1,000,000 rows
#   CALIVERA_BENCH_SIZES="100000 1000000" bash scripts/bench-database.sh
#
# Needs a built tree (scripts/build.sh). The server runs on this machine, over its Unix socket.
set -euo pipefail
cd "$(dirname "$0")/.."
if [ -z "${CALIVERA_PG_ADMIN_URI:-}" ]; then
  CALIVERA_REQUIRE_POSTGRES=1 exec tests/database/with_postgres.sh bash "$0" "$@"
fi
SIZES=${CALIVERA_BENCH_SIZES:-"1000000"}
REPS=${CALIVERA_BENCH_REPS:-3}
DATA=${CALIVERA_BENCH_DATA:-build/bench-data}
BIN=build/bin/calivera
PY=/usr/bin/python3
OUT=${CALIVERA_BENCH_OUT:-build/bench-database.md}
source scripts/bench-lib.sh
peer_prerequisites
mkdir -p "$DATA"
TMP=$(mktemp -d)
trap 'rm -rf "$TMP"' EXIT
URI=$CALIVERA_PG_ADMIN_URI

{
  echo "PostgreSQL row mode against CSV, $(date -u +%Y-%m-%d), $(nproc) cores, PostgreSQL $(psql -X -A -t "$URI" -c 'SHOW server_version'),"
  echo "medians of $REPS interleaved runs; both read the same synthetic cohort (22 columns)."
  echo
  echo "| workload | rows | from PostgreSQL | peak memory | from CSV | peak memory | ratio | load |"
  echo "| --- | --- | --- | --- | --- | --- | --- | --- |"
} | tee "$OUT"

for n in $SIZES; do
  data=$(cohort "$n")
  fitted=$(model "$data")
  table="cohort_$n"
  columns=$(head -1 "$data" | tr ',' '\n' | awk '{print $1 (NR == 1 ? " integer" : " double precision")}' | paste -sd, -)
  psql -X -q -v ON_ERROR_STOP=1 "$URI" -c "CREATE TABLE $table ($columns)" \
    -c "\\copy $table FROM '$PWD/$data' WITH (FORMAT csv, HEADER true)" -c "VACUUM ANALYZE $table" >/dev/null
  row "validate --model (20 terms)" "$n" \
    "$BIN" validate --data "$URI" --table "$table" --outcome y --model "$fitted" --json "$TMP/d.json" -- \
    "$BIN" validate --data "$data" --outcome y --model "$fitted" --json "$TMP/c.json"
  row "validate --risk" "$n" \
    "$BIN" validate --data "$URI" --table "$table" --outcome y --risk risk --json "$TMP/d.json" -- \
    "$BIN" validate --data "$data" --outcome y --risk risk --json "$TMP/c.json"
  row "validate --risk, query of 2 columns" "$n" \
    "$BIN" validate --data "$URI" --query "SELECT y, risk FROM $table" --outcome y --risk risk --json "$TMP/d.json" -- \
    "$BIN" validate --data "$data" --outcome y --risk risk --json "$TMP/c.json"
done
echo "table written to $OUT"
