#!/usr/bin/env bash
# The whole test suite under AddressSanitizer, LeakSanitizer and UndefinedBehaviorSanitizer (g++):
# configures build-sanitize/ (-O1 and line tables only: -g1 compiles a quarter faster than -g and
# still names file and line in reports; assertions on; no benchmarks), builds the program and the
# tests, and runs them through CTest; any sanitizer report fails its test. CI runs it after
# scripts/test.sh (.ci/run); it needs scripts/setup.sh's packages, plus g++'s sanitizer runtimes.
set -euo pipefail
cd "$(dirname "$0")/.."
scripts/install_packages.sh g++ libasan8 libubsan1

cmake -S . -B build-sanitize -DRINGROAD_SANITIZE=ON -DRINGROAD_BUILD_BENCHMARKS=OFF \
      -DCMAKE_BUILD_TYPE=RelWithDebInfo -DCMAKE_CXX_FLAGS_RELWITHDEBINFO="-O1 -g1" >/dev/null
cmake --build build-sanitize -j"$(nproc)" >&2

# LeakSanitizer's suppressions name single third-party functions only (see the file).
export ASAN_OPTIONS="detect_leaks=1"
export LSAN_OPTIONS="suppressions=$PWD/scripts/lsan_suppressions.txt:print_suppressions=0"
export UBSAN_OPTIONS="print_stacktrace=1:halt_on_error=1"
ctest --test-dir build-sanitize --output-on-failure -j"$(nproc)" --timeout 900
