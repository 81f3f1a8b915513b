#!/usr/bin/env bash
# The worked example of skein search (designs/searches/coastal-watch.yaml, the invented Shorewatch coastal
# radar): its answer.json compared with the stored one (tests/expected/searches/coastal-watch/answer.json,
# numbers to 1e-9 relative with compare_json.py, as the end-to-end designs are), and its record checked to hold
# every layout once with each skip citing its bound. Regenerate after an intended change with UPDATE=1.
set -u
: "${SKEIN:?path to the skein executable}" "${SOURCE_DIR:?project root}"
py=/usr/bin/python3
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
expected="$SOURCE_DIR/tests/expected/searches/coastal-watch/answer.json"
"$SKEIN" search "$SOURCE_DIR/designs/searches/coastal-watch.yaml" --out "$tmp/out" >"$tmp/answer.txt" 2>"$tmp/summary.txt" \
  || { cat "$tmp/summary.txt"; fail "search run"; }
if [ -n "${UPDATE:-}" ]; then mkdir -p "$(dirname "$expected")"; cp "$tmp/out/answer.json" "$expected"; echo "updated $expected"; exit 0; fi
"$py" "$SOURCE_DIR/tests/cli/compare_json.py" "$expected" "$tmp/out/answer.json" || fail "answer.json differs from $expected"
"$py" - "$tmp/out/record.jsonl" "$tmp/out/answer.json" <<'PY' || fail "record"
import json, sys
record = [json.loads(l) for l in open(sys.argv[1])]
answer = json.load(open(sys.argv[2]))
assert [r["layout"] for r in record] == list(range(answer["layouts"])), "every layout once, in order"
for r in record:
    assert r["outcome"] in ("evaluated", "skipped"), r
    if r["outcome"] == "skipped":
        assert r["reason"] in ("budget", "cap-area bound", "cost order", "prefix span", "sub-grid", "prefix span and sub-grid") and r["bound"], r
assert sum(r["outcome"] == "evaluated" for r in record) == answer["evaluated"]
assert [r["layout"] for r in record if r.get("optimum")] == [answer["optimum"]["layout"]]
print("coastal-watch: optimum %d (%s), %d of %d layouts evaluated" % (answer["optimum"]["layout"], answer["optimum"]["walker"], answer["evaluated"], answer["layouts"]))
PY
