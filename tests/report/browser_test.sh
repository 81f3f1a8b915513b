#!/usr/bin/env bash
# index.html measured in headless Chromium (tests/report/browser_check.py): first the check itself must report a
# deliberately broken page (wide table outside a scroll box, missing image, labels outside their figure), then
# the reports of the demo design (global grid), a region design (tests/report/designs/shelf-patrol.yaml) and a
# sites design (designs/harbour-watch.yaml) must render with nothing wider than the window, every image loaded
# and every figure label inside its figure.
# SCREENSHOT=PATH.png also keeps a screenshot of the demo page there (README: docs/report-demo.png).
# Exit 77 (skipped) when chromium is not installed.
set -eu
: "${SKEIN:?}" "${SOURCE_DIR:?}"
SKEIN=$(readlink -f "$SKEIN")
command -v chromium >/dev/null || { echo "chromium not installed: skipped"; exit 77; }
work=$(mktemp -d); trap 'rm -rf "$work"' EXIT
cd "$SOURCE_DIR"
status=0
/usr/bin/python3 tests/report/browser_check.py --self-test || status=1
while read -r design; do
  name=$(basename "$design" .yaml)
  "$SKEIN" report "$design" --out "$work/$name" --creation-date 2027-01-01T00:00:00Z >/dev/null 2>"$work/$name.err" ||
    { echo "FAIL skein report $design"; cat "$work/$name.err"; status=1; continue; }
  args=()
  if [ "$name" = demo ] && [ -n "${SCREENSHOT:-}" ]; then args+=(--screenshot "$SCREENSHOT"); fi
  /usr/bin/python3 tests/report/browser_check.py "$work/$name/index.html" "${args[@]}" || status=1
done <<'LIST'
designs/demo.yaml
tests/report/designs/shelf-patrol.yaml
designs/harbour-watch.yaml
LIST
echo "browser test: $([ $status = 0 ] && echo passed || echo FAILED)"
exit $status
