#!/usr/bin/env bash
# `skein report` and its land outlines: without the outline file the report is still written and its maps say
# that the outlines are missing; a --land-outlines file that is not there, or not TopoJSON, is refused before any
# work (exit 2, the file named); with the installed file the maps credit Natural Earth.
set -u
: "${SKEIN:?}" "${SOURCE_DIR:?}"
work=$(mktemp -d); trap 'rm -rf "$work"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
design="$SOURCE_DIR/designs/small.yaml"

SKEIN_LAND_OUTLINES="$work/none.json" "$SKEIN" report "$design" --out "$work/bare" >/dev/null 2>"$work/err" \
  || { cat "$work/err"; fail "report without outlines"; }
for f in coverage_map max_gap_map ground_tracks; do
  grep -q "land outlines missing: no file at $work/none.json" "$work/bare/plots/$f.svg" || fail "$f.svg does not say the outlines are missing"
  grep -q "land outlines missing" "$work/bare/index.html" || fail "index.html does not say the outlines are missing"
done

"$SKEIN" report "$design" --out "$work/x" --land-outlines "$work/none.json" >/dev/null 2>"$work/err"
[ $? -eq 2 ] || fail "a missing --land-outlines file is not refused with exit 2"
grep -q -- "--land-outlines $work/none.json: no such file" "$work/err" || { cat "$work/err"; fail "message"; }
[ -e "$work/x" ] && fail "a refused report left a folder"

echo '{"type":"FeatureCollection","features":[]}' >"$work/geo.json"
"$SKEIN" report "$design" --out "$work/y" --land-outlines "$work/geo.json" >/dev/null 2>"$work/err"
[ $? -eq 2 ] || fail "a file that is not TopoJSON is not refused with exit 2"
grep -q "$work/geo.json: not a Topology" "$work/err" || { cat "$work/err"; fail "message (not a Topology)"; }

land="$SOURCE_DIR/third_party/world-atlas/node_modules/world-atlas/land-110m.json"
if [ -s "$land" ]; then
  "$SKEIN" report "$design" --out "$work/land" --land-outlines "$land" >/dev/null 2>"$work/err" || { cat "$work/err"; fail "report with outlines"; }
  grep -q "land: Natural Earth (public domain)" "$work/land/plots/coverage_map.svg" || fail "no land credit"
  grep -q "land outlines missing" "$work/land/plots/coverage_map.svg" && fail "outlines said missing though given"
fi
echo "land outlines: missing file reported, bad files refused, installed file credited"
