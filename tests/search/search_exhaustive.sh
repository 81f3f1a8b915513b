#!/usr/bin/env bash
# skein search against the full sweep of the same space (skein search --as-sweep, run by skein sweep), on a
# global and a regional case, and two cases with the coarse screen (screened-*.yaml; the regional one is the
# regional case with a screen block), and a northern region where the cap-area bound for region grids skips
# layouts (regional-north.yaml): the same optimum as the brute-force minimum over the sweep's results.jsonl
# (check_search.py), every skip justified, at most a quarter of the layouts evaluated; with 3 runners-up asked
# for, the runners-up are the next passing layouts of the sweep's order. Then, on the global case:
# a run stopped after a few evaluations (--stop-after, as a kill at a batch's end) and a run killed with SIGKILL
# after 6 journaled rows, each resumed, give the same record and answer, byte for byte, as one uninterrupted
# run; so does a run on one thread.
set -u
: "${SKEIN:?path to the skein executable}" "${SOURCE_DIR:?project root}"
py=/usr/bin/python3
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
cases="$SOURCE_DIR/tests/search/cases"
for c in global regional regional-north screened-global screened-regional; do
  "$SKEIN" search "$cases/$c.yaml" --as-sweep >"$tmp/$c-sweep.yaml" || fail "$c: --as-sweep"
  "$SKEIN" sweep "$tmp/$c-sweep.yaml" --out "$tmp/$c-sweep" >/dev/null 2>"$tmp/$c-sweep.txt" || { cat "$tmp/$c-sweep.txt"; fail "$c: sweep"; }
  "$SKEIN" search "$cases/$c.yaml" --out "$tmp/$c-search" >"$tmp/$c-answer.txt" 2>"$tmp/$c-search.txt" || { cat "$tmp/$c-search.txt"; fail "$c: search"; }
  "$py" "$SOURCE_DIR/tests/search/check_search.py" "$tmp/$c-sweep" "$tmp/$c-search" 0.25 || fail "$c: brute-force check"
  grep -q "^optimum: layout " "$tmp/$c-search.txt" || fail "$c: no optimum line"
done
"$py" -c "import json,sys; a=json.load(open(sys.argv[1])); assert a['skipped']['cap_area'] > 0, a['skipped']" "$tmp/regional-north-search/answer.json" || fail "regional-north: the regional cap-area bound skipped nothing"
# The screened cases: the screen skipped layouts (check_search.py checked each skip against the sweep), and
# the screened regional case evaluates fewer layouts in full than the same space and requirement unscreened.
for c in screened-global screened-regional; do
  "$py" -c "import json,sys; a=json.load(open(sys.argv[1])); assert a['skipped']['screen'] > 0, a['skipped']" "$tmp/$c-search/answer.json" || fail "$c: the screen skipped nothing"
done
"$py" -c "import json,sys; a,b=(json.load(open(f)) for f in sys.argv[1:]); assert a['evaluated'] < b['evaluated'] and a['optimum'] == b['optimum'], (a['evaluated'], b['evaluated'])" "$tmp/screened-regional-search/answer.json" "$tmp/regional-search/answer.json" || fail "the screen saved no full evaluation"
# Stop and resume with the screen: the screened layouts are not journaled and are screened again on resume,
# with the same record, byte for byte.
"$SKEIN" search "$cases/screened-regional.yaml" --out "$tmp/screened-resumed" --stop-after 2 >/dev/null 2>"$tmp/sstop.txt" || { cat "$tmp/sstop.txt"; fail "stopped screened run"; }
grep -q "stopped after" "$tmp/sstop.txt" || fail "the screened run did not stop"
"$SKEIN" search "$cases/screened-regional.yaml" --out "$tmp/screened-resumed" --resume >/dev/null 2>"$tmp/sresume.txt" || { cat "$tmp/sresume.txt"; fail "screened resume"; }
for f in record.jsonl answer.json evaluated.csv; do
  cmp -s "$tmp/screened-resumed/$f" "$tmp/screened-regional-search/$f" || fail "$f differs after stop and resume (screened)"
done
# Runners-up: the regional case asked for 3 (--runners-up), against the next passing layouts of the same sweep
# (the evaluated share is not bounded then: each runner-up costs evaluations past the optimum).
"$SKEIN" search "$cases/regional.yaml" --runners-up 3 --out "$tmp/runners" >/dev/null 2>"$tmp/runners.txt" || { cat "$tmp/runners.txt"; fail "runners-up run"; }
"$py" "$SOURCE_DIR/tests/search/check_search.py" "$tmp/regional-sweep" "$tmp/runners" 1.0 || fail "runners-up check"
"$py" -c "import json,sys; a=json.load(open(sys.argv[1])); assert len(a['runners_up']) == 3, a['runners_up']" "$tmp/runners/answer.json" || fail "three runners-up"
# Resume: stop after 3 evaluations (the end of the first batch), resume, compare with the uninterrupted run.
"$SKEIN" search "$cases/global.yaml" --out "$tmp/resumed" --stop-after 3 >/dev/null 2>"$tmp/stop.txt" || { cat "$tmp/stop.txt"; fail "stopped run"; }
grep -q "stopped after" "$tmp/stop.txt" || fail "the stopped run did not stop"
[ ! -e "$tmp/resumed/answer.json" ] || fail "the stopped run wrote an answer"
lines=$(($(wc -l <"$tmp/resumed/journal.txt") - 1))
[ "$lines" -ge 3 ] || fail "the stopped run journaled $lines rows"
"$SKEIN" search "$cases/global.yaml" --out "$tmp/resumed" --resume >/dev/null 2>"$tmp/resume.txt" || { cat "$tmp/resume.txt"; fail "resume"; }
grep -q "($lines resumed from the journal)" "$tmp/resume.txt" || { cat "$tmp/resume.txt"; fail "the resume did not keep the $lines journaled rows"; }
for f in record.jsonl answer.json evaluated.csv evaluated.jsonl; do
  cmp -s "$tmp/resumed/$f" "$tmp/global-search/$f" || fail "$f differs after stop and resume"
done
# A real kill: SIGKILL once at least 6 rows are journaled (mid-batch, whatever the timing), then resume.
"$SKEIN" search "$cases/global.yaml" --out "$tmp/killed" --threads 1 >/dev/null 2>&1 &
pid=$!
for _ in $(seq 1 1200); do
  n=$(($(cat "$tmp/killed/journal.txt" 2>/dev/null | wc -l) - 1))
  [ "$n" -ge 6 ] && break
  sleep 0.05
done
kill -9 "$pid" 2>/dev/null; wait "$pid" 2>/dev/null
[ ! -e "$tmp/killed/answer.json" ] || fail "the killed run finished before the kill"
"$SKEIN" search "$cases/global.yaml" --out "$tmp/killed" --resume >/dev/null 2>"$tmp/killed.txt" || { cat "$tmp/killed.txt"; fail "resume after kill"; }
for f in record.jsonl answer.json evaluated.csv evaluated.jsonl; do
  cmp -s "$tmp/killed/$f" "$tmp/global-search/$f" || fail "$f differs after SIGKILL and resume"
done
"$SKEIN" search "$cases/global.yaml" --out "$tmp/one-thread" --threads 1 >/dev/null 2>&1 || fail "one-thread run"
for f in record.jsonl answer.json; do
  cmp -s "$tmp/one-thread/$f" "$tmp/global-search/$f" || fail "$f differs on one thread"
done
echo "search: exhaustive equality, resume and thread count checked"
