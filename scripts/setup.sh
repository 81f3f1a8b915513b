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

build_dir="${SKEIN_BUILD_DIR:-build}"
cmake -S . -B "$build_dir" -DCMAKE_BUILD_TYPE=RelWithDebInfo ${SKEIN_CMAKE_ARGS:-} >/dev/null
cmake --build "$build_dir" -j"$(nproc)"
