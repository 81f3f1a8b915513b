"""Checks of a report folder written by `skein report`, against outside rules and the other commands.

usage: check_report.py SKEIN DESIGN WORKDIR

1. Two runs with the same --creation-date give byte-identical folders (issue: reproducible output).
2. exports/coverage_cells.geojson follows RFC 7946: FeatureCollection of Polygon features whose exterior
   rings are closed (sec. 3.1.6), counterclockwise (right-hand rule, sec. 3.1.6), [longitude, latitude] within
   range (sec. 4), and whose cells tile the grid (area weights sum to 1).
3. Each exports/oem/*.oem is CCSDS 502.0-B-2 KVN: version line first, required header and metadata keywords,
   data lines of an epoch and six numbers, times increasing and inside START_TIME..STOP_TIME, radius inside
   the orbit's perigee..apogee radius from `skein check --format json`.
4. Every table in summary.md equals, cell by cell, the report's tables/*.json at the column's decimals, and
   those JSON rows equal the `--format json` output of `skein drift`, `skein coverage` and `skein budget`.
5. The run record: design copy, hash, version, command.
6. Reading order (issue 16, item 3): both pages open with the answer before any section: the requirement's
   verdict (as `skein coverage` states it) with each failing check, one line per shell of `skein check`, the
   headline coverage figure equal to `skein coverage`'s, and one budget line per shell with `skein budget`'s
   delta-v; then the sections in the order layout and drift, coverage, (ground contacts,) budget, exports, run
   record; in index.html each figure comes right after the table it illustrates (no other table between them),
   every table sits in its scroll box, and images and SVGs are limited to the column's width.
"""
import filecmp
import json
import html
import math
import os
import re
import subprocess
import sys

skein, design, work = sys.argv[1], sys.argv[2], sys.argv[3]
failures = []


def fail(msg):
    failures.append(msg)
    print("FAIL " + msg)


def run(*args):
    r = subprocess.run([skein, *args], capture_output=True, text=True)
    if r.returncode != 0:
        raise SystemExit(f"skein {' '.join(args)} exited {r.returncode}: {r.stderr}")
    return r.stdout


os.makedirs(work, exist_ok=True)
a, b = os.path.join(work, "a"), os.path.join(work, "b")
for out in (a, b):
    run("report", design, "--out", out, "--creation-date", "2027-01-01T00:00:00Z")


def same_tree(d1, d2):
    cmp = filecmp.dircmp(d1, d2)
    if cmp.left_only or cmp.right_only or cmp.diff_files or cmp.funny_files:
        return False
    return all(same_tree(os.path.join(d1, s), os.path.join(d2, s)) for s in cmp.common_dirs)


# filecmp compares contents with shallow=False only for diff_files via cmpfiles; be explicit.
def all_files(d):
    for root, _, files in os.walk(d):
        for f in files:
            yield os.path.relpath(os.path.join(root, f), d)


fa, fb = sorted(all_files(a)), sorted(all_files(b))
if fa != fb:
    fail("the two runs wrote different file lists")
else:
    for rel in fa:
        if not filecmp.cmp(os.path.join(a, rel), os.path.join(b, rel), shallow=False):
            fail(f"{rel} differs between two identical runs")
print(f"report: {len(fa)} files, reproducible")

# 2. GeoJSON (grids with cells; a sites grid has none)
geojson_path = os.path.join(a, "exports", "coverage_cells.geojson")
if os.path.exists(geojson_path):
    with open(geojson_path) as f:
        gj = json.load(f)
    if gj.get("type") != "FeatureCollection":
        fail("GeoJSON is not a FeatureCollection")
    weight = 0.0
    for k, feat in enumerate(gj["features"]):
        ring = feat["geometry"]["coordinates"][0]
        if feat["geometry"]["type"] != "Polygon" or len(ring) < 4 or ring[0] != ring[-1]:
            fail(f"feature {k}: not a closed Polygon ring")
            break
        area2 = sum(ring[j][0] * ring[j + 1][1] - ring[j + 1][0] * ring[j][1] for j in range(len(ring) - 1))
        if area2 <= 0:
            fail(f"feature {k}: ring is clockwise")
            break
        if any(not (-180 <= p[0] <= 180 and -90 <= p[1] <= 90) for p in ring):
            fail(f"feature {k}: position out of range or not [lon, lat]")
            break
        weight += feat["properties"]["area_weight"]
    if not math.isclose(weight, 1.0, rel_tol=1e-9):
        fail(f"GeoJSON area weights sum to {weight}, expected 1")
    print(f"geojson: {len(gj['features'])} cells checked")

# 3. OEM
check = json.loads(run("check", design, "--format", "json"))
sat_a = {s["id"]: (s["a_km"], s["e"]) for s in check["satellites"]}
oem_dir = os.path.join(a, "exports", "oem")
oems = sorted(os.listdir(oem_dir))
if sorted(x[:-4] for x in oems) != sorted(sat_a):
    fail("OEM files do not match the satellites of `skein check`")
epoch_re = re.compile(r"^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d(\.\d+)?$")
for name in oems:
    lines = [l.strip() for l in open(os.path.join(oem_dir, name)) if l.strip()]
    if lines[0] != "CCSDS_OEM_VERS = 2.0":
        fail(f"{name}: first line {lines[0]!r}")
    kv = dict(l.split(" = ", 1) for l in lines if " = " in l)
    for key in ("CREATION_DATE", "ORIGINATOR", "OBJECT_NAME", "OBJECT_ID", "CENTER_NAME", "REF_FRAME",
                "TIME_SYSTEM", "START_TIME", "STOP_TIME"):
        if key not in kv:
            fail(f"{name}: missing {key}")
    data = lines[lines.index("META_STOP") + 1:]
    a_km, e = sat_a[name[:-4]]
    times = []
    for l in data:
        parts = l.split()
        if len(parts) != 7 or not epoch_re.match(parts[0]):
            fail(f"{name}: bad data line {l!r}")
            break
        times.append(parts[0])
        r = math.sqrt(sum(float(x) ** 2 for x in parts[1:4]))
        if not (a_km * (1 - e) - 1e-3 <= r <= a_km * (1 + e) + 1e-3):
            fail(f"{name}: radius {r} outside perigee..apogee")
            break
    if times != sorted(times) or times[0] != kv["START_TIME"] or times[-1] != kv["STOP_TIME"]:
        fail(f"{name}: times not increasing or not matching START_TIME/STOP_TIME")
print(f"oem: {len(oems)} files checked")

# 4. summary.md against tables/*.json against the commands' JSON
summary = open(os.path.join(a, "summary.md")).read()
tables = {}
for stem in os.listdir(os.path.join(a, "tables")):
    if stem.endswith(".json"):
        t = json.load(open(os.path.join(a, "tables", stem)))
        tables[t["title"]] = (stem[:-5], t["rows"])
blocks = re.findall(r"\*\*(.+?)\*\*\n\n((?:\|.*\|\n)+)", summary)
if len(blocks) < 6:
    fail(f"summary.md holds only {len(blocks)} tables")
def md_text(s):
    # summary.md escapes text (markdown_escape: \ ` * _ [ ] | ~ with a backslash, < > & as entities): undo it.
    return html.unescape(re.sub(r"\\([\\`*_\[\]|~])", r"\1", s))


for title, body in blocks:
    title = md_text(title)
    if title not in tables:
        fail(f"summary table {title!r} has no tables/*.json twin")
        continue
    rows = [[md_text(c.strip()) for c in re.split(r"(?<!\\)\|", line.strip()[1:-1])]
            for line in body.strip().split("\n")[2:]]
    stem, jrows = tables[title]
    if len(rows) != len(jrows):
        fail(f"{stem}: {len(rows)} rows in summary.md, {len(jrows)} in JSON")
        continue
    for row, jrow in zip(rows, jrows):
        for cell, (key, value) in zip(row, jrow.items()):
            if value is None:
                ok = cell == "-"
            elif isinstance(value, (int, float)) and not isinstance(value, bool):
                decimals = len(cell.split(".")[1]) if "." in cell else 0
                ok = math.isclose(float(cell), value, abs_tol=0.51 * 10 ** -decimals)
            else:
                ok = cell == str(value)
            if not ok:
                fail(f"{stem}.{key}: summary.md shows {cell!r}, JSON holds {value!r}")
print(f"summary.md: {len(blocks)} tables match tables/*.json")


def compare_rows(stem, command_rows, key_name="name"):
    _, jrows = next(v for v in tables.values() if v[0] == stem)
    for jrow, crow in zip(jrows, command_rows):
        for key, value in jrow.items():
            if key in crow and isinstance(value, (int, float)) and not isinstance(value, bool):
                if not math.isclose(value, crow[key], rel_tol=1e-12, abs_tol=1e-12):
                    fail(f"{stem}.{key}: report {value!r} != command {crow[key]!r}")
    if len(jrows) != len(command_rows):
        fail(f"{stem}: {len(jrows)} rows, command gave {len(command_rows)}")


drift = json.loads(run("drift", design, "--format", "json"))
compare_rows("drift", drift["shells"])
compare_rows("beta_eclipse", drift["beta_eclipse"])
coverage = json.loads(run("coverage", design, "--format", "json"))
compare_rows("coverage_overview", [coverage])
budget = json.loads(run("budget", design, "--format", "json"))
compare_rows("budget_shells", budget["shells"])
print("report tables agree with drift, coverage and budget JSON")

# 5. The run record: the copy of the design is the design file's bytes, its hash is 64-bit FNV-1a of them
# (computed here from Fowler, Noll and Vo's published definition: offset basis 14695981039346656037, prime
# 1099511628211), the version is `skein --version`'s, and the command leaves the output folder out.
with open(design, "rb") as f:
    design_bytes = f.read()
with open(os.path.join(a, "design.yaml"), "rb") as f:
    if f.read() != design_bytes:
        fail("design.yaml is not a copy of the design file")
h = 14695981039346656037
for byte in design_bytes:
    h = ((h ^ byte) * 1099511628211) % (1 << 64)
with open(os.path.join(a, "tables", "run_record.json")) as f:
    record = {r["setting"]: r["value"] for r in json.load(f)["rows"]}
if not record.get("design file FNV-1a 64", "").startswith(f"{h:016x} ({len(design_bytes)} bytes"):
    fail(f"run record hash {record.get('design file FNV-1a 64')!r}, expected {h:016x}")
version = run("--version").split()[-1]
if record.get("skein version") != version:
    fail(f"run record version {record.get('skein version')!r}, skein --version says {version!r}")
command = record.get("command (FOLDER: this folder)", "")
if "--out FOLDER" not in command or work in command:
    fail(f"run record command {command!r} does not leave the output folder out")
print("run record: design copy, FNV-1a hash, version and command checked")

# 6. Reading order: the answer first.
page = open(os.path.join(a, "index.html")).read()


def md_plain(s):
    return md_text(s).replace("**", "")


first_section = summary.index("\n## ")
answer_md = md_plain(summary[:first_section])
sections_md = re.findall(r"^## (.+)$", summary, re.M)
expected_order = ["Layout and drift", "Coverage", "Ground contacts", "Lifetime and delta-v budget", "Exports",
                  "How this report was made"]
if [x for x in expected_order if x in sections_md] != sections_md:
    fail(f"summary.md sections {sections_md}, expected in the order {expected_order}")
html_sections = re.findall(r'<section[^>]*id="([a-z]+)"', page)
if not html_sections or html_sections[0] != "answer":
    fail(f"index.html does not open with the answer: sections {html_sections}")
plan_ids = ["answer", "layout", "coverage", "contacts", "budget", "exports", "record"]
if [x for x in plan_ids if x in html_sections] != html_sections:
    fail(f"index.html sections {html_sections}, expected in the order {plan_ids}")
answer_html = html.unescape(re.sub(r"<[^>]+>", "", page[page.index('id="answer"'):page.index("</section>")]))
for sh in budget["shells"]:
    for where, text in (("summary.md", answer_md), ("index.html", answer_html)):
        if not re.search("^- " * (where == "summary.md") + re.escape(sh["name"]) + ": \\d+ satellites in \\d+ planes",
                         text, re.M):
            fail(f"{where}: no design line for shell {sh['name']!r} before the first section")
for where, text in (("summary.md", answer_md), ("index.html", answer_html)):
    m = re.search(r"Coverage \(.*?\): ([0-9.]+) % of the time with at least one satellite", text)
    if not m or abs(float(m.group(1)) - coverage["percent_covered"]) > 0.051:
        fail(f"{where}: headline coverage {m and m.group(1)!r}, skein coverage gives {coverage['percent_covered']}")
    for sh in budget["shells"]:
        m = re.search(r"Budget of shell " + re.escape(sh["name"]) + r" .*?: ([0-9.]+) m/s per satellite", text)
        if not m or abs(float(m.group(1)) - sh["total_dv_m_s"]) > 0.051:
            fail(f"{where}: headline budget of {sh['name']} {m and m.group(1)!r}, skein budget gives {sh['total_dv_m_s']}")
    req = coverage.get("requirement")
    if req:
        head = f"Requirement at fold {req['fold']}: " + ("met" if req["met"] else "NOT met")
        if head not in text:
            fail(f"{where}: verdict {head!r} not in the answer")
        elif text.index(head) > text.index("satellites in"):
            fail(f"{where}: the verdict does not come before the design lines")
        for row in req["checks"]:
            if row["met"] == "no" and row["figure"] not in text:
                fail(f"{where}: failing check {row['figure']} not listed in the answer")
            for site in (row["failing_sites"] or "").split("; ") if row["met"] == "no" else []:
                if site and site not in text:
                    fail(f"{where}: failing site {site!r} of {row['figure']} not named in the answer")
print(f"reading order: answer first ({len(budget['shells'])} budget lines, "
      f"{'a verdict' if coverage.get('requirement') else 'no requirement'}), sections {sections_md}")

# index.html: figures right after the table they illustrate, tables in scroll boxes, images bounded.
pairs = [("beta_eclipse", "beta_angle"), ("coverage_folds", "coverage_map"), ("coverage_bands", "coverage_by_latitude"),
         ("in_view_distribution", "in_view_histogram"), ("budget_lines", "dv_budget"), ("lifetime_by_level", "decay_")]
for table, figure in pairs:
    t = page.find(f'id="table-{table}"')
    f = page.find(f'id="figure-{figure}')
    if t < 0 or f < 0:
        continue  # not in this report (e.g. no map on a sites grid)
    if not t < f or "<table" in page[page.index("</table>", t):f]:
        fail(f"index.html: figure {figure} is not right after table {table}")
if page.count("<table") != len(re.findall(r'<div class="table-box"[^>]*>\n<table', page)):
    fail("index.html: a table outside its scroll box")
if ".table-box{max-width:100%;overflow-x:auto" not in page or "img,svg{max-width:100%" not in page:
    fail("index.html: the scroll box or the image width rule is missing from the style")
print("index.html: figures beside their tables, tables in scroll boxes")

# 7. Site grids: the pass list holds, per site, as many passes as the per-site table counts (passes per day x
# days of span), each with rise <= time of maximum <= set and duration = set - rise, and `skein coverage --format
# json` carries the same list.
passes_path = os.path.join(a, "tables", "site_passes.json")
if os.path.exists(passes_path):
    passes = json.load(open(passes_path))["rows"]
    sites = json.load(open(os.path.join(a, "tables", "coverage_sites.json")))["rows"]
    days = coverage["span_s"] / 86400.0
    for site in sites:
        listed = [p for p in passes if p["site"] == site["name"]]
        if len(listed) != round(site["passes_per_day"] * days):
            fail(f"site {site['name']!r}: {len(listed)} passes listed, the per-site table counts "
                 f"{site['passes_per_day'] * days}")
        for p in listed:
            if not (p["rise_s"] <= p["set_s"] and abs(p["duration_min"] * 60 - (p["set_s"] - p["rise_s"])) < 1e-6
                    and p["max_elevation_deg"] >= coverage["min_elevation_deg"] - 1e-6):
                fail(f"site {site['name']!r}: pass {p} is not consistent")
                break
    if coverage.get("site_passes") != passes:
        fail("skein coverage --format json: site_passes differ from the report's tables/site_passes.json")
    print(f"site passes: {len(passes)} passes over {len(sites)} sites agree with the per-site table and skein coverage")
print(f"report checks: {0 if failures else 1} passed, {1 if failures else 0} failed")
sys.exit(1 if failures else 0)
