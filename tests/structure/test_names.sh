#!/usr/bin/env bash
# Every doctest case must reach ctest whole: doctest_discover_tests turns the names into a CMake list, so a
# ';' in a name splits it, and the truncated name then selects no case at all and "passes" without running
# anything. Also: at least one case must be listed (a guard against an empty listing).
# usage: test_names.sh PATH/TO/skein_tests
set -euo pipefail
names=$("$1" --list-test-cases --no-intro 2>/dev/null | sed -n '/^=*$/!p' | grep -v '^\[doctest\]' || true)
count=$(printf '%s\n' "$names" | grep -c . || true)
bad=$(printf '%s\n' "$names" | grep ';' || true)
if [ -n "$bad" ]; then
  echo "test case names with ';' (ctest would run none of them):"
  printf '%s\n' "$bad"
  exit 1
fi
if [ "$count" -lt 100 ]; then
  echo "only $count test cases listed; expected the whole suite"
  exit 1
fi
echo "test names: $count cases, none with ';'"
