#!/usr/bin/env bash
# Sets up a fresh machine and runs every test: the whole suite under AddressSanitizer + UBSan
# (warnings are errors), the demo report in a real browser and the demo read from PostGIS with
# that same binary, then the threaded parts under ThreadSanitizer.
# Why no separate release build here: compiling the project is most of CI's time on a 2-core
# machine, and a second full build ran the very same tests again without a sanitizer. Developers
# still build RelWithDebInfo with -DRIMLINE_WERROR=ON (README, DEVELOPERS.md) before committing.
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$here"

# Installs the Debian packages, then configures and builds the sanitizer variant (the later -D
# arguments override setup.sh's default build type).
"$here/scripts/setup.sh" "$here/build-asan" -DCMAKE_BUILD_TYPE=Debug -DRIMLINE_SANITIZE=ON -DRIMLINE_WERROR=ON
"$here/scripts/check-layering.sh"

echo "== the suite under AddressSanitizer + UBSan" >&2
(cd "$here/build-asan" && ASAN_OPTIONS=detect_leaks=1 UBSAN_OPTIONS=print_stacktrace=1 ctest --output-on-failure -j2)

# The outside-tool tests judge outputs; memory is judged by the suite above. LeakSanitizer is off
# here because libpq and GDAL's driver teardown keep allocations to exit (address errors still abort).
export ASAN_OPTIONS=detect_leaks=0 UBSAN_OPTIONS=print_stacktrace=1
echo "== the demo report in a real browser, the PDF and SVG profiles" >&2
bash "$here/scripts/browser-test.sh" "$here/build-asan/rimline"

echo "== the demo read from a PostGIS database, compared with the file-based run" >&2
bash "$here/scripts/postgis-test.sh" "$here/build-asan/rimline"
unset ASAN_OPTIONS UBSAN_OPTIONS

echo "== the threaded march and output writers under ThreadSanitizer" >&2
cmake -S "$here" -B "$here/build-tsan" -DCMAKE_BUILD_TYPE=RelWithDebInfo -DRIMLINE_TSAN=ON -DRIMLINE_WERROR=ON >/dev/null
cmake --build "$here/build-tsan" -j"$(nproc)" --target rimline test_solve
export TSAN_OPTIONS="halt_on_error=1 second_deadlock_stack=1 suppressions=$here/scripts/tsan.supp"
"$here/build-tsan/tests/test_solve" "[threads]"
tsan_net="$(mktemp -d)"
trap 'rm -rf "$tsan_net"' EXIT
/usr/bin/python3 "$here/scripts/make_network.py" --pipes 6000 --seed 3 --out "$tsan_net/net" >/dev/null
# 6000 pipes in 3 trees: the march runs on two threads; results.gpkg is written beside the drawings.
status=0
"$here/build-tsan/rimline" check "$tsan_net/net/project.toml" --out "$tsan_net/out" -q || status=$?
[[ $status -le 1 ]] || { echo "rimline under ThreadSanitizer exited with $status" >&2; exit 1; }
# Connection headroom shares the structures out over two workers (an idle one takes a subtree from the
# busy one): headroom at every structure of a 1,500-pipe network.
/usr/bin/python3 "$here/scripts/make_network.py" --pipes 1500 --seed 3 --out "$tsan_net/small" >/dev/null
status=0
"$here/build-tsan/rimline" check "$tsan_net/small/project.toml" --headroom --no-drawings --out "$tsan_net/out-headroom" -q \
  || status=$?
[[ $status -le 1 ]] || { echo "rimline --headroom under ThreadSanitizer exited with $status" >&2; exit 1; }
echo "ThreadSanitizer: no data race reported" >&2
