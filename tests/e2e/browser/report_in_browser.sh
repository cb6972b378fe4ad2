#!/usr/bin/env bash
# Browser test of the drawings and the review report: runs the demo (metric and US), then
# checks the outputs with outside tools: xmllint (every profile SVG is well-formed XML),
# poppler (profiles.pdf has one A3 page per profile and its first page renders), and headless
# Chromium (report.html loads without console messages, the exception table and a profile are
# in the DOM, and printed they show their text; a screenshot is not blank). report_probe.html drives
# the page in a frame as a reviewer would: the verdict first and naming T-04's shortfall, the plan
# map with one element per structure and pipe, a click showing a feature, the results tables
# sorting and filtering, every exception row's links reaching its profile and map feature, no
# resource fetched. Printed (A3 landscape) the energy budgets show; profiles.pdf's text is at least
# 2.5 mm high (pdftotext -bbox word heights) and it holds the plan sheet.
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
  check "$variant: profiles.pdf has the plan and one page per profile (${pages:-no} pages, $nsvg profiles)" \
    test "${pages:-0}" -eq $((nsvg + 1)) -a "$nsvg" -gt 0
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
  printed_pages="$(pdfinfo "$work/$variant-printed.pdf" 2>/dev/null | awk '/^Pages:/ {print $2}')"
  printed_size="$(pdfinfo "$work/$variant-printed.pdf" 2>/dev/null | awk -F': *' '/^Page size:/ {print $2}')"
  # The demo prints to about 16 A3 landscape pages; a layout that breaks (a table one column per page,
  # a drawing per page) shows as many more.
  check "$variant: printed as ${printed_pages:-no} A3 landscape pages ($printed_size), 8 to 30" \
    bash -c '[ "${0:-0}" -ge 8 ] && [ "${0:-0}" -le 30 ] && [[ "$1" == *"1191"*"x 841"* ]]' "$printed_pages" "$printed_size"
  check "$variant: printed page shows the energy budget (open in print)" \
    bash -c 'grep -q "HGL in the structure (its energy level)" "$0" && grep -q "Energy budget to the outfall" "$0"' \
    "$work/$variant-printed.txt"
  cp "$here/tests/e2e/browser/report_probe.html" "$out/report_probe.html"
  chrome "$variant-probe" --allow-file-access-from-files --virtual-time-budget=20000 --dump-dom \
    "file://$out/report_probe.html" >"$work/$variant-probe.html" 2>/dev/null
  rm -f "$out/report_probe.html"
  probes="$(grep -oE 'probe: (ok   |FAIL )[^<]*' "$work/$variant-probe.html" | sed 's/&amp;/\&/g; s/&lt;/</g; s/&gt;/>/g')"
  check "$variant: the probe ran ($(echo "$probes" | grep -c 'probe: ok') checks passed)" \
    bash -c '[ "$(echo "$0" | grep -c "probe: ok")" -ge 10 ]' "$probes"
  while IFS= read -r line; do
    [ -n "$line" ] || continue
    what="${line#probe: ok   }"; what="${what#probe: FAIL }"
    if [[ "$line" == "probe: ok"* ]]; then ok "$variant: $what"; else bad "$variant: $what"; fi
  done <<<"$probes"
  # Text on the sheets at least 2.5 mm. In the SVGs: every font-size (millimetres, the user unit).
  # In the PDF (pdftotext -bbox): a horizontal word's box is its font size times the font's
  # ascent + descent, measured here on the title block's "rimline" mark, set at 6.0 mm; words
  # shorter than three letters or taller than wide (rotated) are not measured.
  smallest_svg="$(grep -oh 'font-size="[0-9.]*"' "${svgs[@]}" | tr -dc '0-9.\n' | sort -g | head -1)"
  check "$variant: profile SVG text at least 2.5 mm (smallest ${smallest_svg:-none} mm)" \
    python3 -c 'import sys; sys.exit(0 if sys.argv[1] and float(sys.argv[1]) >= 2.5 - 1e-9 else 1)' "$smallest_svg"
  pdftotext -bbox "$out/profiles.pdf" "$work/$variant-bbox.html" 2>/dev/null
  smallest="$(python3 -c '
import re, sys
words = [(float(x1) - float(x0), float(y1) - float(y0), w) for x0, y0, x1, y1, w in
         re.findall(r"<word xMin=\"([\d.]+)\" yMin=\"([\d.]+)\" xMax=\"([\d.]+)\" yMax=\"([\d.]+)\">([^<]*)</word>", open(sys.argv[1]).read())]
mark = [h for w, h, t in words if t == "rimline"]
sizes = [h / (mark[0] / 6.0) for w, h, t in words if len(t) >= 3 and w > 1.5 * h] if mark else []
print("%.2f" % min(sizes) if sizes else "0")' "$work/$variant-bbox.html")"
  check "$variant: profiles.pdf text at least 2.5 mm (smallest horizontal word ${smallest} mm)" \
    python3 -c 'import sys; sys.exit(0 if float(sys.argv[1]) >= 2.5 - 0.02 else 1)' "$smallest"
  check "$variant: profiles.pdf holds the plan sheet" bash -c 'pdftotext "$0" - 2>/dev/null | grep -q "PLAN OF THE NETWORK"' \
    "$out/profiles.pdf"
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
