#!/usr/bin/env bash
# CLI-level checks of `skein sweep` on designs/sweeps/kestrel-small.yaml (72 layouts):
#  1. rows equal `skein coverage` and `skein budget` JSON on each layout's own design file (compare_commands.py);
#  2. a sweep killed with SIGKILL partway, with a half-written journal line added, and resumed with --resume
#     gives the same final files, byte for byte, as an uninterrupted run, recomputing no finished row;
#  3. an existing journal without --resume or --restart is refused (exit 2), and a finished sweep resumed
#     recomputes nothing.
set -u
: "${SKEIN:?path to the skein executable}" "${SOURCE_DIR:?project root}"
py=/usr/bin/python3
sweep="$SOURCE_DIR/designs/sweeps/kestrel-small.yaml"
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }

"$SKEIN" sweep "$sweep" --out "$tmp/full" >"$tmp/full.out" 2>"$tmp/full.err" || { cat "$tmp/full.err"; fail "uninterrupted run"; }
[ "$(wc -l <"$tmp/full/results.jsonl")" -eq 72 ] || fail "expected 72 rows"
[ "$(wc -l <"$tmp/full/results.csv")" -eq 73 ] || fail "expected a header and 72 CSV rows"
grep -q "skipped combinations: 36" "$tmp/full.err" || fail "skipped count not reported"
grep -q "<svg" "$tmp/full/fronts.svg" || fail "no front plot"

# 1. Layouts 0 and 1 (SSO 10:30 and 13:30, 12/3/0 at 520 km) and 70 (24/4/3 at 580 km, SSO 13:30).
"$py" "$SOURCE_DIR/tests/sweep/compare_commands.py" "$SKEIN" "$SOURCE_DIR" "$tmp/full/results.jsonl" "$tmp" 0 1 70 ||
  fail "sweep rows differ from skein coverage / skein budget"

# 2. Kill after some rows (one thread, so that it is still running), then resume.
"$SKEIN" sweep "$sweep" --out "$tmp/cut" --threads 1 >/dev/null 2>&1 &
pid=$!
for _ in $(seq 1 600); do
  n=$(($(wc -l <"$tmp/cut/journal.txt" 2>/dev/null || echo 1) - 1))
  [ "$n" -ge 8 ] && break
  sleep 0.05
done
kill -KILL "$pid" 2>/dev/null
wait "$pid" 2>/dev/null
[ ! -f "$tmp/cut/results.csv" ] || fail "the sweep finished before it was killed; the test needs a slower sweep"
done_rows=$(($(wc -l <"$tmp/cut/journal.txt") - 1))
[ "$done_rows" -ge 8 ] && [ "$done_rows" -lt 72 ] || fail "killed with $done_rows rows"
# A half-written line, as a kill during a write would leave it (no newline, row cut short).
printf '71 0badc0de [71,24,4,3,580.0,70.0,"no",nu' >>"$tmp/cut/journal.txt"
if "$SKEIN" sweep "$sweep" --out "$tmp/cut" >/dev/null 2>"$tmp/refused.err"; then fail "an existing journal was overwritten"; fi
grep -q -- "--resume" "$tmp/refused.err" || fail "refusal does not name --resume"
"$SKEIN" sweep "$sweep" --out "$tmp/cut" --resume >/dev/null 2>"$tmp/resume.err" || { cat "$tmp/resume.err"; fail "resume"; }
grep -q "($done_rows resumed from the journal, 1 damaged or repeated journal lines dropped)" "$tmp/resume.err" ||
  { cat "$tmp/resume.err"; fail "resume did not keep the $done_rows finished rows"; }
[ "$(($(wc -l <"$tmp/cut/journal.txt") - 1))" -eq 72 ] || fail "the journal does not hold each layout once"
for f in results.csv results.jsonl best_front.csv trade_front.csv fronts.svg; do
  cmp -s "$tmp/full/$f" "$tmp/cut/$f" || fail "$f after kill and resume differs from the uninterrupted run"
done

# 3. Resuming a finished sweep evaluates nothing and writes the same files.
"$SKEIN" sweep "$sweep" --out "$tmp/cut" --resume >/dev/null 2>"$tmp/again.err" || fail "second resume"
grep -q "(72 resumed from the journal)" "$tmp/again.err" || fail "a finished sweep was recomputed"
cmp -s "$tmp/full/results.csv" "$tmp/cut/results.csv" || fail "results changed on a second resume"
echo "sweep CLI: rows match the commands; killed at $done_rows of 72 rows and resumed to identical files"
