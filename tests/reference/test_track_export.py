#!/usr/bin/env python3
"""Reference check of `attiscope track --export`: Debian's python3-scipy (Rotation) reads the
original demo log and each exported clean copy, and the rotations must agree to 1e-12 rad.

Usage: test_track_export.py PATH_TO_attiscope   (run by ctest from the build directory)

Outside source: scipy.spatial.transform.Rotation (SciPy 1.10, Debian 12). Its conventions,
from its documentation: from_quat takes scalar-last (x, y, z, w) Hamilton quaternions;
from_euler with upper-case axes is intrinsic, lower-case extrinsic, angles in the order
applied; from_matrix takes the matrix that maps body into world coordinates (v_world = R v_body,
the matrix whose columns are the body axes), as attiscope's world_R_body.
"""
import os
import subprocess
import sys
import tempfile

import numpy as np
from scipy.spatial.transform import Rotation

import refcommon as rc

ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))
LOG = os.path.join(ROOT, "assets", "logs", "gimbal_tilt_sweep.csv")
TOL = 1e-12


def angle_between(a, b):
    return (a.inv() * b).magnitude()


def main():
    exe = sys.argv[1]
    header, raw = rc.read_csv_rows(LOG)
    assert header == ["time_s", "qx", "qy", "qz", "qw"], header
    original = Rotation.from_quat(raw[:, 1:5])  # scalar last, normalised by scipy
    failures = 0
    cases = [
        (["--export-as", "quaternion"], lambda d: Rotation.from_quat(d[:, [2, 3, 4, 1]])),
        (["--export-as", "quaternion", "--export-layout", "xyzw"], lambda d: Rotation.from_quat(d[:, 1:5])),
        (["--export-as", "quaternion", "--export-direction", "world-to-body"],
         lambda d: Rotation.from_quat(d[:, [2, 3, 4, 1]]).inv()),
        (["--export-as", "euler", "--euler", "ZYX", "--intrinsic", "--deg"],
         lambda d: Rotation.from_euler("ZYX", d[:, 1:4], degrees=True)),
        (["--export-as", "euler", "--euler", "ZXZ", "--extrinsic", "--rad"],
         lambda d: Rotation.from_euler("zxz", d[:, 1:4])),
        (["--export-as", "euler", "--euler", "YXZ", "--extrinsic", "--deg"],
         lambda d: Rotation.from_euler("yxz", d[:, 1:4], degrees=True)),
        (["--export-as", "matrix"], lambda d: Rotation.from_matrix(d[:, 1:10].reshape(-1, 3, 3))),
        (["--export-as", "matrix", "--export-storage", "columns"],
         lambda d: Rotation.from_matrix(d[:, 1:10].reshape(-1, 3, 3).transpose(0, 2, 1))),
    ]
    with tempfile.TemporaryDirectory() as tmp:
        for k, (args, read) in enumerate(cases):
            out = os.path.join(tmp, "clean%d.csv" % k)
            subprocess.run([exe, "track", LOG, "--export", out] + args, check=True, stdout=subprocess.DEVNULL)
            _, data = rc.read_csv_rows(out)
            if data.shape[0] != raw.shape[0] or not np.array_equal(data[:, 0], raw[:, 0]):
                print("FAIL %s: times or row count differ" % args)
                failures += 1
                continue
            worst = np.max(angle_between(original, read(data)))
            status = "ok  " if worst <= TOL else "FAIL"
            failures += worst > TOL
            print("%s %-60s worst %.3g rad" % (status, " ".join(args), worst))
            if args[1] == "quaternion":
                q = data[:, 1:5]
                flips = int(np.sum(np.einsum("ij,ij->i", q[1:], q[:-1]) < 0))
                if flips:
                    print("FAIL %s: %d sign flips in the export" % (args, flips))
                    failures += 1
    print("%d failure(s)" % failures)
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
