#!/usr/bin/env bash
# Public headers stay free of GDAL, GEOS, PROJ and CLI11, the library never includes the CLI, and the
# stages that are plain numbers and data (hydraulics, model, config, flows, solve, checks) include no GIS library.
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
bad=$(grep -rnE '#include *[<"](gdal|ogr|cpl_|geos|proj|CLI/)' "$here/include" || true)
bad+=$(grep -rnE '#include *[<"](CLI/|cli/)' "$here/src" --include=*.cpp --include=*.hpp | grep -v "^$here/src/cli/" || true)
# The stages before reading (base, hydraulics, model, config) and the pure ones after it know no GIS library.
for stage in base hydraulics model config flows solve checks; do
  bad+=$(grep -rnE '#include *[<"](gdal|ogr|cpl_|geos|proj)' "$here/src/$stage" || true)
done
if [ -n "$bad" ]; then
  echo "layering broken (public headers or library code include GDAL/GEOS/PROJ/CLI):" >&2
  echo "$bad" >&2
  exit 1
fi
