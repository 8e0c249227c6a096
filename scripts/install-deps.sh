#!/usr/bin/env bash
# Installs the Debian 12 packages wickgrid needs, only those missing (idempotent).
# With --test, also what the test suite needs: SciPy for the oracle, Chromium and Pillow for the
# report render and print checks (poppler-utils reads the PDF), clang and its libFuzzer runtime for
# the fuzz run.
set -euo pipefail
packages=(g++ cmake ninja-build libboost-dev libboost-math-dev libyaml-cpp-dev libspdlog-dev libcli11-dev
          nlohmann-json3-dev libgtest-dev libbenchmark-dev libeigen3-dev libssl-dev)
if [ "${1:-}" = "--test" ]; then
  packages+=(python3 python3-scipy python3-numpy python3-pil chromium poppler-utils clang libclang-rt-14-dev)
fi
missing=()
for p in "${packages[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if ((${#missing[@]})); then
  echo "installing: ${missing[*]}"
  sudo_cmd=()
  [ "$(id -u)" -eq 0 ] || sudo_cmd=(sudo)
  "${sudo_cmd[@]}" apt-get update -qq
  DEBIAN_FRONTEND=noninteractive "${sudo_cmd[@]}" apt-get install -y -qq --no-install-recommends "${missing[@]}"
fi
