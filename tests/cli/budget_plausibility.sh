#!/usr/bin/env bash
# Budgets through the command line: a non-finite figure exits 2 with the shell and the cause, nothing on
# stdout; a budget that cannot be flown is flagged in the text table, the JSON and on stderr; the demo is not.
# Usage: SKEIN=path/to/skein SOURCE_DIR=. bash tests/cli/budget_plausibility.sh   (ctest: cli.budget_plausibility)
set -uo pipefail
skein="${SKEIN:?set SKEIN to the skein executable}"
src="${SOURCE_DIR:?set SOURCE_DIR to the source tree}"
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
design() {  # dry_mass_kg drag_area_m2 altitude_km isp_line
  printf 'name: probe\nepoch: 2027-03-01T00:00:00Z\nspacecraft:\n  dry_mass_kg: %s\n  drag_area_m2: %s\n  drag_coefficient: 2.2\n%s\nshells:\n  - name: s1\n    pattern: walker-delta\n    satellites: 4\n    planes: 2\n    phasing: 1\n    altitude_km: %s\n    inclination_deg: 53\nbudget:\n  mission_life_years: 5\n' "$1" "$2" "$4" "$3"
}
fail=0
check() { if eval "$1"; then echo "ok: $2"; else echo "FAIL: $2"; fail=1; fi; }

# 0.01 kg and 10,000 m^2 with isp_s 220: the propellant overflows a double.
design 0.01 10000 550 "  isp_s: 220" > "$work/tiny.yaml"
"$skein" budget "$work/tiny.yaml" --format json > "$work/out" 2> "$work/err"; rc=$?
check '[ $rc = 2 ]' "non-finite propellant exits 2"
check '[ ! -s "$work/out" ]' "nothing on stdout"
check 'grep -q "tiny.yaml: shell s1: the propellant mass is not finite (inf): .*overflows" "$work/err"' "message names the shell and the cause"

# 150 km: flagged in every output.
design 100 1 150 "  isp_s: 220" > "$work/low.yaml"
"$skein" budget "$work/low.yaml" > "$work/table" 2> "$work/err"; rc=$?
check '[ $rc = 0 ]' "150 km computes"
check 'grep -q "^s1 .*cannot be flown$" "$work/table"' "text table status: cannot be flown"
check 'grep -q "warning: shell s1: cannot be flown: total delta-v .* exceeds 10161 m/s" "$work/err"' "stderr warning names the limit"
"$skein" budget "$work/low.yaml" --format json 2>/dev/null > "$work/json"
check '/usr/bin/python3 -c "import json,sys; s=json.load(open(sys.argv[1]))[\"shells\"][0]; sys.exit(0 if s[\"flyable\"] is False and len(s[\"cannot_fly\"]) == 3 else 1)" "$work/json"' \
  "JSON: flyable false with three reasons"

# The demo: every shell flyable, no plausibility warning.
"$skein" budget "$src/designs/demo.yaml" > "$work/table" 2> "$work/err"
check '! grep -q "cannot be flown\|mass-to-drag\|heavier than the dry mass\|shorter than the" "$work/err" "$work/table"' \
  "demo: no plausibility warning"
exit $fail
