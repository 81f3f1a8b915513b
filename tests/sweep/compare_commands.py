"""Check rows of a sweep's results.jsonl against `skein coverage` and `skein budget` run on each layout's own
design file (the demo design with its imaging shell rewritten, and the sweep's coverage block).
Usage: compare_commands.py SKEIN SOURCE_DIR RESULTS_JSONL WORKDIR LAYOUT..."""
import json
import subprocess
import sys

skein, source, results, work = sys.argv[1:5]
wanted = [int(x) for x in sys.argv[5:]]
rows = [json.loads(line) for line in open(results)]
demo = open(f"{source}/designs/demo.yaml").read()
block = ("    satellites: 12\n    planes: 3\n    phasing: 1\n    altitude_km: 540\n"
         "    inclination_deg: sun-synchronous\n    ltan: \"10:30\"\n")
assert block in demo, "the demo design's imaging shell changed; update this test"
failed = 0


def close(a, b, rel=1e-12):
    # The same evaluators on the same orbit values: the numbers agree to rounding (JSON prints them in full).
    return abs(a - b) <= rel * max(1.0, abs(a), abs(b))


def run_json(args):
    return json.loads(subprocess.run([skein] + args, check=True, capture_output=True, text=True).stdout)


for index in wanted:
    r = rows[index]
    assert r["layout"] == index
    shell = (f"    satellites: {r['satellites']}\n    planes: {r['planes']}\n    phasing: {r['phasing']}\n"
             f"    altitude_km: {r['altitude_km']!r}\n")
    # Sun-synchronous layouts only: their first node follows from the LTAN alone (the doctest sweep_match_test
    # covers the fixed-inclination layouts, which keep the base shell's node).
    assert r["sun_synchronous"] == "yes", f"layout {index} is not sun-synchronous"
    shell += f"    inclination_deg: sun-synchronous\n    ltan: \"{r['ltan']}\"\n"
    text = demo.replace(block, shell)
    text += ("coverage:\n  grid:\n    kind: global\n    spacing_deg: 10\n  span_h: 6\n  step_s: 120\n"
             f"  min_elevation_deg: {r['min_elevation_deg']!r}\n")
    path = f"{work}/layout{index}.yaml"
    open(path, "w").write(text)
    cov = run_json(["coverage", path, "--format", "json", "--fold", "1"])
    bud = run_json(["budget", path, "--format", "json"])
    checks = [("percent_covered", cov["percent_covered"]), ("max_gap_s", cov["max_gap_s"]),
              ("mean_gap_s", cov["mean_gap_s"]), ("p95_gap_s", cov["p95_gap_s"]),
              ("mean_response_time_s", cov["mean_response_time_s"]), ("mean_in_view", cov["mean_in_view"]),
              ("worst_instant_percent", cov["worst_instant_covered_percent_by_fold"][0]),
              ("fleet_dv_m_s", bud["fleet_dv_m_s"]), ("fleet_propellant_kg", bud["fleet_propellant_kg"]),
              ("dv_per_satellite_m_s", bud["shells"][0]["total_dv_m_s"]),
              ("lifetime_days", bud["shells"][0]["lifetime_natural_days"])]
    for key, expected in checks:
        if not close(r[key], expected):
            print(f"FAIL layout {index} {key}: sweep {r[key]!r}, command {expected!r}")
            failed += 1
    print(f"layout {index}: {len(checks)} figures match skein coverage and skein budget")
sys.exit(1 if failed else 0)
