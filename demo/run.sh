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
./build/release/wickgrid layout demo/scenario.yaml --area demo/zone-c-area.geojson --drain band-100x4 \
  --pattern triangular --spacing 1.2 --edge-offset-m 0.6 --base-depths demo/zone-c-boreholes.csv \
  --out demo-output > /dev/null
echo
echo "Written to demo-output/: design.md (design note), design.json, design.csv, report.html and its charts;"
echo "layout.html, layout-plan.svg, layout.csv, layout.geojson and layout.json (the recommended design set out at 1.20 m)."
exit "$status"
