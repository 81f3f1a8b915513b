#!/usr/bin/env bash
# The malformed-design corpus: runs `skein check` on every case listed in expected.tsv and compares its exit
# status and its whole stderr with the expected ones (stdout must stay empty: nothing is written on error).
# Cases under sweep/ are sweep files (or files given where a sweep file is expected): they run through
# `skein sweep CASE --out DIR`, and DIR must not be created (the reader's guards run before any work); cases
# under search/ are search files, run through `skein search CASE --out DIR` the same way.
# Usage: SKEIN=path/to/skein bash tests/malformed/run.sh        (ctest: malformed.corpus)
# Each line of expected.tsv: CASE <TAB> EXIT_STATUS <TAB> EXACT_STDERR. CASE is a path relative to this
# folder (a_directory.yaml is a folder, no_such_file.yaml does not exist), or an absolute path (/dev/zero).
# CASE may be COMMAND:PATH to run `skein COMMAND PATH` instead of `skein check PATH`, for the guards that only
# that command reaches (coverage:, report:, sweep:). Lines starting with # are comments.
# With UPDATE=1 it rewrites expected.tsv from the current output instead (review the diff before keeping it).
set -uo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
skein="${SKEIN:?set SKEIN to the skein executable}"
cd "$here"

failures=0
count=0
out_tmp="$(mktemp)"
err_tmp="$(mktemp)"
new_tsv="$(mktemp)"
sweep_out="$(mktemp -d)"
trap 'rm -f "$out_tmp" "$err_tmp" "$new_tsv"; rm -rf "$sweep_out"' EXIT

# Every .yaml here must be listed, so no case is silently skipped.
for f in *.yaml sweep/*.yaml search/*.yaml; do
  if ! cut -f1 expected.tsv | sed 's/^[a-z]*://' | grep -qxF "$f"; then
    echo "malformed: $f has no line in expected.tsv" >&2
    failures=$((failures + 1))
  fi
done

while IFS=$'\t' read -r name status message; do
  [ -z "$name" ] && continue
  case "$name" in \#*) echo "$name"$'\t'"$status"$'\t'"$message" >> "$new_tsv"; continue ;; esac
  count=$((count + 1))
  wrote=""
  case "$name" in
    sweep/*)
      timeout 20 "$skein" sweep "$name" --out "$sweep_out/run" > "$out_tmp" 2> "$err_tmp"
      got_status=$?
      if [ -e "$sweep_out/run" ]; then wrote=yes; rm -rf "$sweep_out/run"; fi ;;
    search/*)
      timeout 20 "$skein" search "$name" --out "$sweep_out/run" > "$out_tmp" 2> "$err_tmp"
      got_status=$?
      if [ -e "$sweep_out/run" ]; then wrote=yes; rm -rf "$sweep_out/run"; fi ;;
    *)
      command=check path="$name"
      case "$name" in [a-z]*:*) command="${name%%:*}" path="${name#*:}" ;; esac
      timeout 20 "$skein" "$command" "$path" > "$out_tmp" 2> "$err_tmp"
      got_status=$? ;;
  esac
  got_message="$(cat "$err_tmp")"
  printf '%s\t%s\t%s\n' "$name" "$got_status" "$got_message" >> "$new_tsv"
  if [ "$got_status" != "$status" ] || [ "$got_message" != "$message" ] || [ -s "$out_tmp" ] || [ -n "$wrote" ]; then
    failures=$((failures + 1))
    echo "FAIL $name" >&2
    echo "  expected status $status: $message" >&2
    echo "  got      status $got_status: $got_message" >&2
    [ -s "$out_tmp" ] && echo "  and stdout was not empty ($(wc -c < "$out_tmp") bytes)" >&2
    [ -n "$wrote" ] && echo "  and the sweep created its output folder" >&2
  fi
done < expected.tsv

if [ "${UPDATE:-0}" = 1 ]; then
  cp "$new_tsv" expected.tsv
  echo "malformed: rewrote expected.tsv from $count cases" >&2
  exit 0
fi
echo "malformed: $count cases, $failures failed" >&2
[ "$failures" -eq 0 ]
