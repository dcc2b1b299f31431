#!/usr/bin/env bash
# One command from a fresh clone to the main job on the bundled (synthetic) sample data:
# install what is missing, build, then open the workstation with the sample study loaded. On a
# machine with no display the same validation runs headless: the summary is printed and the JSON,
# CSV tables and PDF audit report are written to ./out/.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/install-deps.sh
bash scripts/build.sh
data=sample_data/local_cohort.csv
model=sample_data/published_model.json
outcome=complication_30d
if [ -n "${DISPLAY:-}${WAYLAND_DISPLAY:-}" ] || [ -n "${QT_QPA_PLATFORM:-}" ]; then
  # The sample study: cohort, model, settings, a rival model to compare, bootstrap and subgroups.
  exec build/bin/calivera resources/sample_study_full.cvstudy
fi
echo "No display found: running the sample validation headless (set DISPLAY to open the workstation)."
mkdir -p out
uncertainty=(--bootstrap 200 --seed 2026 --compare sample_data/quick_model.json --subgroup site --size-thresholds 0.1,0.2)
build/bin/calivera validate --data "$data" --outcome "$outcome" --model "$model" "${uncertainty[@]}" \
  --thresholds 0.05,0.10,0.15,0.20,0.30 --json out/sample_validation.json --csv-dir out/tables \
  --pdf out/sample_report.pdf --reasonable-range 0.05:0.30 --title "Sample study: Ashcombe score at Kestrel Bay (synthetic)" \
  >/dev/null
build/bin/calivera validate --data "$data" --outcome "$outcome" --model "$model" "${uncertainty[@]}" \
  --thresholds 0.05,0.10,0.15,0.20,0.30
echo
echo "Written: out/sample_validation.json, out/tables/*.csv, out/sample_report.pdf"
