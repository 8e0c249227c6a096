#!/usr/bin/env bash
# Builds and runs the whole test suite: a release build (warnings as errors), then the same suite
# under AddressSanitizer + UndefinedBehaviorSanitizer.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/install-deps.sh --test
jobs=$(nproc)

cmake -S . -B build/release -G Ninja -DCMAKE_BUILD_TYPE=Release -DWICKGRID_WERROR=ON
cmake --build build/release -j "$jobs"
ctest --test-dir build/release --output-on-failure -j "$jobs"

cmake -S . -B build/sanitize -G Ninja -DCMAKE_BUILD_TYPE=Debug -DWICKGRID_SANITIZE=ON \
      -DWICKGRID_BENCH=OFF -DCMAKE_CXX_FLAGS="-O1"
cmake --build build/sanitize -j "$jobs"
# The command × scenario matrix (label "matrix") checks agreement between commands, not memory: it
# runs in the release tree only, where it is fast.
ASAN_OPTIONS=detect_leaks=1:abort_on_error=1 UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1 \
  ctest --test-dir build/sanitize --output-on-failure -j "$jobs" -LE matrix
