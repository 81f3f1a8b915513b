#!/usr/bin/env bash
# skein budget --samples: the same seed gives the same JSON at 1 and 2 threads; a seed change changes it; bad flags
# are refused with the flag, the value and the valid range (exit 2), before any work.
set -u
: "${SKEIN:?path to the skein executable}" "${SOURCE_DIR:?project root}"
design="$SOURCE_DIR/designs/spread.yaml"
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
failed=0
fail() { echo "FAIL: $*"; failed=$((failed + 1)); }

"$SKEIN" budget "$design" --format json --samples 120 --seed 5 --threads 1 >"$tmp/one.json" 2>/dev/null || fail "1 thread run"
"$SKEIN" budget "$design" --format json --samples 120 --seed 5 --threads 2 >"$tmp/two.json" 2>/dev/null || fail "2 thread run"
cmp -s "$tmp/one.json" "$tmp/two.json" || fail "1 and 2 threads differ"
"$SKEIN" budget "$design" --format json --samples 120 --seed 6 --threads 2 >"$tmp/other.json" 2>/dev/null || fail "seed 6 run"
cmp -s "$tmp/one.json" "$tmp/other.json" && fail "seeds 5 and 6 gave the same output"
grep -q '"p95_standard_error"' "$tmp/one.json" || fail "no p95_standard_error in the JSON"

"$SKEIN" budget "$design" 2>"$tmp/err" >"$tmp/out" || fail "text run"
grep -q "^Caution: Monte Carlo percentiles reflect the stated input spreads only" "$tmp/err" || fail "no Monte Carlo caution"
grep -q "stated case" "$tmp/out" || fail "no stated-case column beside the percentiles"

expect_refusal() {  # ARGS... ; EXPECTED_MESSAGE in $msg
  "$SKEIN" budget "$design" "$@" >"$tmp/out" 2>"$tmp/err"
  local status=$?
  [ "$status" -eq 2 ] || fail "$* exited $status, expected 2"
  [ ! -s "$tmp/out" ] || fail "$* wrote to stdout"
  grep -qxF "$msg" "$tmp/err" || { fail "$*: expected '$msg', got:"; cat "$tmp/err"; }
}
msg="skein: error: --samples: budget.samples = 0: expected 100 to 1000000 Monte Carlo samples (fewer leave under 5 samples beyond P95; more would run for hours)"
expect_refusal --samples 0
msg="skein: error: --samples: budget.samples = 50000000: expected 100 to 1000000 Monte Carlo samples (fewer leave under 5 samples beyond P95; more would run for hours)"
expect_refusal --samples 50000000
msg="skein: error: --seed: budget.seed = 9007199254740993: expected a seed from 0 to 2^53 = 9007199254740992"
expect_refusal --seed 9007199254740993

echo "budget samples: $failed failed"
[ "$failed" -eq 0 ]
