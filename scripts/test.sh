#!/usr/bin/env bash
# Sets up a fresh machine and runs every test: the normal build (warnings are errors),
# then the whole suite once more under AddressSanitizer + UBSan, then the threaded parts under
# ThreadSanitizer.
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
cd "$here"

"$here/scripts/setup.sh" "$here/build" -DRIMLINE_WERROR=ON
"$here/scripts/check-layering.sh"
(cd "$here/build" && ctest --output-on-failure -j2)

echo "== the demo report in a real browser, the PDF and SVG profiles" >&2
bash "$here/scripts/browser-test.sh" "$here/build/rimline"

echo "== the demo read from a PostGIS database, compared with the file-based run" >&2
bash "$here/scripts/postgis-test.sh" "$here/build/rimline"

echo "== the suite again under AddressSanitizer + UBSan" >&2
cmake -S "$here" -B "$here/build-asan" -DCMAKE_BUILD_TYPE=Debug -DRIMLINE_SANITIZE=ON -DRIMLINE_WERROR=ON >/dev/null
cmake --build "$here/build-asan" -j"$(nproc)"
(cd "$here/build-asan" && ASAN_OPTIONS=detect_leaks=1 UBSAN_OPTIONS=print_stacktrace=1 ctest --output-on-failure -j2)

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
echo "ThreadSanitizer: no data race reported" >&2
