#!/usr/bin/env bash
# The README's example is the demo's real output: the report command's printout and the opening of
# summary.md (up to its first section heading) must equal what the current build writes, and the drift CSV
# shown beside them too. Fails when a change of output leaves the README behind.
# Needs SKEIN (the executable) and SOURCE_DIR (the repository's root).
set -euo pipefail
: "${SKEIN:?}" "${SOURCE_DIR:?}"
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
cd "$SOURCE_DIR"
readme=README.md

# The fenced block after a line matching $1 (its first fenced block).
block_after() {
  awk -v pat="$1" 'found==0 && index($0, pat) {found=1; next}
                   found==1 && /^```/ {found=2; next}
                   found==2 && /^```/ {exit}
                   found==2 {print}' "$readme"
}

fail=0
check() {  # name expected-file actual-file
  if ! diff -u "$2" "$3" >"$work/diff"; then
    echo "README example out of date: $1"; cat "$work/diff"; fail=1
  fi
}

# 1. The report command's printout (stdout then stderr, as a terminal shows them), with the README's folder.
"$SKEIN" report designs/demo.yaml --out "$work/demo/" >"$work/out.txt" 2>"$work/err.txt"
cat "$work/out.txt" "$work/err.txt" | sed "s#$work/demo#reports/demo#g" >"$work/printout.txt"
block_after "The first command prints:" >"$work/readme_printout.txt"
check "report printout" "$work/readme_printout.txt" "$work/printout.txt"

# 2. summary.md up to its first section heading, then the README's "..." line.
awk '{print} /^## /{exit}' "$work/demo/summary.md" >"$work/summary_head.txt"
echo "..." >>"$work/summary_head.txt"
block_after "reports/demo/summary.md\` opens with the answer" >"$work/readme_summary.txt"
check "summary.md opening" "$work/readme_summary.txt" "$work/summary_head.txt"

# 3. The drift CSV.
{ echo '$ build/cli/skein drift designs/demo.yaml --format csv'; "$SKEIN" drift designs/demo.yaml --format csv; } \
  >"$work/drift.txt"
block_after "Each command also answers on its own" >"$work/readme_drift.txt"
check "drift CSV" "$work/readme_drift.txt" "$work/drift.txt"

[ "$fail" = 0 ] && echo "README example matches the demo's output"
exit "$fail"
