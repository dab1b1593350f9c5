#!/usr/bin/env bash
# Frame-time benchmark of the window (a benchmark that prints figures, not a test): median and
# 95th-percentile frame time at 1600x900 while the body turns continuously, every card open,
# and process start to first frame with a cold and a warm Mesa shader cache. Runs under Xvfb
# when there is no display. Usage: bench/window_frames.sh [path/to/attiscope] [frames]
set -euo pipefail
cd "$(dirname "$0")/.."
exe=${1:-build/app/attiscope}
frames=${2:-400}
config=$(mktemp -d)
trap 'rm -rf "$config"' EXIT
run() {
  if [ -z "${DISPLAY:-}" ]; then
    xvfb-run -a -s "-screen 0 1920x1080x24" "$@"
  else
    "$@"
  fi
}
echo "load average: $(cut -d' ' -f1-3 /proc/loadavg) on $(nproc) cores (figures scale with it)"
/usr/bin/python3 bench/machine_speed.py
echo "== cold shader cache (MESA_SHADER_CACHE_DISABLE=true)"
for i in 1 2 3; do
  XDG_CONFIG_HOME=$config MESA_SHADER_CACHE_DISABLE=true run "$exe" gui --bench "$frames"
done
echo "== warm shader cache"
for i in 1 2 3; do
  XDG_CONFIG_HOME=$config run "$exe" gui --bench "$frames"
done
