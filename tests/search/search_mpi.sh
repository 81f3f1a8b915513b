#!/usr/bin/env bash
# skein search over 2 MPI ranks gives the same record and answer, byte for byte, as one process (the batches
# are fixed by the search file; rank 0 settles the answer after each). Skipped (77) when skein was built
# without MPI or mpirun is missing.
set -u
: "${SKEIN:?path to the skein executable}" "${SOURCE_DIR:?project root}" "${HAVE_MPI:?ON or OFF}"
if [ "$HAVE_MPI" != "ON" ] || [ -z "${MPIEXEC:-}" ]; then echo "skein built without MPI: skipped"; exit 77; fi
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
fail() { echo "FAIL: $*"; exit 1; }
case_file="$SOURCE_DIR/tests/search/cases/global.yaml"
"$SKEIN" search "$case_file" --out "$tmp/one" >/dev/null 2>"$tmp/one.txt" || { cat "$tmp/one.txt"; fail "one process"; }
"$MPIEXEC" --allow-run-as-root --oversubscribe -np 2 "$SKEIN" search "$case_file" --out "$tmp/two" --threads 1 \
  >/dev/null 2>"$tmp/two.txt" || { cat "$tmp/two.txt"; fail "two ranks"; }
grep -q "over 2 ranks" "$tmp/two.txt" || { cat "$tmp/two.txt"; fail "the run did not use 2 ranks"; }
for f in record.jsonl answer.json evaluated.csv evaluated.jsonl; do
  cmp -s "$tmp/one/$f" "$tmp/two/$f" || fail "$f differs between 1 process and 2 ranks"
done
echo "search over 2 MPI ranks: identical record and answer"
