#!/usr/bin/env bash
# Sets up everything on a fresh Debian 12 machine, then opens the window on the demo scene.
set -euo pipefail
cd "$(dirname "$0")/.."
./scripts/setup.sh
exec ./build/app/attiscope "$@"
