#!/usr/bin/env bash
# Sets up a fresh machine and runs every test: the normal build (warnings are errors),
# then the whole suite once more under AddressSanitizer + UBSan.
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
