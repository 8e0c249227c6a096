#!/usr/bin/env bash
# The largest documented layout (README: at most 2 × 10⁷ drains) under an address-space cap
# (ulimit -v): every run must end with exit 0 (it fitted) or 4 (not enough memory, with its
# message), never an abort (134) or a kill. A square of 4,300 m with 1 m square spacing gives about
# 1.85 × 10⁷ drains; the caps are below and above what the terminal table and --json need.
# Release tree only: the sanitizers reserve more address space than any cap here allows.
# Usage: capped_layout.sh WICKGRID_BINARY SOURCE_DIR
set -uo pipefail
bin=$1
src=$2
dir=$(mktemp -d)
trap 'rm -rf "$dir"' EXIT
printf 'x_m,y_m\n500000,4000000\n504300,4000000\n504300,4004300\n500000,4004300\n' > "$dir/square.csv"
failures=0
run_capped() {  # CAP_KB OUTPUT_OPTIONS...
  local cap=$1
  shift
  ( ulimit -v "$cap"; exec "$bin" layout "$src/demo/scenario.yaml" --area "$dir/square.csv" --drain band-100x4 \
      --pattern square --spacing 1.0 "$@" ) > /dev/null 2> "$dir/err"
  local rc=$?
  if [[ $rc -ne 0 && $rc -ne 4 ]]; then
    echo "cap ${cap} kB, options '$*': exit $rc (allowed: 0 or 4)"; tail -n 5 "$dir/err"; failures=$((failures + 1))
  elif [[ $rc -eq 4 ]] && ! grep -q "not enough memory" "$dir/err"; then
    echo "cap ${cap} kB, options '$*': exit 4 without its message"; tail -n 5 "$dir/err"; failures=$((failures + 1))
  else
    echo "cap ${cap} kB, options '$*': exit $rc"
  fi
}
for cap in 200000 400000 700000 1000000 1600000; do run_capped "$cap"; done
for cap in 400000 1000000 2600000; do run_capped "$cap" --json; done
run_capped 1000000 --out "$dir/out"
# A run refused for memory writes nothing.
if [[ -e "$dir/out/layout.json" ]] && ! python3 -c "import json,sys; json.load(open(sys.argv[1]))" "$dir/out/layout.json"; then
  echo "a partial layout.json was left"; failures=$((failures + 1))
fi
[[ $failures -eq 0 ]] && echo "memory-capped layouts: every run exited 0 or 4"
exit "$failures"
