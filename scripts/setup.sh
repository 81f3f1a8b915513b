#!/usr/bin/env bash
# One idempotent set-up step for a Debian 12 machine: install the missing packages with apt-get, then
# configure and build skein in ./build (or $SKEIN_BUILD_DIR). Safe to run again; it only does what is missing.
set -euo pipefail
cd "$(dirname "$0")/.."

packages=(build-essential cmake pkg-config libeigen3-dev libyaml-cpp-dev libtbb-dev libbenchmark-dev doctest-dev
          libcli11-dev libfmt-dev nlohmann-json3-dev libopenmpi-dev openmpi-bin
          liberfa-dev python3 python3-numpy chromium)
# liberfa-dev and python3-numpy are reference oracles for the tests; chromium renders the report page in a
# test; OpenMPI carries sweeps across machines.
packages+=(${SKEIN_EXTRA_PACKAGES:-})
. scripts/install_missing.sh
install_missing "${packages[@]}"

# Land outlines for the report's maps: Natural Earth's public-domain 1:110m land polygons as TopoJSON, from the
# world-atlas package of the npm registry (pinned version; npm checks the package's integrity hash), installed
# into third_party/world-atlas (ignored by git), the default place `skein report` looks (cli/CMakeLists.txt).
# Skipped when already there; without npm the report still works and its maps say that the outlines are missing.
land_file=third_party/world-atlas/node_modules/world-atlas/land-110m.json
if [ ! -s "$land_file" ]; then
  if command -v npm >/dev/null 2>&1; then
    mkdir -p third_party/world-atlas
    npm install --prefix third_party/world-atlas --no-save --no-package-lock --no-audit --no-fund \
        world-atlas@2.0.2 >/dev/null \
      || echo "setup: npm could not install world-atlas; report maps will have no land outlines" >&2
  else
    echo "setup: npm not found; report maps will have no land outlines (see README, Maps)" >&2
  fi
fi

build_dir="${SKEIN_BUILD_DIR:-build}"
cmake -S . -B "$build_dir" -DCMAKE_BUILD_TYPE=RelWithDebInfo ${SKEIN_CMAKE_ARGS:-} >/dev/null
cmake --build "$build_dir" -j"$(nproc)"
