#!/usr/bin/env bash
# Public headers stay free of GDAL, GEOS, PROJ and CLI11, and the library never includes the CLI.
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
bad=$(grep -rnE '#include *[<"](gdal|ogr|cpl_|geos|proj|CLI/)' "$here/include" || true)
bad+=$(grep -rnE '#include *[<"](CLI/|cli/)' "$here/src" --include=*.cpp --include=*.hpp | grep -v "^$here/src/cli/" || true)
if [ -n "$bad" ]; then
  echo "layering broken (public headers or library code include GDAL/GEOS/PROJ/CLI):" >&2
  echo "$bad" >&2
  exit 1
fi
