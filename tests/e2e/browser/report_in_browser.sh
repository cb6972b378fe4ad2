#!/usr/bin/env bash
# Browser test of the drawings and the review report: runs the demo (metric and US), then
# checks the outputs with outside tools: xmllint (every profile SVG is well-formed XML),
# poppler (profiles.pdf has one A3 page per profile and its first page renders), and headless
# Chromium (report.html loads without console messages, the exception table and a profile are
# in the DOM, and printed they show their text; a screenshot is not blank).
# Needs chromium, poppler-utils and libxml2-utils (scripts/browser-test.sh installs them).
# Usage: tests/e2e/browser/report_in_browser.sh path/to/rimline   Exit: 0 all passed, 1 otherwise.
set -uo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/../../.." && pwd)"
bin="${1:?usage: report_in_browser.sh path/to/rimline}"
bin="$(cd "$(dirname "$bin")" && pwd)/$(basename "$bin")"
passed=0
failed=0
ok() { passed=$((passed + 1)); echo "browser-test: ok   $*"; }
bad() { failed=$((failed + 1)); echo "browser-test: FAIL $*" >&2; }
check() { local what="$1"; shift; if "$@"; then ok "$what"; else bad "$what"; fi; }

work="$(mktemp -d /tmp/rimline-browser-test.XXXXXX)"
trap 'rm -rf "$work"' EXIT
python3 "$here/scripts/make_demo.py" >/dev/null || { echo "browser-test: make_demo.py failed" >&2; exit 1; }

chrome() {  # chrome <profile-dir-name> <args...>: one headless Chromium with a fresh profile
  local profile="$work/chrome-$1"; shift
  mkdir -p "$profile"
  timeout 120 chromium --headless --no-sandbox --disable-gpu --disable-background-networking --no-first-run \
    --disable-component-update --disable-sync --user-data-dir="$profile" "$@"
}

file_size() { stat -c %s "$1" 2>/dev/null || echo 0; }

for variant in metric us; do
  out="$work/out-$variant"
  "$bin" check "$here/data/demo/$variant/project.toml" --out "$out" >"$work/$variant.log" 2>&1
  rc=$?
  # Exit 1 only says findings at --fail-on were found; 2 and above are failures.
  check "$variant: rimline check ran (exit $rc)" test "$rc" -le 1
  check "$variant: report.html, profiles.pdf and profile SVGs written" \
    test -s "$out/report.html" -a -s "$out/profiles.pdf" -a -n "$(ls "$out"/profiles/*.svg 2>/dev/null)"
  svgs=("$out"/profiles/*.svg)
  nsvg=0
  [ -e "${svgs[0]}" ] && nsvg=${#svgs[@]}
  check "$variant: $nsvg profile SVGs are well-formed XML (xmllint)" \
    bash -c '[ "$0" -gt 0 ] && xmllint --noout "${@}" 2>/dev/null' "$nsvg" "${svgs[@]}"
  pages="$(pdfinfo "$out/profiles.pdf" 2>/dev/null | awk '/^Pages:/ {print $2}')"
  size="$(pdfinfo "$out/profiles.pdf" 2>/dev/null | awk -F': *' '/^Page size:/ {print $2}')"
  check "$variant: profiles.pdf has one page per profile (${pages:-no} pages, $nsvg profiles)" \
    test "${pages:-0}" -eq "$nsvg" -a "$nsvg" -gt 0
  check "$variant: profiles.pdf pages are A3 landscape ($size)" bash -c '[[ "$0" == *"1190.55 x 841.89"* ]]' "$size"
  pdftoppm -r 30 -f 1 -l 1 -png "$out/profiles.pdf" "$work/$variant-page" 2>/dev/null
  page_png="$(ls "$work/$variant"-page*.png 2>/dev/null | head -1)"
  check "$variant: pdftoppm -r 30 renders page 1 ($(file_size "$page_png") bytes)" test "$(file_size "$page_png")" -gt 2000

  # The page in the browser: console errors, DOM, print, screenshot.
  url="file://$out/report.html"
  chrome "$variant-dom" --enable-logging=stderr --v=0 --dump-dom "$url" >"$work/$variant-dom.html" 2>"$work/$variant-console.log"
  check "$variant: report.html loads without console errors" \
    bash -c 'grep -q "<body" "$1" && ! grep -Eq "Uncaught|:CONSOLE[:(]" "$0"' "$work/$variant-console.log" \
    "$work/$variant-dom.html"
  check "$variant: DOM has the exception table" grep -q 'id="exception-table"' "$work/$variant-dom.html"
  check "$variant: DOM has a profile drawing" grep -Eq '<svg[^>]*class="profile"' "$work/$variant-dom.html"
  check "$variant: report asks for nothing over the network" \
    bash -c 'test -s "$0" && ! grep -Eo "(src|href)=\"(https?:)?//[^\"]*\"|url\((https?:)?//" "$0" | grep -q .' \
    "$out/report.html"
  chrome "$variant-print" --no-pdf-header-footer --print-to-pdf="$work/$variant-printed.pdf" "$url" >/dev/null 2>&1
  pdftotext "$work/$variant-printed.pdf" "$work/$variant-printed.txt" 2>/dev/null
  check "$variant: printed page shows the exception list and a profile's text" \
    bash -c 'grep -q "Exception list" "$0" && grep -q "vertical exaggeration" "$0" && grep -q "outfall" "$0"' \
    "$work/$variant-printed.txt"
  chrome "$variant-shot" --hide-scrollbars --window-size=1400,2400 --screenshot="$work/$variant-shot.png" "$url" \
    >/dev/null 2>&1
  if [ "$variant" = metric ]; then
    chrome blank --hide-scrollbars --window-size=1400,2400 --screenshot="$work/blank.png" "about:blank" >/dev/null 2>&1
  fi
  shot=$(file_size "$work/$variant-shot.png")
  blank=$(file_size "$work/blank.png")
  # A blank page of this size compresses to a few kB; the report is text and drawings.
  check "$variant: screenshot is not blank ($shot bytes, blank page $blank bytes)" \
    test "$shot" -gt 20000 -a "$shot" -gt $((4 * blank))
done

echo "browser-test: $passed passed, $failed failed"
[ "$failed" -eq 0 ]
