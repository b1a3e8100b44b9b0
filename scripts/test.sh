#!/usr/bin/env bash
# Sets everything up (scripts/setup.sh), then runs the whole test suite through CTest.
set -euo pipefail
cd "$(dirname "$0")/.."
scripts/setup.sh
ctest --test-dir build --output-on-failure -j"$(nproc)"
