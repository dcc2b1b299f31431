# Helpers of the whole-process benchmarks (scripts/bench-whole.sh, bench-sites.sh, bench-impute.sh),
# sourced by them. The caller sets BIN (calivera), PY (python3), DATA (cohort folder), REPS, OUT
# (the markdown table) and TMP (a scratch folder it removes).
#   peer_prerequisites         stops without a built calivera; installs the peer's libraries
#   cohort ROWS [PREDICTORS]   the synthetic cohort file (bench/whole/make_cohort.py), made once
#   model COHORT               a model fitted on it with every x column, made once
#   row WORKLOAD ROWS OURS... -- PEER...
#                              REPS interleaved runs of each under /usr/bin/time; one table row
#                              of medians (wall time, peak memory), their ratio and the load
peer_prerequisites() {  # the built calivera, and the peer's Python libraries (installed as root)
  [ -x "$BIN" ] || { echo "no $BIN; run scripts/build.sh first" >&2; exit 1; }
  if ! $PY -c 'import numpy, pandas, scipy, sklearn' 2>/dev/null; then
    if [ "$(id -u)" = 0 ]; then
      DEBIAN_FRONTEND=noninteractive apt-get install -y --no-install-recommends \
        python3-numpy python3-pandas python3-scipy python3-sklearn >/dev/null
    else
      echo "the peer needs: apt-get install python3-pandas python3-sklearn" >&2
      exit 1
    fi
  fi
}
cohort() {  # rows [predictors]
  local file="$DATA/cohort_$1${2:+p$2}.csv"
  if [ ! -s "$file" ]; then
    echo "generating $file" >&2
    $PY bench/whole/make_cohort.py "$1" "$file.part" ${2:+--predictors "$2"}
    mv "$file.part" "$file"
  fi
  echo "$file"
}
model() {  # cohort file -> a 20-term (or all-x) model fitted on it, written once
  local file="${1%.csv}.model.json"
  if [ ! -s "$file" ]; then
    local names
    names=$(head -1 "$1" | tr ',' '\n' | grep '^x' | paste -sd, -)
    "$BIN" fit --data "$1" --outcome y --predictors "$names" --out "$file" >/dev/null
  fi
  echo "$file"
}

# median of the numbers on stdin
median() { sort -g | awk '{v[NR]=$1} END {print (NR%2) ? v[(NR+1)/2] : (v[NR/2]+v[NR/2+1])/2}'; }
timed() {  # label command... ; appends "seconds KiB" to $TMP/label
  local label=$1
  shift
  /usr/bin/time -f "%e %M" -o "$TMP/one" "$@" >/dev/null 2>"$TMP/err" || {
    echo "failed: $*" >&2
    cat "$TMP/err" >&2
    exit 1
  }
  cat "$TMP/one" >>"$TMP/$label"
}

row() {  # workload rows calivera-command -- peer-command
  local workload=$1 rows=$2
  shift 2
  local ours=() theirs=()
  while [ "$1" != "--" ]; do ours+=("$1"); shift; done
  shift
  theirs=("$@")
  rm -f "$TMP/ours" "$TMP/peer"
  local load
  load=$(cut -d' ' -f1 /proc/loadavg)
  for _ in $(seq "$REPS"); do
    timed ours "${ours[@]}"
    timed peer "${theirs[@]}"
  done
  local s m ps pm
  s=$(cut -d' ' -f1 "$TMP/ours" | median)
  m=$(cut -d' ' -f2 "$TMP/ours" | median)
  ps=$(cut -d' ' -f1 "$TMP/peer" | median)
  pm=$(cut -d' ' -f2 "$TMP/peer" | median)
  printf '| %s | %s | %.2f s | %.0f MiB | %.2f s | %.0f MiB | %.2f | %s |\n' \
    "$workload" "$rows" "$s" "$(echo "$m / 1024" | bc -l)" "$ps" "$(echo "$pm / 1024" | bc -l)" \
    "$(echo "$s / $ps" | bc -l)" "$load" | tee -a "$OUT"
}

