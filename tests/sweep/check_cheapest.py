#!/usr/bin/python3
"""Brute-force check of the layout `skein sweep` names as the cheapest meeting the requirement.

Usage: check_cheapest.py OUT_DIR STDERR_FILE STDOUT_JSON_FILE FIGURE higher|lower COST_COLUMN...

The answer is recomputed from the sweep's own files, independently of skein's code: over the rows of
results.jsonl (full double precision) that are evaluated (status ok) and meet the requirement, the least key
(cost columns in their stated order, then the figure best first, then the layout index), by Python's tuple
order. The named layout (summary line on stderr, first row of the best front on stdout and in
best_front.csv) must be that row; at the printed decimals of results.csv no passing row may have a smaller
key. The best front must hold only passing layouts and be non-dominated among them (Deb 2001, def. 2.5).
Prints the named layout and its key; exits non-zero with a message on any mismatch.
"""
import csv
import json
import re
import sys


def fail(message):
    print("FAIL: " + message)
    sys.exit(1)


def main():
    out_dir, err_file, json_file, figure, sense = sys.argv[1:6]
    costs = sys.argv[6:]
    sign = -1.0 if sense == "higher" else 1.0

    def key(row):
        return tuple(float(row[c]) for c in costs) + (sign * float(row[figure]), int(row["layout"]))

    with open(out_dir + "/results.jsonl") as f:
        rows = [json.loads(line) for line in f]
    passing = [r for r in rows if r["status"] == "ok" and r["meets_requirement"] == "yes"]
    if not passing:
        fail("no layout meets the requirement; the check needs one")
    best = min(passing, key=key)

    # At the printed decimals of results.csv the named row is a least key too.
    with open(out_dir + "/results.csv", newline="") as f:
        csv_rows = list(csv.DictReader(f))
    csv_passing = [r for r in csv_rows if r["status"] == "ok" and r["meets_requirement"] == "yes"]
    if len(csv_passing) != len(passing):
        fail("results.csv and results.jsonl disagree on the passing layouts")
    csv_min = min(key(r)[:-1] for r in csv_passing)
    csv_named = [r for r in csv_rows if int(r["layout"]) == best["layout"]][0]
    if key(csv_named)[:-1] != csv_min:
        fail("at results.csv's decimals layout %d is not a least key: %s > %s" % (best["layout"], key(csv_named), csv_min))

    with open(err_file) as f:
        m = re.search(r"cheapest layout meeting the requirement: (\d+) ", f.read())
    if not m:
        fail("the summary names no cheapest layout")
    if int(m.group(1)) != best["layout"]:
        fail("the summary names layout %s, the brute force gives %d" % (m.group(1), best["layout"]))

    with open(json_file) as f:
        front = json.load(f)["rows"]
    if not front or front[0]["layout"] != best["layout"]:
        fail("the best front on standard output does not start with layout %d" % best["layout"])
    with open(out_dir + "/best_front.csv", newline="") as f:
        front_csv = list(csv.DictReader(f))
    if not front_csv or int(front_csv[0]["layout"]) != best["layout"]:
        fail("best_front.csv does not start with layout %d" % best["layout"])

    # The best front: passing layouts only, exactly the non-dominated ones among them.
    def objectives(row):
        return [sign * float(row[figure])] + [float(row[c]) for c in costs]

    def dominates(a, b):
        x, y = objectives(a), objectives(b)
        return all(p <= q for p, q in zip(x, y)) and any(p < q for p, q in zip(x, y))

    expected = sorted(r["layout"] for r in passing if not any(dominates(o, r) for o in passing))
    got = sorted(r["layout"] for r in front)
    if got != expected:
        fail("best front %s, by the definition %s" % (got, expected))
    flagged = sorted(r["layout"] for r in rows if r.get("best_front") == "yes")
    if flagged != expected:
        fail("results' best_front column marks %s, expected %s" % (flagged, expected))
    evaluated = [r for r in rows if r["status"] == "ok"]
    trade = sorted(r["layout"] for r in evaluated if not any(dominates(o, r) for o in evaluated))
    flagged = sorted(r["layout"] for r in rows if r.get("trade_front") == "yes")
    if flagged != trade:
        fail("results' trade_front column marks %s, by the definition %s" % (flagged, trade))
    with open(out_dir + "/trade_front.csv", newline="") as f:
        if sorted(int(r["layout"]) for r in csv.DictReader(f)) != trade:
            fail("trade_front.csv does not hold the trade front")
    print("named layout %d, key %s; best front %d layouts, trade front %d" % (best["layout"], key(best), len(expected), len(trade)))


if __name__ == "__main__":
    main()
