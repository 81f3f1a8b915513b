#!/usr/bin/env bash
# `mpirun -n 2 skein sweep` writes the same files, byte for byte, as one process. Exits 77 (ctest SKIP) when
# skein is built without MPI.
set -u
: "${SKEIN:?path to the skein executable}" "${SOURCE_DIR:?project root}" "${HAVE_MPI:?ON or OFF}"
if [ "$HAVE_MPI" != "ON" ] || [ -z "${MPIEXEC:-}" ]; then echo "skein built without MPI: skipped"; exit 77; fi
sweep="$SOURCE_DIR/designs/sweeps/kestrel-small.yaml"
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
"$SKEIN" sweep "$sweep" --out "$tmp/one" --threads 2 >/dev/null 2>"$tmp/one.err" || { cat "$tmp/one.err"; fail "one process"; }
"$MPIEXEC" --allow-run-as-root --oversubscribe -n 2 "$SKEIN" sweep "$sweep" --out "$tmp/two" --threads 1 \
  >"$tmp/two.out" 2>"$tmp/two.err" || { cat "$tmp/two.err"; fail "mpirun -n 2"; }
grep -q "over 2 ranks" "$tmp/two.err" || { cat "$tmp/two.err"; fail "the run was not split over 2 ranks"; }
for f in results.csv results.jsonl best_front.csv trade_front.csv fronts.svg; do
  cmp -s "$tmp/one/$f" "$tmp/two/$f" || fail "$f from 2 ranks differs from one process"
done
echo "sweep MPI: 2 ranks wrote the same files as one process"
