#!/usr/bin/env bash
# Renders what users see into docs/: the workstation's main window and each view, the model tool
# dialogs (offscreen, 1920x1080 unless CALIVERA_SCREENSHOT_SIZE says otherwise, from the Qt tests'
# screenshot slots) and the sample PDF audit
# report's pages. Run after scripts/build.sh; look at the PNGs before committing them.
set -euo pipefail
cd "$(dirname "$0")/.."
export QT_QPA_PLATFORM=offscreen
export CALIVERA_SCREENSHOT_DIR="${CALIVERA_SCREENSHOT_DIR:-$PWD/docs/screenshots}"
export CALIVERA_SCREENSHOT_SIZE="${CALIVERA_SCREENSHOT_SIZE:-1920x1080}"
mkdir -p "$CALIVERA_SCREENSHOT_DIR" docs/report
build/bin/main_window_test screenshots >/dev/null
build/bin/model_tools_test screenshots >/dev/null
build/bin/site_summaries_window_test screenshots >/dev/null
build/bin/import_dialog_test screenshots >/dev/null
build/bin/missing_data_ui_test screenshots >/dev/null
report=$(mktemp -d)
trap 'rm -rf "$report"' EXIT
SOURCE_DATE_EPOCH=1764547200 build/bin/calivera validate --data sample_data/local_cohort.csv --outcome complication_30d \
  --model sample_data/published_model.json --bootstrap 200 --seed 2026 \
  --compare sample_data/quick_model.json --subgroup site --size-thresholds 0.1,0.2 --thresholds 0.05,0.10,0.15,0.20,0.30 \
  --suppress-below 11 --reasonable-range 0.05:0.30 --pdf "$report/sample_report.pdf" \
  --title "Ashcombe 30-day Complication Score on the Kestrel Bay cohort (invented demo data)" \
  >/dev/null
rm -f docs/report/sample_page_*.png
pdftoppm -r 60 -png "$report/sample_report.pdf" docs/report/sample_page
ls docs/screenshots docs/report
