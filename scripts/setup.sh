#!/usr/bin/env bash
# Installs the Debian 12 packages attiscope needs (only the missing ones), then configures
# and builds the project in build/. Safe to run again: it does only what is still missing.
set -euo pipefail
cd "$(dirname "$0")/.."

packages=(
  build-essential cmake pkg-config clang clang-format
  libeigen3-dev nlohmann-json3-dev libtomlplusplus-dev
  libimgui-dev libstb-dev libglfw3-dev libegl-dev libgl-dev libgl1-mesa-dri libpng-dev
  libdeflate-dev libtinyobjloader-dev fonts-dejavu-core
  libgtest-dev libgmock-dev libbenchmark-dev
  python3-scipy python3-transforms3d python3-sympy python3-pandas
  xvfb xauth xdotool imagemagick
)

missing=()
for p in "${packages[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if [ "${#missing[@]}" -gt 0 ]; then
  echo "attiscope setup: installing ${missing[*]}"
  sudo_cmd=()
  [ "$(id -u)" -eq 0 ] || sudo_cmd=(sudo)
  "${sudo_cmd[@]}" apt-get update -qq
  DEBIAN_FRONTEND=noninteractive "${sudo_cmd[@]}" apt-get install -y -qq --no-install-recommends "${missing[@]}"
fi

build_type="${ATTISCOPE_BUILD_TYPE:-Release}"
cmake -S . -B build -DCMAKE_BUILD_TYPE="$build_type" ${ATTISCOPE_CMAKE_ARGS:-} >/dev/null
cmake --build build -j "$(nproc)"
