#!/usr/bin/env bash
# Sets up a fresh machine and runs the main job on the bundled demo (metric and US customary):
# HGL/EGL march from the tailwater, checks, exception list, result layers and summary.
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
"$here/scripts/setup.sh" "$here/build" >&2
out="${1:-$here/out/demo}"
status=0
for variant in metric us; do
  echo "== demo ($variant) -> $out/$variant" >&2
  "$here/build/rimline" check "$here/data/demo/$variant/project.toml" --out "$out/$variant" || status=$?
  # exit 1 means "findings at or above --fail-on", which the demo is built to show
  [ "$status" -le 1 ] || exit "$status"
done
# The same network with design flows from the catchments (Rational Method), both unit systems.
for variant in metric us; do
  echo "== demo, Rational Method ($variant) -> $out/rational-$variant" >&2
  status=0
  "$here/build/rimline" check "$here/data/demo/$variant/project-rational.toml" --out "$out/rational-$variant" || status=$?
  [ "$status" -le 1 ] || exit "$status"
done
# The metric network with an invented ground model (data/demo/metric/ground.tif): the rim B-05 lacks
# comes from the ground, and every recorded rim is compared with it.
echo "== demo, rims against a ground model (metric) -> $out/ground-metric" >&2
status=0
"$here/build/rimline" check "$here/data/demo/metric/project-ground.toml" --out "$out/ground-metric" || status=$?
[ "$status" -le 1 ] || exit "$status"
# The network with a relief sewer beside the trunk (two loops): the network solve splits the flow
# between trunk and relief by the levels, both unit systems.
for variant in metric us; do
  echo "== demo, relief sewer: network solve ($variant) -> $out/relief-$variant" >&2
  status=0
  "$here/build/rimline" check "$here/data/demo/$variant/project-relief.toml" --out "$out/relief-$variant" || status=$?
  [ "$status" -le 1 ] || exit "$status"
done
# Development connections (metric): the invented Quillfen Rise subdivision connecting at trunk
# manhole T-10, run beside the existing network and compared; then the connection headroom of every
# structure of the existing network.
echo "== demo, a proposed connection (metric) -> $out/proposal-metric" >&2
status=0
"$here/build/rimline" check "$here/data/demo/metric/project.toml" \
  --proposal "$here/data/demo/metric/proposal-quillfen-rise.toml" --out "$out/proposal-metric" || status=$?
[ "$status" -le 1 ] || exit "$status"
echo "== demo, connection headroom at every structure (metric) -> $out/headroom-metric" >&2
status=0
"$here/build/rimline" check "$here/data/demo/metric/project.toml" --headroom --out "$out/headroom-metric" || status=$?
[ "$status" -le 1 ] || exit "$status"
echo "outputs: $out/{metric,us,rational-metric,rational-us,ground-metric,relief-metric,relief-us,proposal-metric,headroom-metric} (exceptions.csv, results.gpkg, summary.json)" >&2
