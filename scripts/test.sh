#!/usr/bin/env bash
# Builds and runs the whole test suite: a release build (warnings as errors), then the same suite
# under AddressSanitizer + UndefinedBehaviorSanitizer, then a bounded libFuzzer run of the scenario
# loader, design and writers (clang; fails on any finding).
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/install-deps.sh --test
jobs=$(nproc)

cmake -S . -B build/release -G Ninja -DCMAKE_BUILD_TYPE=Release -DWICKGRID_WERROR=ON
# Fast gate: the engine and its unit tests first (a few minutes), so a broken engine fails early.
cmake --build build/release -j "$jobs" --target wickgrid_engine_tests
ctest --test-dir build/release --output-on-failure -j "$jobs" -L unit
cmake --build build/release -j "$jobs"
ctest --test-dir build/release --output-on-failure -j "$jobs" -LE unit

cmake -S . -B build/sanitize -G Ninja -DCMAKE_BUILD_TYPE=Debug -DWICKGRID_SANITIZE=ON \
      -DWICKGRID_BENCH=OFF -DCMAKE_CXX_FLAGS="-O1"
cmake --build build/sanitize -j "$jobs"
# The command × scenario matrix (label "matrix"), the SciPy oracle and the printed-report check (label
# "agreement") check agreement with other computations, not memory: they run in the release tree
# only, where they are fast. The engine paths they reach run under the sanitizers in the unit and
# command tests.
ASAN_OPTIONS=detect_leaks=1:abort_on_error=1 UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1 \
  ctest --test-dir build/sanitize --output-on-failure -j "$jobs" -LE "matrix|agreement"

# Fuzz: the scenario loader for about two minutes and the layout's area readers for one, from the
# bundled files as seeds (FUZZ_SECONDS and FUZZ_AREA_SECONDS to change). New corpus entries and any
# finding go to a temporary folder; a finding fails the run and is printed.
CXX=clang++ cmake -S . -B build/fuzz -G Ninja -DCMAKE_BUILD_TYPE=Debug -DWICKGRID_FUZZ=ON -DWICKGRID_TESTS=OFF \
      -DWICKGRID_BENCH=OFF -DCMAKE_CXX_FLAGS="-O1"
cmake --build build/fuzz -j "$jobs" --target wickgrid_fuzz_scenario wickgrid_fuzz_area

# fuzz TARGET SECONDS SEED_FILES...
fuzz() {
  local target=$1 seconds=$2
  shift 2
  local dir
  dir=$(mktemp -d)
  mkdir -p "$dir/corpus" "$dir/findings"
  cp "$@" "$dir/corpus/"
  if ! "./build/fuzz/$target" "$dir/corpus" -max_total_time="$seconds" -timeout=10 \
        -rss_limit_mb=2048 -max_len=8192 -artifact_prefix="$dir/findings/" > "$dir/log" 2>&1; then
    tail -n 60 "$dir/log"
    for f in "$dir"/findings/*; do echo "finding $f:"; od -c "$f" | head -n 20; done
    echo "fuzz $target: 0 passed, 1 failed"
    exit 1
  fi
  grep -E "^Done [0-9]+ runs" "$dir/log"
  rm -rf "$dir"
  echo "fuzz $target: 1 passed, 0 failed"
}
fuzz wickgrid_fuzz_scenario "${FUZZ_SECONDS:-120}" demo/scenario.yaml configs/*.yaml fuzz/corpus/*.yaml
fuzz wickgrid_fuzz_area "${FUZZ_AREA_SECONDS:-60}" demo/zone-c-area.geojson demo/zone-c-boreholes.csv fuzz/corpus-area/*
