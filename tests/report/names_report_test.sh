#!/usr/bin/env bash
# Names are data through a whole report: a design named with HTML, Markdown and a formula-like site name
# (legal input) is written to summary.md, index.html, plots/*.svg, tables/*.csv and exports/oem/*.oem; no
# markup from the name survives unescaped, the CSV cell is neutralised, and every OEM line stays one KVN line.
# Usage: SKEIN=path/to/skein bash tests/report/names_report_test.sh     (ctest: report.names)
set -euo pipefail
skein="${SKEIN:?set SKEIN to the skein executable}"
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
cat > "$work/names.yaml" <<'YAML'
name: "<script>alert(1)</script> *Kestrel* [x](y) | z"
epoch: 2027-06-15T12:00:00Z
spacecraft:
  dry_mass_kg: 60
  drag_area_m2: 0.4
  drag_coefficient: 2.2
  isp_s: 200
shells:
  - name: pathfinder
    pattern: walker-delta
    satellites: 2
    planes: 1
    phasing: 0
    altitude_km: 560
    inclination_deg: 53
coverage:
  grid:
    kind: sites
    sites:
      - name: "=HYPERLINK(\"http://x\",\"y\")"
        lat_deg: 40
        lon_deg: 10
      - name: "<b>bold</b>"
        lat_deg: -30
        lon_deg: 100
  span_h: 2
  step_s: 120
YAML
"$skein" report "$work/names.yaml" --out "$work/out" --creation-date 2027-06-15T00:00:00Z >/dev/null 2>&1
fail=0
check() { if ! eval "$1"; then echo "FAIL: $2"; fail=1; else echo "ok: $2"; fi; }
# Markup formats only: JSON, CSV and KVN hold the name as plain text, where "<script>" is not markup.
markup=("$work/out/summary.md" "$work/out/index.html" "$work"/out/plots/*.svg)
check '! grep -q "<script>" "${markup[@]}"' "no raw <script> in summary.md, index.html or the SVG plots"
check '! grep -q "<b>bold</b>" "${markup[@]}"' "no raw <b> from a site name in the markup files"
check 'grep -q "^# &lt;script&gt;alert(1)&lt;/script&gt; \\\\\*Kestrel\\\\\* \\\\\[x\\\\\](y) \\\\| z$" "$work/out/summary.md"' \
  "summary.md heading carries the name escaped"
check 'grep -q "<h1>&lt;script&gt;alert(1)&lt;/script&gt;" "$work/out/index.html"' "index.html heading escaped"
check 'grep -q "^\"'"'"'=HYPERLINK(" "$work/out/tables/coverage_points.csv"' "CSV site cell starts with a single quote"
check '! grep -q "^=" "$work/out/tables/coverage_points.csv"' "no CSV cell starts with ="
for f in "$work"/out/exports/oem/*.oem; do
  check '[ "$(grep -c "^COMMENT Design: " "$f")" = 1 ] && ! grep -q "^ORIGINATOR = .*ORIGINATOR" "$f"' "$(basename "$f"): one Design comment line"
done
for f in "$work"/out/plots/*.svg; do
  check '/usr/bin/python3 -c "import sys, xml.dom.minidom as m; m.parse(sys.argv[1])" "$f"' "$(basename "$f") is well-formed XML"
done
exit $fail
