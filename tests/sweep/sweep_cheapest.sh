#!/usr/bin/env bash
# The answer of `skein sweep` on designs/sweeps/kestrel-small.yaml, checked by brute force over its own output
# files (check_cheapest.py), and the case that showed the old rule wrong: the front used to be built over all
# layouts, passing or not, and its first passing member, layout 51 (24/3/1 at 580 km, 32 satellites in the
# design, 4615.08 m/s fleet delta-v), was named, while layouts 42, 43, 48 and 49 (24/3/0 and 24/3/1 at
# 520 km, 32 satellites, 4324.95 m/s) also pass; a failing layout (59) dominated them. Figures measured on
# this build (README, "The answer and the two fronts"); the answer is now 48.
set -u
: "${SKEIN:?path to the skein executable}" "${SOURCE_DIR:?project root}"
py=/usr/bin/python3
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }

"$SKEIN" sweep "$SOURCE_DIR/designs/sweeps/kestrel-small.yaml" --out "$tmp/out" --format json \
  >"$tmp/front.json" 2>"$tmp/summary.txt" || { cat "$tmp/summary.txt"; fail "sweep run"; }
# Costs in the sweep file's order (satellites is the design_satellites column), figure percent_covered.
"$py" "$SOURCE_DIR/tests/sweep/check_cheapest.py" "$tmp/out" "$tmp/summary.txt" "$tmp/front.json" \
  percent_covered higher design_satellites fleet_dv_m_s || fail "brute-force check"

# The reported case, on the numbers of results.jsonl.
"$py" - "$tmp/out/results.jsonl" "$tmp/summary.txt" <<'PY' || fail "the reported case"
import json, re, sys
rows = {r["layout"]: r for r in map(json.loads, open(sys.argv[1]))}
named = int(re.search(r"cheapest layout meeting the requirement: (\d+) ", open(sys.argv[2]).read()).group(1))
assert named != 51, "layout 51 named again"
# Layout 51 passes but costs more: the same 32 satellites, about 290 m/s more fleet delta-v (the issue's
# 4615 vs 4325 m/s, printed to the metre per second; 1 m/s tolerance for that rounding).
assert rows[51]["meets_requirement"] == "yes" and rows[51]["design_satellites"] == 32, rows[51]
assert abs(rows[51]["fleet_dv_m_s"] - 4615) < 1.0, rows[51]["fleet_dv_m_s"]
n = rows[named]
assert n["design_satellites"] == 32 and abs(n["fleet_dv_m_s"] - 4325) < 1.0, n
for i in (42, 43, 48, 49):
    assert rows[i]["meets_requirement"] == "yes" and rows[i]["fleet_dv_m_s"] <= rows[51]["fleet_dv_m_s"] - 280, rows[i]
print("named layout %d: %d satellites, %.2f m/s (layout 51: %.2f m/s)" % (named, n["design_satellites"], n["fleet_dv_m_s"], rows[51]["fleet_dv_m_s"]))
PY
grep -q "best front (meets requirement)" "$tmp/summary.txt" || fail "the summary does not name the best front"
grep -q "trade front (all layouts)" "$tmp/summary.txt" || fail "the summary does not name the trade front"
grep -q ">best front</text>" "$tmp/out/fronts.svg" || fail "the plot has no best-front series"
grep -q ">trade front</text>" "$tmp/out/fronts.svg" || fail "the plot has no trade-front series"
# The front figure against the run's own files: one circle per meeting layout and one cross per failing one
# (shape tells them apart, not colour alone), the requirement's threshold drawn and labelled, the cheapest
# layout labelled with its T/P/F and altitude, and whole-number ticks on the satellite-count axis.
"$py" - "$tmp/out/results.jsonl" "$tmp/out/fronts.svg" "$tmp/out/best_front.csv" <<'PY' || fail "the front figure"
import csv, json, re, sys
rows = [json.loads(l) for l in open(sys.argv[1])]
svg = open(sys.argv[2]).read()
meets = sum(1 for r in rows if r.get("meets_requirement") == "yes")
fails = sum(1 for r in rows if r.get("meets_requirement") == "no")
circles = len(re.findall(r"<circle ", svg)) - 1  # one more in the legend
crosses = len(re.findall(r'<path d="M[-0-9.]+ [-0-9.]+l[-0-9.]+ [-0-9.]+M', svg)) - 1
assert (circles, crosses) == (meets, fails), (circles, crosses, meets, fails)
assert ">required: at least 55</text>" in svg, "no threshold label (min_percent_covered: 55)"
assert 'stroke-dasharray="7 4"' in svg, "no threshold line"
first = next(csv.DictReader(open(sys.argv[3])))
label = "%s %g km" % (first["walker"], float(first["altitude_km"]))
assert ">%s</text>" % label in svg, "the cheapest layout is not labelled " + label
ticks = re.findall(r'text-anchor="middle">([^<]*)</text>', svg)
numeric = [t for t in ticks if re.fullmatch(r"-?[0-9.]+", t)]
assert numeric and all("." not in t for t in numeric), numeric
print("front figure: %d circles, %d crosses, label %r, x ticks %s" % (circles, crosses, label, numeric))
PY
# No passing layout: no answer is named, the best front is empty, the trade front still holds the layout.
cat >"$tmp/none.yaml" <<YAML
name: nothing passes
base: $SOURCE_DIR/designs/demo.yaml
shell: imaging
coverage: {grid: {kind: global, spacing_deg: 15}, span_h: 2, step_s: 300}
axes: {satellites: [12], planes: [3], phasing: [0]}
requirement: {min_percent_covered: 99}
YAML
"$SKEIN" sweep "$tmp/none.yaml" --out "$tmp/none" >/dev/null 2>"$tmp/none.txt" || { cat "$tmp/none.txt"; fail "sweep with no passing layout"; }
grep -q "^no layout meets the requirement: the best front is empty; the trade front (all layouts) is in trade_front.csv$" \
  "$tmp/none.txt" || { cat "$tmp/none.txt"; fail "no passing layout: summary"; }
grep -q "cheapest layout" "$tmp/none.txt" && fail "a cheapest layout was named though none passes"
[ "$(wc -l <"$tmp/none/best_front.csv")" -eq 1 ] || fail "the best front is not empty"
[ "$(wc -l <"$tmp/none/trade_front.csv")" -eq 2 ] || fail "the trade front does not hold the one layout"
# A fold-2, every-site requirement over a sites grid (designs/sweeps/harbour-two-look.yaml): the same
# brute force over its own files; the per-site verdicts are checked in tests/sweep/sweep_fold_sites_test.cpp.
"$SKEIN" sweep "$SOURCE_DIR/designs/sweeps/harbour-two-look.yaml" --out "$tmp/harbour" --format json \
  >"$tmp/harbour.json" 2>"$tmp/harbour.txt" || { cat "$tmp/harbour.txt"; fail "harbour sweep run"; }
"$py" "$SOURCE_DIR/tests/sweep/check_cheapest.py" "$tmp/harbour" "$tmp/harbour.txt" "$tmp/harbour.json" \
  percent_covered higher design_satellites fleet_dv_m_s || fail "brute-force check (harbour, fold 2, every site)"
echo "sweep cheapest: the named layout equals the brute-force minimum"
