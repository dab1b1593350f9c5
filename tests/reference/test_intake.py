#!/usr/bin/env python3
"""The paste reader against scipy's Rotation (Debian's python3-scipy): random rotations are
printed in the forms people paste (labelled quaternion, roll/pitch/yaw, a printed matrix, a
4x4 transform, a labelled rotation vector), read back with `attiscope read --json`, and the
top reading's quaternion must be scipy's to 1e-9.

usage: /usr/bin/python3 tests/reference/test_intake.py PATH_TO_attiscope
"""
import json
import subprocess
import sys

import numpy as np
from scipy.spatial.transform import Rotation

SEED = 20261201
TOL = 1e-9


def read(exe, text):
    out = subprocess.run([exe, "read", "--json"], input=text, capture_output=True, text=True)
    if out.returncode != 0:
        raise AssertionError(f"read failed ({out.returncode}) on:\n{text}\n{out.stderr}")
    return json.loads(out.stdout)


def quat_of(reading):
    q = reading["quaternion"]
    return np.array([q["w"], q["x"], q["y"], q["z"]])


def close(a_wxyz, rot):
    x, y, z, w = rot.as_quat()  # scipy stores scalar last
    b = np.array([w, x, y, z])
    return min(np.abs(a_wxyz - b).max(), np.abs(a_wxyz + b).max()) < TOL


def main():
    exe = sys.argv[1]
    rng = np.random.default_rng(SEED)
    failures = 0
    for n in range(25):
        r = Rotation.from_quat(rng.normal(size=4))
        x, y, z, w = r.as_quat()
        m = r.as_matrix()
        yaw, pitch, roll = r.as_euler("ZYX", degrees=True)  # scipy: upper case = intrinsic
        rv = r.as_rotvec()
        t = rng.normal(size=3)
        cases = {
            "labelled quaternion": (f"qx={x:.17g} qy={y:.17g} qz={z:.17g} qw={w:.17g}", "quaternion"),
            "roll pitch yaw": (f"roll: {roll:.17g} deg, pitch: {pitch:.17g} deg, yaw: {yaw:.17g} deg", "euler"),
            "printed matrix": ("\n".join(" ".join(f"{v:.17g}" for v in row) for row in m), "matrix"),
            "4x4 transform": ("\n".join(" ".join(f"{v:.17g}" for v in row)
                                        for row in np.vstack([np.column_stack([m, t]), [0, 0, 0, 1]])), "transform"),
            "rotation vector": (f"rotvec: [{rv[0]:.17g}, {rv[1]:.17g}, {rv[2]:.17g}]", "rotation-vector"),
        }
        for name, (text, kind) in cases.items():
            top = read(exe, text)["readings"][0]
            if top["kind"] != kind or not close(quat_of(top), r):
                failures += 1
                print(f"FAIL {name} (seed {SEED}, sample {n}): top {top['kind']} {top['layout']} "
                      f"{quat_of(top)} vs scipy {r.as_quat()} (x y z w)\n{text}")
            if kind == "transform" and np.abs(np.array(top["translation"]) - t).max() > TOL:
                failures += 1
                print(f"FAIL translation (seed {SEED}, sample {n})")
    if failures:
        sys.exit(1)
    print("ok: 125 pasted forms agree with scipy Rotation")


if __name__ == "__main__":
    main()
