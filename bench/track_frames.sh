#!/usr/bin/env bash
# Frame-time benchmark of the Track panel (a benchmark that prints figures, not a test): a
# generated 1e7-sample log (an invented tumbling body at 1 kHz, with a few sign flips and
# wraps) is loaded into the window, then the timeline scrubs through the whole track while
# the plots draw; prints the median and 95th-percentile frame time at 1600x900. Runs under
# Xvfb when there is no display.
# Usage: bench/track_frames.sh [path/to/attiscope] [frames] [samples]
# TRACK_LOG=FILE keeps the generated log in FILE (made when missing) for the next run.
set -euo pipefail
cd "$(dirname "$0")/.."
exe=${1:-build/app/attiscope}
frames=${2:-300}
samples=${3:-10000000}
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
log=${TRACK_LOG:-$work/tumble.csv}
[ -s "$log" ] || /usr/bin/python3 - "$log" "$samples" <<'PY'
import sys
import numpy as np
path, n = sys.argv[1], int(sys.argv[2])
t = np.arange(n) / 1000.0
# Invented motion: yaw turns steadily (wraps every 72 s), pitch and roll swing; intrinsic
# ZYX angles to a Hamilton quaternion (w, x, y, z).
yaw = np.radians(5.0 * t + 30.0 * np.sin(0.05 * t))
pitch = np.radians(60.0 * np.sin(0.013 * t))
roll = np.radians(20.0 * np.sin(0.31 * t))
cz, sz = np.cos(yaw / 2), np.sin(yaw / 2)
cy, sy = np.cos(pitch / 2), np.sin(pitch / 2)
cx, sx = np.cos(roll / 2), np.sin(roll / 2)
q = np.stack([cz * cy * cx + sz * sy * sx, cz * cy * sx - sz * sy * cx,
              cz * sy * cx + sz * cy * sx, sz * cy * cx - cz * sy * sx], axis=1)
flip = (np.floor(t / 1234.5) % 2) == 1  # the sign flips every 1234.5 s
q[flip] *= -1
with open(path, "w") as f:
    f.write("t,qw,qx,qy,qz\n")
    chunk = 1000000
    for b in range(0, n, chunk):
        e = min(n, b + chunk)
        np.savetxt(f, np.column_stack([t[b:e], q[b:e]]), fmt="%.3f,%.9f,%.9f,%.9f,%.9f")
PY
echo "log: $samples samples, $(du -m "$log" | cut -f1) MB"
echo "load average: $(cut -d' ' -f1-3 /proc/loadavg) on $(nproc) cores (figures scale with it)"
/usr/bin/python3 bench/machine_speed.py
config=$(mktemp -d)
trap 'rm -rf "$work" "$config"' EXIT
run() {
  if [ -z "${DISPLAY:-}" ]; then
    xvfb-run -a -s "-screen 0 1920x1080x24" "$@"
  else
    "$@"
  fi
}
for i in 1 2 3; do
  XDG_CONFIG_HOME=$config run "$exe" gui --bench "$frames" "$log"
done
