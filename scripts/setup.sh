#!/usr/bin/env bash
# Installs what ringroad needs on Debian 12 (only what is missing; sudo when not root), then
# configures and builds it in build/: everything, or only the CMake targets named as arguments
# (`scripts/setup.sh ringroad` builds just the program). Safe to run again: it does only what is
# left to do.
set -euo pipefail
cd "$(dirname "$0")/.."

packages=(cmake g++ make libosmium2-dev libprotozero-dev zlib1g-dev libbz2-dev libexpat1-dev
          libboost-dev nlohmann-json3-dev catch2 libcli11-dev libxxhash-dev)
scripts/install_packages.sh "${packages[@]}"

cmake -S . -B build -DCMAKE_BUILD_TYPE=Release >/dev/null
targets=()
for target in "$@"; do targets+=(--target "$target"); done
cmake --build build -j"$(nproc)" "${targets[@]}" >&2
