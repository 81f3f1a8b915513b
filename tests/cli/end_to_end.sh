#!/usr/bin/env bash
# End-to-end: every design in designs/ runs through every analysis command, and the JSON output is compared
# with the stored expectation in tests/expected/DESIGN/COMMAND.json (numbers to 1e-9 relative, see
# compare_json.py). The designs therefore double as documentation that cannot go stale.
# Regenerate expectations after an intended change with:  UPDATE=1 SKEIN=build/cli/skein SOURCE_DIR=. bash tests/cli/end_to_end.sh
set -u
: "${SKEIN:?path to the skein executable}" "${SOURCE_DIR:?project root}"
py=/usr/bin/python3
commands=(check drift)
SKEIN=$(readlink -f "$SKEIN")
subcommands=$("$SKEIN" --help 2>/dev/null | sed -n '/^Subcommands:/,$p')
for extra in coverage budget; do
  grep -qE "^  $extra( |$)" <<<"$subcommands" && commands+=("$extra")
done
failed=0; passed=0
tmp=$(mktemp -d); trap 'rm -rf "$tmp"' EXIT
for design in "$SOURCE_DIR"/designs/*.yaml; do
  name=$(basename "$design" .yaml)
  design_commands=("${commands[@]}")
  # `contacts` needs a ground_stations list: run it for the designs that have one.
  grep -q '^ground_stations:' "$design" && design_commands+=(contacts)
  for cmd in "${design_commands[@]}"; do
    expected="$SOURCE_DIR/tests/expected/$name/$cmd.json"
    out="$tmp/$name.$cmd.json"
    if ! (cd "$SOURCE_DIR" && "$SKEIN" "$cmd" "designs/$name.yaml" --format json >"$out" 2>"$tmp/err"); then
      echo "FAIL $name $cmd: exit status non-zero"; cat "$tmp/err"; failed=$((failed + 1)); continue
    fi
    if [ -n "${UPDATE:-}" ]; then
      mkdir -p "$(dirname "$expected")"; cp "$out" "$expected"; echo "updated $expected"; continue
    fi
    if [ ! -f "$expected" ]; then
      echo "FAIL $name $cmd: no stored expectation $expected (run with UPDATE=1 after checking the output)"
      failed=$((failed + 1)); continue
    fi
    if "$py" "$SOURCE_DIR/tests/cli/compare_json.py" "$expected" "$out"; then
      passed=$((passed + 1))
    else
      echo "FAIL $name $cmd: output differs from $expected"; failed=$((failed + 1))
    fi
  done
done
echo "end-to-end: $passed passed, $failed failed"
[ "$failed" -eq 0 ]
