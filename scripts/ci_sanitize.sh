#!/usr/bin/env bash
# CI: the whole test suite under AddressSanitizer + UndefinedBehaviorSanitizer (GCC), in ./build-asan
# (or $SKEIN_ASAN_DIR). Debug at -O1 keeps assert() on and the run fast; benchmarks are not built.
# Installs its missing Debian packages first, idempotently, like scripts/setup.sh.
set -euo pipefail
cd "$(dirname "$0")/.."

packages=(build-essential cmake pkg-config libeigen3-dev libyaml-cpp-dev libtbb-dev doctest-dev libcli11-dev
          libfmt-dev nlohmann-json3-dev liberfa-dev python3 python3-numpy)
. scripts/install_missing.sh
install_missing "${packages[@]}"

build_dir="${SKEIN_ASAN_DIR:-build-asan}"
cmake -S . -B "$build_dir" -DCMAKE_BUILD_TYPE=Debug "-DCMAKE_CXX_FLAGS_DEBUG=-g -O1" -DSKEIN_SANITIZE=ON \
      -DSKEIN_BENCHMARKS=OFF ${SKEIN_CMAKE_ARGS:-} >/dev/null
cmake --build "$build_dir" -j"$(nproc)"

# Any report fails the run: leaks are checked at exit, UBSan stops at the first finding (-fno-sanitize-recover).
export ASAN_OPTIONS="detect_leaks=1:abort_on_error=0:strict_string_checks=1:detect_stack_use_after_return=1:check_initialization_order=1"
export UBSAN_OPTIONS="print_stacktrace=1:halt_on_error=1"
ctest --test-dir "$build_dir" --output-on-failure -j"$(nproc)" ${SKEIN_CTEST_ARGS:-}
