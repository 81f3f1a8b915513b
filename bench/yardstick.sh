#!/usr/bin/env bash
# The outside yardstick for coverage speed: `skein coverage` against a brute-force numpy script
# (bench/numpy_coverage.py) on the sparse Tern day (bench/tern_sparse_day.yaml: Walker 24/6/1, 550 km, 53 deg,
# 10 deg mask, 2 deg global grid, 24 h at 60 s).
#  1. Prints both percent-covered figures and fails (exit 1) if they differ by more than TOLERANCE_PP
#     percentage points (the README's "Speed" section gives the reasoning for 0.15 pp).
#  2. Times both whole processes with /usr/bin/time, alternating skein and numpy RUNS times, and prints each
#     pair's wall-time ratio (numpy / skein) and the median of the ratios.
# Usage: bash bench/yardstick.sh            (SKEIN=path/to/skein, RUNS=N, default build/cli/skein and 3)
set -euo pipefail
cd "$(dirname "$0")/.."
skein="${SKEIN:-build/cli/skein}"
runs="${RUNS:-3}"
tolerance_pp="${TOLERANCE_PP:-0.15}"
design=bench/tern_sparse_day.yaml
python=/usr/bin/python3   # Debian's interpreter, the one that sees python3-numpy
skein_cmd=("$skein" coverage "$design" --format json)
numpy_cmd=("$python" bench/numpy_coverage.py "$design")

tmp="$(mktemp -d)"
trap 'rm -rf "$tmp"' EXIT

"${skein_cmd[@]}" >"$tmp/skein.json" 2>"$tmp/skein.err" || { cat "$tmp/skein.err" >&2; exit 1; }
"${numpy_cmd[@]}" >"$tmp/numpy.txt"
skein_pct="$("$python" -c 'import json,sys; print("%.4f" % json.load(open(sys.argv[1]))["percent_covered"])' "$tmp/skein.json")"
numpy_pct="$(awk '$1 == "percent_covered" {print $2}' "$tmp/numpy.txt")"
diff_pp="$("$python" -c 'import sys; print("%.4f" % (float(sys.argv[2]) - float(sys.argv[1])))' "$skein_pct" "$numpy_pct")"
echo "percent covered (fold 1): skein ${skein_pct}  numpy ${numpy_pct}  numpy - skein ${diff_pp} pp (tolerance ${tolerance_pp} pp)"
if ! "$python" -c 'import sys; a, b, t = map(float, sys.argv[1:]); sys.exit(abs(a - b) > t)' \
     "$skein_pct" "$numpy_pct" "$tolerance_pp"; then
  echo "yardstick: the two answers differ by more than ${tolerance_pp} percentage points" >&2
  exit 1
fi

for ((r = 1; r <= runs; ++r)); do
  /usr/bin/time -f "%e %U %S" -o "$tmp/skein.$r" "${skein_cmd[@]}" >/dev/null 2>&1
  /usr/bin/time -f "%e %U %S" -o "$tmp/numpy.$r" "${numpy_cmd[@]}" >/dev/null
done
"$python" - "$tmp" "$runs" <<'EOF'
import statistics, sys
folder, runs = sys.argv[1], int(sys.argv[2])
def read(name, r):
    wall, user, sys_ = map(float, open(f"{folder}/{name}.{r}").read().split()[-3:])
    return wall, user + sys_
ratios, cpu_ratios = [], []
for r in range(1, runs + 1):
    (sw, sc), (nw, nc) = read("skein", r), read("numpy", r)
    ratios.append(nw / sw)
    cpu_ratios.append(nc / sc)
    print(f"run {r}: skein {sw:.2f} s wall ({sc:.2f} s CPU)  numpy {nw:.2f} s wall ({nc:.2f} s CPU)  "
          f"numpy/skein {nw / sw:.1f}x")
print(f"median ratio numpy/skein over {runs} alternating pairs: wall {statistics.median(ratios):.1f}x, "
      f"CPU {statistics.median(cpu_ratios):.1f}x")
EOF
