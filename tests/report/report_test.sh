#!/usr/bin/env bash
# The report folder for the small design: reproducibility, GeoJSON, OEM, summary-vs-JSON checks, then a
# headless-browser measurement of index.html (browser_check.py; the demo, region and sites pages in browser_test.sh).
set -eu
: "${SKEIN:?}" "${SOURCE_DIR:?}"
SKEIN=$(readlink -f "$SKEIN")
work=$(mktemp -d); trap 'rm -rf "$work"' EXIT
cd "$SOURCE_DIR"
/usr/bin/python3 tests/report/check_report.py "$SKEIN" designs/small.yaml "$work/small"
# A sites design with a requirement that fails: the verdict and its failing checks open both pages.
/usr/bin/python3 tests/report/check_report.py "$SKEIN" designs/harbour-watch.yaml "$work/harbour"
/usr/bin/python3 tests/report/browser_check.py "$work/small/a/index.html"
