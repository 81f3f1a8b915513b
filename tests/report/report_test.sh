#!/usr/bin/env bash
# The report folder for the small design: reproducibility, GeoJSON, OEM, summary-vs-JSON checks, then a
# headless-browser render of index.html.
set -eu
: "${SKEIN:?}" "${SOURCE_DIR:?}"
SKEIN=$(readlink -f "$SKEIN")
work=$(mktemp -d); trap 'rm -rf "$work"' EXIT
cd "$SOURCE_DIR"
/usr/bin/python3 tests/report/check_report.py "$SKEIN" designs/small.yaml "$work"
/usr/bin/python3 tests/report/browser_check.py "$work/a/index.html" "$work/screenshot.png"
