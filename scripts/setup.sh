#!/usr/bin/env bash
# Installs every Debian package rimline's build, demo and tests need (idempotent,
# non-interactive), then configures and builds. Usage: scripts/setup.sh [build-dir] [extra cmake args]
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
build="${1:-$here/build}"
shift || true

packages=(cmake g++ make pkg-config
          libgdal-dev libsqlite3-dev gdal-bin python3-gdal libgeos-dev libproj-dev proj-bin
          libcli11-dev catch2 libtomlplusplus-dev nlohmann-json3-dev libcairo2-dev
          poppler-utils libxml2-utils libeigen3-dev)
missing=()
for p in "${packages[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if ((${#missing[@]})); then
  echo "setup: installing ${missing[*]}" >&2
  SUDO=""; [ "$(id -u)" -ne 0 ] && SUDO="sudo"
  $SUDO apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
fi

cmake -S "$here" -B "$build" -DCMAKE_BUILD_TYPE=RelWithDebInfo "$@" >/dev/null
cmake --build "$build" -j"$(nproc)"
