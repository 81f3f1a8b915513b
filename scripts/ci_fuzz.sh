#!/usr/bin/env bash
# CI: build the libFuzzer target fuzz/design_fuzz with clang++ (Debian clang 14, ASan + UBSan) in ./build-fuzz
# (or $SKEIN_FUZZ_DIR) and run it for a bounded time on a seed corpus of designs/*.yaml and
# tests/malformed/*.yaml. Any crash, sanitizer report, unexpected exception, NaN/inf or timeout fails the run
# and leaves the input as build-fuzz/crash-* (add it to tests/malformed/ as a regression case).
# Installs its missing Debian packages first, idempotently, like scripts/setup.sh.
set -euo pipefail
cd "$(dirname "$0")/.."

packages=(clang libclang-rt-14-dev cmake pkg-config libeigen3-dev libyaml-cpp-dev libtbb-dev libcli11-dev libfmt-dev
          nlohmann-json3-dev)
. scripts/install_missing.sh
install_missing "${packages[@]}"

build_dir="${SKEIN_FUZZ_DIR:-build-fuzz}"
seconds="${SKEIN_FUZZ_SECONDS:-60}"
cmake -S . -B "$build_dir" -DCMAKE_CXX_COMPILER=clang++ -DCMAKE_BUILD_TYPE=RelWithDebInfo "-DCMAKE_CXX_FLAGS_RELWITHDEBINFO=-g -O1" \
      -DSKEIN_FUZZ=ON -DSKEIN_BENCHMARKS=OFF -DBUILD_TESTING=OFF -DSKEIN_MPI=OFF >/dev/null
cmake --build "$build_dir" -j"$(nproc)" --target design_fuzz

# A fresh working corpus each run, seeded from the designs and the malformed corpus (the seeds stay unchanged).
corpus="$build_dir/corpus"
rm -rf "$corpus"
mkdir -p "$corpus"
cp designs/*.yaml "$corpus"/
for f in tests/malformed/*.yaml; do
  [ -f "$f" ] && cp "$f" "$corpus/malformed-$(basename "$f")"
done

export ASAN_OPTIONS="detect_leaks=1:abort_on_error=1"
export UBSAN_OPTIONS="print_stacktrace=1:halt_on_error=1"
"$build_dir/fuzz/design_fuzz" -max_total_time="$seconds" -rss_limit_mb=2048 -timeout=10 -max_len=16384 \
    -artifact_prefix="$build_dir/" -print_final_stats=1 "$corpus"
