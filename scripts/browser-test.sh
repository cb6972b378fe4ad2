#!/usr/bin/env bash
# Installs what the browser test needs (Debian packages chromium, poppler-utils,
# libxml2-utils) when missing, then runs tests/e2e/browser/report_in_browser.sh.
# Usage: scripts/browser-test.sh path/to/rimline
# Prints "browser-test: N passed, M failed"; exits non-zero on any failure.
set -uo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
bin="${1:?usage: browser-test.sh path/to/rimline}"
[ -x "$bin" ] || { echo "browser-test: $bin is not an executable"; echo "browser-test: 0 passed, 1 failed"; exit 1; }

need() {  # need <command> <debian package>
  command -v "$1" >/dev/null 2>&1 && return 0
  echo "browser-test: installing $2" >&2
  apt-get install -y "$2" >/dev/null 2>&1 || { apt-get update >/dev/null 2>&1 && apt-get install -y "$2" >/dev/null 2>&1; }
  command -v "$1" >/dev/null 2>&1
}
for tool in "chromium chromium" "pdfinfo poppler-utils" "pdftoppm poppler-utils" "pdftotext poppler-utils" \
            "xmllint libxml2-utils"; do
  set -- $tool
  need "$1" "$2" || { echo "browser-test: $1 ($2) is not available" >&2; echo "browser-test: 0 passed, 1 failed"; exit 1; }
done

exec "$here/tests/e2e/browser/report_in_browser.sh" "$bin"
