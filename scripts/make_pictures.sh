#!/usr/bin/env bash
# Regenerates the README's pictures (docs/img) from the current demo outputs, so the pictures
# always show what the binary writes today. Needs chromium and poppler-utils (scripts/browser-test.sh
# installs them). Usage: scripts/make_pictures.sh [path/to/rimline]   (default build/rimline)
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
bin="$(readlink -f "${1:-$here/build/rimline}")"
work="$(mktemp -d /tmp/rimline-pictures.XXXXXX)"
trap 'rm -rf "$work"' EXIT

status=0
"$bin" check "$here/data/demo/metric/project.toml" --out "$work/out" -q || status=$?
[[ $status -le 1 ]] || { echo "make_pictures: the demo run exited with $status" >&2; exit 1; }

shot() {  # shot <html-or-svg> <png> <width> <height>: a headless Chromium screenshot
  timeout 120 chromium --headless --no-sandbox --disable-gpu --hide-scrollbars --no-first-run \
    --disable-background-networking --user-data-dir="$work/chrome" \
    --window-size="$3,$4" --screenshot="$2" "file://$1" >/dev/null 2>&1
}
mkdir -p "$here/docs/img"
# The report's top: the verdict, the plan map and the start of the exception list.
shot "$work/out/report.html" "$here/docs/img/demo-report.png" 1280 1600
# The profile sheet a reviewer looks at first: the page of profiles.pdf with the most findings
# (the governing tailwater case of the trunk), at a screen resolution.
pages="$(pdfinfo "$work/out/profiles.pdf" | awk '/^Pages:/ {print $2}')"
best=1 most=-1
for ((p = 1; p <= pages; p++)); do
  n="$(pdftotext -f "$p" -l "$p" "$work/out/profiles.pdf" - | grep -cE '(FREEBOARD|FLOODED|SURCHARGED)' || true)"
  if ((n > most)); then best=$p most=$n; fi
done
pdftoppm -png -r 70 -f "$best" -l "$best" -singlefile "$work/out/profiles.pdf" "$work/profile"
cp "$work/profile.png" "$here/docs/img/demo-profile.png"
ls -l "$here/docs/img"
