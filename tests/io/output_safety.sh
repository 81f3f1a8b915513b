#!/usr/bin/env bash
# Output never destroys what skein did not write, and an interrupted report leaves the previous one.
# (ctest: io.output_safety)
#  1. `report --out` refuses a folder that holds the design, or any folder skein did not write (no
#     .skein-output marker), exit 2, nothing touched; an empty folder and a previous report are accepted;
#     --overwrite replaces a foreign folder but never one holding an input.
#  2. `coverage --points` never writes over the design; a file it did not write is refused unless --overwrite;
#     its own previous points file is replaced. `sweep --out` follows the marker rule and the input rule.
#  3. Fault injection (SKEIN_FAULT_AT, read by lib/skein/io/folder_write.cpp): a report killed by SIGKILL at
#     each step of the folder writer leaves a complete report under the final name (the previous one before
#     the exchange, the new one after), and the next run removes the staging leftovers. SIGTERM at a step
#     removes the staging folder itself and ends the process by that signal.
set -u
: "${SKEIN:?}" "${SOURCE_DIR:?}"
SKEIN=$(readlink -f "$SKEIN")
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
failures=0
fail() { echo "FAIL: $*" >&2; failures=$((failures + 1)); }
cd "$work"
cp "$SOURCE_DIR/designs/small.yaml" design.yaml
design_sum=$(sha256sum design.yaml)

# expect STATUS PATTERN -- command...: exit status and a fixed string on stderr, stdout empty on error.
expect() {
  local status=$1 pattern=$2
  shift 3
  timeout 60 "$@" >out.txt 2>err.txt
  local got=$?
  if [ "$got" != "$status" ]; then fail "$* exited $got, expected $status: $(cat err.txt)"; return; fi
  if [ -n "$pattern" ] && ! grep -qF -- "$pattern" err.txt; then fail "$*: stderr lacks '$pattern': $(cat err.txt)"; fi
  if [ "$status" != 0 ] && [ -s out.txt ]; then fail "$*: wrote to stdout on error"; fi
}
# A manifest of a folder: every file with its checksum (hidden files included), sorted.
manifest() { (cd "$1" && find . -type f -print0 | sort -z | xargs -0 sha256sum); }
check_design() { [ "$(sha256sum design.yaml)" = "$design_sum" ] || fail "the design file changed or vanished ($1)"; }

# --- 1. report --out --------------------------------------------------------------------------------------
mkdir proj && cp design.yaml proj/design.yaml && echo "notes" > proj/notes.txt
expect 2 "contains the input file" -- "$SKEIN" report proj/design.yaml --out proj --creation-date 2027-01-01T00:00:00Z
expect 2 "contains the input file" -- "$SKEIN" report proj/design.yaml --out proj --overwrite --creation-date 2027-01-01T00:00:00Z
[ -f proj/design.yaml ] && [ -f proj/notes.txt ] || fail "report --out on the design's folder deleted files"
expect 2 "is the input file" -- "$SKEIN" report design.yaml --out design.yaml
check_design "report --out design.yaml"

mkdir foreign && echo "keep me" > foreign/keep.txt
expect 2 "was not written by skein" -- "$SKEIN" report design.yaml --out foreign --creation-date 2027-01-01T00:00:00Z
[ "$(cat foreign/keep.txt 2>/dev/null)" = "keep me" ] || fail "a foreign --out folder was changed"
[ -z "$(find . -maxdepth 1 -name '.foreign.skein-staging-*')" ] || fail "a refused run left a staging folder"
expect 0 "" -- "$SKEIN" report design.yaml --out foreign --overwrite --creation-date 2027-01-01T00:00:00Z
[ ! -e foreign/keep.txt ] && [ -f foreign/.skein-output ] && [ -f foreign/summary.md ] ||
  fail "--overwrite did not replace the foreign folder by a report"
grep -q '^skein output folder, version ' foreign/.skein-output || fail "the marker does not name skein and its version"

mkdir empty
expect 0 "" -- "$SKEIN" report design.yaml --out empty --creation-date 2027-01-01T00:00:00Z
[ -f empty/summary.md ] || fail "an empty --out folder was not used"
expect 0 "" -- "$SKEIN" report design.yaml --out empty --creation-date 2027-02-01T00:00:00Z
grep -qr "CREATION_DATE = 2027-02-01" empty/exports/oem || fail "a previous report was not replaced by the new one"
check_design "report runs"

# --- 2. coverage --points and sweep --out -------------------------------------------------------------------
expect 2 "is the input file" -- "$SKEIN" coverage design.yaml --points design.yaml
expect 2 "is the input file" -- "$SKEIN" coverage design.yaml --points ./design.yaml --overwrite
check_design "coverage --points design.yaml"
echo "my,own,data" > mine.csv
expect 2 "was not written by skein" -- "$SKEIN" coverage design.yaml --points mine.csv
[ "$(cat mine.csv)" = "my,own,data" ] || fail "coverage --points wrote over a file skein did not write"
expect 0 "" -- "$SKEIN" coverage design.yaml --points mine.csv --overwrite
head -1 mine.csv | grep -q '^name,lat_deg,lon_deg,' || fail "--overwrite did not write the points file"
expect 0 "" -- "$SKEIN" coverage design.yaml --points mine.csv
: > blank.csv
expect 0 "" -- "$SKEIN" coverage design.yaml --points blank.csv

mkdir -p sw/designs/sweeps && cp "$SOURCE_DIR/designs/demo.yaml" sw/designs/ &&
  cp "$SOURCE_DIR/designs/sweeps/kestrel-small.yaml" sw/designs/sweeps/
expect 2 "contains the input file" -- "$SKEIN" sweep sw/designs/sweeps/kestrel-small.yaml --out sw/designs
expect 2 "contains the input file" -- "$SKEIN" sweep sw/designs/sweeps/kestrel-small.yaml --out sw --overwrite
mkdir sfor && echo "results of mine" > sfor/results.csv
expect 2 "was not written by skein" -- "$SKEIN" sweep sw/designs/sweeps/kestrel-small.yaml --out sfor
[ "$(cat sfor/results.csv)" = "results of mine" ] && [ ! -e sfor/journal.txt ] || fail "sweep --out changed a foreign folder"
expect 0 "" -- "$SKEIN" sweep sw/designs/sweeps/kestrel-small.yaml --out sfor --overwrite
[ -f sfor/.skein-output ] && head -1 sfor/results.csv | grep -q '^layout,' ||
  fail "sweep --out --overwrite did not write its results and marker"
expect 0 "" -- "$SKEIN" sweep sw/designs/sweeps/kestrel-small.yaml --out sfor --resume  # its own folder now

# --- 3. interrupted reports: SIGKILL at every step, then SIGTERM ---------------------------------------------
"$SKEIN" report design.yaml --out rep --creation-date 2027-01-01T00:00:00Z >/dev/null 2>&1 || fail "first report"
old=$(manifest rep)
"$SKEIN" report design.yaml --out new --creation-date 2027-05-05T00:00:00Z >/dev/null 2>&1 || fail "reference report"
new=$(manifest new)
[ "$old" != "$new" ] || fail "the two reference reports do not differ; the test could not tell them apart"
for step in staging-created marker-written first-file-written files-written exchanged old-removed; do
  SKEIN_FAULT_AT=$step "$SKEIN" report design.yaml --out rep --creation-date 2027-05-05T00:00:00Z >/dev/null 2>&1
  status=$?
  [ "$status" = 137 ] || fail "SKEIN_FAULT_AT=$step: exit $status, expected 137 (SIGKILL)"
  got=$(manifest rep 2>/dev/null)
  case $step in
    exchanged | old-removed) [ "$got" = "$new" ] || fail "killed at $step: the new report is not complete under rep/" ;;
    *) [ "$got" = "$old" ] || fail "killed at $step: the previous report is not complete under rep/" ;;
  esac
  # The next run removes what the killed one left beside rep/.
  "$SKEIN" report design.yaml --out rep --creation-date 2027-01-01T00:00:00Z >/dev/null 2>&1 || fail "run after $step"
  leftovers=$(find . -maxdepth 1 -name '.rep.skein-staging-*' | wc -l)
  [ "$leftovers" = 0 ] || fail "after a kill at $step the next run left $leftovers staging folders"
  [ "$(manifest rep)" = "$old" ] || fail "the run after $step did not write a complete report"
done
for sig in TERM INT; do
  SKEIN_FAULT_AT=first-file-written SKEIN_FAULT_SIGNAL=$sig "$SKEIN" report design.yaml --out rep \
    --creation-date 2027-05-05T00:00:00Z >/dev/null 2>&1
  status=$?
  expected=$([ $sig = TERM ] && echo 143 || echo 130)
  [ "$status" = "$expected" ] || fail "SIG$sig while writing: exit $status, expected $expected"
  [ "$(manifest rep)" = "$old" ] || fail "SIG$sig while writing: the previous report is not whole"
  [ -z "$(find . -maxdepth 1 -name '.rep.skein-staging-*')" ] || fail "SIG$sig left a staging folder"
done
# The two-rename path (platforms without the exchange): a normal run replaces the report whole, and a kill
# before the renames leaves the previous one.
SKEIN_FAULT_NO_EXCHANGE=1 "$SKEIN" report design.yaml --out rep --creation-date 2027-05-05T00:00:00Z >/dev/null 2>&1 ||
  fail "report by two renames"
[ "$(manifest rep)" = "$new" ] || fail "the two-rename path did not put the new report in place"
[ -z "$(find . -maxdepth 1 -name '.rep.skein-staging-*')" ] || fail "the two-rename path left a folder behind"
SKEIN_FAULT_NO_EXCHANGE=1 SKEIN_FAULT_AT=files-written "$SKEIN" report design.yaml --out rep \
  --creation-date 2027-01-01T00:00:00Z >/dev/null 2>&1
[ "$(manifest rep)" = "$new" ] || fail "two-rename path killed before the renames: the previous report is not whole"
"$SKEIN" report design.yaml --out rep --creation-date 2027-01-01T00:00:00Z >/dev/null 2>&1 || fail "report after that"
# Stale-looking folders that are not skein's are never removed: no marker, or not the staging name.
mkdir -p .rep.skein-staging-999999-abcdef .rep.backup && echo x > .rep.skein-staging-999999-abcdef/user.txt
echo y > .rep.backup/user.txt
"$SKEIN" report design.yaml --out rep --creation-date 2027-01-01T00:00:00Z >/dev/null 2>&1 || fail "run with user folders"
[ -f .rep.skein-staging-999999-abcdef/user.txt ] && [ -f .rep.backup/user.txt ] || fail "a folder without the marker was removed"
check_design "interrupts"

if [ "$failures" -ne 0 ]; then
  echo "output_safety: $failures failures" >&2
  exit 1
fi
echo "output_safety: all checks passed" >&2
