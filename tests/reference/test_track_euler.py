#!/usr/bin/env python3
"""Reference check of `attiscope track` on logs of Euler angles: generated logs of known
poses written as roll, pitch, yaw columns (degrees and radians, CSV and JSON lines) are read
by attiscope and exported as quaternions; Debian's python3-scipy computes the same poses
from the angles, and the rotations must agree to 1e-12 rad.

Usage: test_track_euler.py PATH_TO_attiscope   (run by ctest from the build directory)

Outside source: scipy.spatial.transform.Rotation (SciPy 1.10, Debian 12). From its
documentation: from_euler with upper-case axes is intrinsic, angles in the order applied;
from_quat takes scalar-last (x, y, z, w) Hamilton quaternions. Roll, pitch, yaw columns are
read as intrinsic ZYX, Rotation.from_euler('ZYX', [yaw, pitch, roll]) (the usual aerospace
reading: common practice).
"""
import json
import os
import subprocess
import sys
import tempfile

import numpy as np

import refcommon as rc

try:
    from scipy.spatial.transform import Rotation
except ImportError:
    sys.exit(77)

TOL = 1e-12


def main():
    exe = sys.argv[1]
    rng = np.random.default_rng(rc.SEED)
    n = 500
    roll = rng.uniform(-np.pi, np.pi, n)
    pitch = rng.uniform(-np.pi / 2, np.pi / 2, n)
    yaw = rng.uniform(-np.pi, np.pi, n)
    t = 0.01 * np.arange(n)
    # scipy's pose of each row, from the angles alone.
    want = Rotation.from_euler("ZYX", np.column_stack([yaw, pitch, roll]))
    failures = 0
    with tempfile.TemporaryDirectory() as tmp:
        cases = []
        for name, header, scale in [
            ("degrees, suffix", "t,roll_deg,pitch_deg,yaw_deg", 180 / np.pi),
            ("radians, suffix", "t,roll (rad),pitch (rad),yaw (rad)", 1.0),
            ("degrees, from the numbers", "t,phi,theta,psi", 180 / np.pi),
        ]:
            path = os.path.join(tmp, "log%d.csv" % len(cases))
            with open(path, "w") as f:
                f.write(header + "\n")
                for i in range(n):
                    f.write("%.17g,%.17g,%.17g,%.17g\n" % (t[i], roll[i] * scale, pitch[i] * scale, yaw[i] * scale))
            cases.append((name, path))
        path = os.path.join(tmp, "log.jsonl")
        with open(path, "w") as f:
            for i in range(n):
                f.write(json.dumps({"t": t[i], "att": {"yaw_rad": yaw[i], "pitch_rad": pitch[i],
                                                       "roll_rad": roll[i]}}) + "\n")
        cases.append(("JSON lines, radians", path))
        for k, (name, path) in enumerate(cases):
            out = os.path.join(tmp, "clean%d.csv" % k)
            subprocess.run([exe, "track", path, "--export", out, "--no-unwrap"], check=True,
                           stdout=subprocess.DEVNULL)
            _, data = rc.read_csv_rows(out)
            if data.shape[0] != n:
                print("FAIL %s: %d rows, expected %d" % (name, data.shape[0], n))
                failures += 1
                continue
            got = Rotation.from_quat(data[:, [2, 3, 4, 1]])
            worst = np.max((got.inv() * want).magnitude())
            status = "ok  " if worst <= TOL else "FAIL"
            failures += worst > TOL
            print("%s %-30s worst %.3g rad" % (status, name, worst))
    print("%d failure(s)" % failures)
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
