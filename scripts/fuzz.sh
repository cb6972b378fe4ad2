#!/usr/bin/env bash
# Bounded libFuzzer runs of the project-file parser and the quantity/unit parser.
# Not part of the default test run. Usage: scripts/fuzz.sh [SECONDS_PER_TARGET] (default 60)
# Needs clang and libclang-rt-14-dev (apt-get install -y clang libclang-rt-14-dev).
# Builds in build-fuzz/ with clang, ASan + UBSan and fuzzer coverage; crash inputs land in
# build-fuzz/artifacts/<target>/ — copy each into tests/data/badinput/fuzz/<target>/ as a regression.
set -euo pipefail
here=$(cd "$(dirname "$0")/.." && pwd)
secs=${1:-60}
build=$here/build-fuzz
command -v clang++ >/dev/null || { echo "fuzz.sh: clang++ not found (apt-get install -y clang libclang-rt-14-dev)"; exit 2; }
cmake -S "$here" -B "$build" -DCMAKE_CXX_COMPILER=clang++ -DCMAKE_BUILD_TYPE=RelWithDebInfo \
  -DRIMLINE_FUZZ=ON -DRIMLINE_TESTS=OFF \
  -DCMAKE_CXX_FLAGS="-fsanitize=fuzzer-no-link,address,undefined -fno-omit-frame-pointer" >/dev/null
cmake --build "$build" -j2 --target fuzz_project_parser fuzz_quantity >/dev/null

total_crashes=0
for target in fuzz_project_parser fuzz_quantity; do
  case $target in
    fuzz_project_parser) seeds=$here/fuzz/corpus/project; regress=$here/tests/data/badinput/fuzz/project ;;
    fuzz_quantity) seeds=$here/fuzz/corpus/quantity; regress=$here/tests/data/badinput/fuzz/quantity ;;
  esac
  work=$build/corpus/$target; art=$build/artifacts/$target
  mkdir -p "$work" "$art"
  dirs=("$work" "$seeds"); [ -d "$regress" ] && dirs+=("$regress")
  log=$build/$target.log
  set +e
  ASAN_OPTIONS=detect_leaks=1 UBSAN_OPTIONS=print_stacktrace=1:halt_on_error=1 \
    "$build/fuzz/$target" -max_total_time="$secs" -max_len=4096 -print_final_stats=1 -artifact_prefix="$art/" \
    "${dirs[@]}" >"$log" 2>&1
  set -e
  execs=$(grep -o 'stat::number_of_executed_units: *[0-9]*' "$log" | awk '{s+=$2} END {print s+0}' || true)
  crashes=$(find "$art" -type f \( -name 'crash-*' -o -name 'leak-*' -o -name 'timeout-*' -o -name 'oom-*' \) | wc -l)
  total_crashes=$((total_crashes + crashes))
  echo "fuzz.sh: $target: ${secs} s, $execs executions, $crashes crash/leak/timeout inputs in $art (log $log)"
done
echo "fuzz.sh: $total_crashes crash inputs in total"
[ "$total_crashes" -eq 0 ]
