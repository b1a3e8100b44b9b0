#!/usr/bin/env bash
# Fuzzing with libFuzzer (clang, AddressSanitizer and UndefinedBehaviorSanitizer) in build-fuzz/.
#
#   scripts/fuzz.sh TARGET [SECONDS]   fuzz one target (default 600 s); TARGET is one of the names
#                                      below, or `all` for each in turn
#   scripts/fuzz.sh --ci [SECONDS]     what CI runs: every target's regression inputs must pass,
#                                      then each target is fuzzed for SECONDS (default 30)
#
# The corpus grows in build-fuzz/corpus/TARGET/ from one run to the next, seeded from
# fuzz/seeds/TARGET/, the fixtures and files made from them; crashes land in
# build-fuzz/crashes/TARGET/ and each run appends a line to build-fuzz/fuzz-history.tsv. A crash
# found becomes a regression input in fuzz/regressions/TARGET/ once fixed (fuzz/FUZZING.md);
# until then it waits in fuzz/findings/TARGET/, and while any of those still crashes, --ci
# reports it and skips fuzzing that target instead of failing on the known defect.
set -euo pipefail
cd "$(dirname "$0")/.."
targets=(region_file stops_csv matrix_csv osm_xml osm_pbf)

usage() { echo "usage: scripts/fuzz.sh (TARGET|all) [SECONDS] | --ci [SECONDS]; targets: ${targets[*]}" >&2; exit 2; }
[ $# -ge 1 ] || usage
ci=false
if [ "$1" = "--ci" ]; then
  ci=true; chosen=("${targets[@]}"); seconds=${2:-30}
elif [ "$1" = "all" ]; then
  chosen=("${targets[@]}"); seconds=${2:-600}
else
  [[ " ${targets[*]} " == *" $1 "* ]] || usage
  chosen=("$1"); seconds=${2:-600}
fi
[[ "$seconds" =~ ^[0-9]+$ ]] && [ "$seconds" -gt 0 ] || usage

scripts/install_packages.sh clang libclang-rt-14-dev

build=build-fuzz
cmake -S . -B "$build" -DCMAKE_CXX_COMPILER=clang++ -DRINGROAD_FUZZ=ON -DRINGROAD_BUILD_TESTS=OFF \
      -DRINGROAD_BUILD_BENCHMARKS=OFF -DCMAKE_BUILD_TYPE=RelWithDebInfo \
      -DCMAKE_CXX_FLAGS_RELWITHDEBINFO="-O1 -gline-tables-only" >/dev/null
build_targets=(--target fuzz_seeds)
for target in "${chosen[@]}"; do build_targets+=(--target "${target}_fuzz"); done
cmake --build "$build" -j"$(nproc)" "${build_targets[@]}" >&2

# Seeds: hand-written ones, the fixtures, and PBF and region files made from the OSM fixtures.
seeds=$build/seeds
osm_fixtures=(fixtures/demo/*.osm fixtures/extract/*.osm fixtures/router/*.osm)
if [ ! -f "$seeds/.made" ] || [ "$build/fuzz/fuzz_seeds" -nt "$seeds/.made" ]; then
  rm -rf "$seeds"
  for target in "${targets[@]}"; do mkdir -p "$seeds/$target"; cp fuzz/seeds/"$target"/* "$seeds/$target/" 2>/dev/null || true; done
  cp "${osm_fixtures[@]}" "$seeds/osm_xml/"
  cp fixtures/demo/stops.csv "$seeds/stops_csv/"
  ASAN_OPTIONS=detect_leaks=0 "$build/fuzz/fuzz_seeds" "$seeds" "${osm_fixtures[@]}"
  touch "$seeds/.made"
fi

scratch=$(mktemp -d /dev/shm/ringroad-fuzz.XXXXXX 2>/dev/null || mktemp -d)
trap 'rm -rf "$scratch"' EXIT
export RINGROAD_FUZZ_SCRATCH=$scratch
export ASAN_OPTIONS="detect_leaks=1"
export LSAN_OPTIONS="suppressions=$PWD/scripts/lsan_suppressions.txt:print_suppressions=0"
export UBSAN_OPTIONS="print_stacktrace=1:halt_on_error=1:suppressions=$PWD/scripts/ubsan_suppressions.txt"
limits=(-timeout=20 -rss_limit_mb=2048 -malloc_limit_mb=2048)
mkdir -p "$build/logs"

# Replays every file in a folder once; fails on the first that crashes.
replay() {
  local target=$1 folder=$2 files
  files=$(find "$folder" -maxdepth 1 -type f ! -name '.*' | sort)
  [ -n "$files" ] || return 0
  # shellcheck disable=SC2086
  "$build/fuzz/${target}_fuzz" "${limits[@]}" $files >"$build/logs/${target}-replay.log" 2>&1
}

status=0
for target in "${chosen[@]}"; do
  binary=$build/fuzz/${target}_fuzz
  if $ci; then
    if ! replay "$target" "fuzz/regressions/$target"; then
      echo "fuzz $target: a regression input crashes again:" >&2
      tail -n 40 "$build/logs/${target}-replay.log" >&2
      status=1
      continue
    fi
    if [ -d "fuzz/findings/$target" ] && ! replay "$target" "fuzz/findings/$target"; then
      echo "fuzz $target: known findings in fuzz/findings/$target still crash (see fuzz/FUZZING.md);" \
           "not fuzzed until they are fixed" >&2
      continue
    fi
  fi
  corpus=$build/corpus/$target
  crashes=$build/crashes/$target
  mkdir -p "$corpus" "$crashes"
  log=$build/logs/$target-$(date -u +%Y%m%dT%H%M%S).log
  echo "fuzz $target: ${seconds} s, log in $log" >&2
  # CI stops at the first crash; a longer run goes on in fork mode, collecting every crash.
  mode=()
  $ci || mode=(-fork=1 -ignore_crashes=1 -ignore_ooms=1 -ignore_timeouts=1)
  before=$(find "$crashes" -type f | wc -l)
  result=ok
  "$binary" "${limits[@]}" "${mode[@]}" -max_total_time="$seconds" -print_final_stats=1 \
            -artifact_prefix="$crashes/" "$corpus" "$seeds/$target" >"$log" 2>&1 || result=crash
  found=$(( $(find "$crashes" -type f | wc -l) - before ))
  [ "$found" -eq 0 ] || result="crash ($found new inputs in $crashes)"
  executions=$(sed -n 's/^stat::number_of_executed_units: *//p' "$log" | tail -n 1)
  [ -n "$executions" ] || executions=$(sed -n 's/^#\([0-9]*\):.*/\1/p' "$log" | tail -n 1)
  printf '%s\t%s\t%s\t%s\t%s\n' "$(date -u +%FT%TZ)" "$target" "$seconds" "${executions:-?}" "$result" \
    >>"$build/fuzz-history.tsv"
  echo "fuzz $target: ${executions:-?} executions, corpus $(find "$corpus" -type f | wc -l) files: $result" >&2
  if [ "$result" != ok ]; then
    grep -E '^(==[0-9]+==ERROR|SUMMARY|artifact_prefix|Test unit written)|broken promise|runtime error' "$log" | head -n 20 >&2
    status=1
  fi
done
exit $status
