#!/usr/bin/env bash
# The main job on the bundled demo: install what is missing, build, design, write the report.
set -euo pipefail
cd "$(dirname "$0")/.."
bash scripts/install-deps.sh
cmake -S . -B build/release -G Ninja -DCMAKE_BUILD_TYPE=Release
cmake --build build/release -j "$(nproc)" --target wickgrid
status=0
./build/release/wickgrid design demo/scenario.yaml --out demo-output || status=$?
./build/release/wickgrid report demo/scenario.yaml --out demo-output > /dev/null
echo
echo "Written to demo-output/: design.md (design note), design.json, design.csv, report.html and its charts."
exit "$status"
