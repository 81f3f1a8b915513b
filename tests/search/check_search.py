#!/usr/bin/env python3
"""The answer of `skein search` against a brute force over a full sweep of the same space, written apart from
skein's code: the minimum over the sweep's results.jsonl of (costs in order, the requirement figure best first,
the layout index) among the rows that are evaluated and meet the requirement, as README "The answer and the two
fronts" states the sweep's rule. Also checks the record: every layout of the space once; every layout skipped by
the budget, the cap-area bound or the coarse screen fails the requirement in the sweep (the bound was safe; for the
screen, the sweep's own figure lies on the side of the coarse figure the bound states, within the allowance); every layout skipped by
cost order ranks after the optimum by its costs alone; the runners-up are the next passing layouts of the same order; every evaluated layout has the sweep's verdict and figure
(exactly); at most MAX_SHARE of the layouts evaluated.
The requirement figure is the one answer.json names beside the optimum; percent figures rank higher first, the
gap and response figures lower first (README, "Requirements").
Usage: check_search.py SWEEP_OUT SEARCH_OUT MAX_SHARE"""
import json
import sys

sweep_out, search_out, max_share = sys.argv[1], sys.argv[2], float(sys.argv[3])
rows = {r["layout"]: r for r in map(json.loads, open(sweep_out + "/results.jsonl"))}
answer = json.load(open(search_out + "/answer.json"))
assert answer["optimum"], "the test cases have an optimum"
figure = next(k for k in answer["optimum"] if k not in ("layout", "walker", "costs"))
direction = "higher" if "percent" in figure else "lower"
record = [json.loads(line) for line in open(search_out + "/record.jsonl")]
cost_names = list(record[0]["costs"].keys())
column = {"satellites": "design_satellites", "planes": "design_planes"}
sign = -1.0 if direction == "higher" else 1.0


def costs(r):
    return tuple(float(r[column.get(c, c)] or 0.0) for c in cost_names)


def key(r):
    return costs(r) + (sign * r[figure], r["layout"])


passing = [r for r in rows.values() if r["status"] in ("ok", "cannot-fly") and r["meets_requirement"] == "yes"]
ranked = [r["layout"] for r in sorted(passing, key=key)]
brute = ranked[0] if ranked else None
got = answer["optimum"]["layout"] if answer["optimum"] else None
assert got == brute, f"search optimum {got}, brute force over the sweep {brute}"
runners = [r["layout"] for r in answer["runners_up"]]
assert runners == ranked[1:1 + len(runners)], f"runners-up {runners}, brute force {ranked[1:1 + len(runners)]}"
assert len(record) == len(rows) == answer["layouts"], (len(record), len(rows), answer["layouts"])
evaluated = 0
screened = 0
for line in record:
    r = rows[line["layout"]]
    assert costs(r) == tuple(line["costs"][c] for c in cost_names), (line, costs(r))
    if line["outcome"] == "evaluated":
        evaluated += 1
        assert line["meets"] == (r["meets_requirement"] == "yes"), (line, r["meets_requirement"])
        if figure in line:
            assert line[figure] == r[figure], (line, r[figure])
    elif line["reason"] in ("budget", "cap-area bound"):
        assert r["meets_requirement"] != "yes", f"layout {line['layout']} skipped by {line['reason']} meets the requirement"
    elif line["reason"] in ("prefix span", "sub-grid", "prefix span and sub-grid"):
        # The coarse screen: the layout fails in the sweep, and the one-sided bound held on the sweep's own
        # figure (a coarse max gap at most the full one; a coarse worst instant or worst point at least the full one).
        screened += 1
        assert r["meets_requirement"] != "yes", f"layout {line['layout']} skipped by the screen meets the requirement"
        f, v = line["coarse"]["figure"], line["coarse"]["value"]
        if f == "max_gap_s":
            assert r[f] >= v - 1.0, (line, r[f])
        else:
            assert r[f] <= v + 0.01, (line, r[f])
    else:
        assert line["reason"] == "cost order", line
        assert costs(r) > costs(rows[got]), f"layout {line['layout']} skipped by cost order does not cost more"
assert evaluated == answer["evaluated"], (evaluated, answer["evaluated"])
assert screened == answer["skipped"].get("screen", 0), (screened, answer["skipped"])
assert evaluated <= max_share * len(rows), f"{evaluated} of {len(rows)} layouts evaluated, above {max_share}"
print(f"optimum {got} = brute force {brute}, runners-up {runners}; {evaluated} of {len(rows)} layouts evaluated "
      f"({100.0 * evaluated / len(rows):.1f} %); skipped {answer['skipped']}")
