#!/usr/bin/env bash
# The layer rule (scripts/check_layers.py) holds on the tree, and the check does fail on a tree where an
# include runs back up (a copy of lib/ with one such include added), so the test can fail.
set -euo pipefail
src="${SOURCE_DIR:?}"
python3 "$src/scripts/check_layers.py" "$src"
tmp="$(mktemp -d)"
trap 'rm -rf "$tmp"' EXIT
mkdir -p "$tmp/lib"
cp -r "$src/lib/skein" "$tmp/lib/skein"
# time/ is on layer 1; coverage/ on layer 6: an include from time to coverage runs back up.
echo '#include "skein/coverage/grid.hpp"' >> "$tmp/lib/skein/time/sun.cpp"
if python3 "$src/scripts/check_layers.py" "$tmp" > "$tmp/out.txt"; then
  echo "layers: the check passed a tree with an include that runs back up" >&2
  exit 1
fi
grep -q "lib/skein/time/sun.cpp:.*includes skein/coverage/grid.hpp" "$tmp/out.txt"
# A header that brings yaml-cpp in is refused too.
cp -r "$src/lib/skein/." "$tmp/lib/skein/"
echo '#include <yaml-cpp/yaml.h>' >> "$tmp/lib/skein/design/design.hpp"
if python3 "$src/scripts/check_layers.py" "$tmp" > "$tmp/out.txt"; then
  echo "layers: the check passed a header that includes yaml-cpp" >&2
  exit 1
fi
grep -q "design/design.hpp:.*a header includes yaml-cpp" "$tmp/out.txt"
echo "layers: rule holds, and the check refuses both injected violations"
