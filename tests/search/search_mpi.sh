#!/usr/bin/env bash
# skein search over 2 MPI ranks gives the same record and answer, byte for byte, as one process (the batches
# are fixed by the search file; rank 0 settles the answer after each). Skipped (77) when skein was built
# without MPI or mpirun is missing.
set -u
: "${SKEIN:?path to the skein executable}" "${SOURCE_DIR:?project root}" "${HAVE_MPI:?ON or OFF}"
if [ "$HAVE_MPI" != "ON" ] || [ -z "${MPIEXEC:-}" ]; then echo "skein built without MPI: skipped"; exit 77; fi
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
# The global case, and the screened regional case (rank 0 screens each batch and tells the others which
# layouts it ruled out).
for c in global screened-regional; do
  case_file="$SOURCE_DIR/tests/search/cases/$c.yaml"
  "$SKEIN" search "$case_file" --out "$tmp/$c-one" >/dev/null 2>"$tmp/one.txt" || { cat "$tmp/one.txt"; fail "$c: one process"; }
  "$MPIEXEC" --allow-run-as-root --oversubscribe -np 2 "$SKEIN" search "$case_file" --out "$tmp/$c-two" --threads 1 \
    >/dev/null 2>"$tmp/two.txt" || { cat "$tmp/two.txt"; fail "$c: two ranks"; }
  grep -q "over 2 ranks" "$tmp/two.txt" || { cat "$tmp/two.txt"; fail "$c: the run did not use 2 ranks"; }
  for f in record.jsonl answer.json evaluated.csv evaluated.jsonl; do
    cmp -s "$tmp/$c-one/$f" "$tmp/$c-two/$f" || fail "$c: $f differs between 1 process and 2 ranks"
  done
done
echo "search over 2 MPI ranks: identical record and answer (global, screened regional)"
