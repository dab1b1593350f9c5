#!/usr/bin/python3
"""Reference check: attiscope's 24 Euler conventions and quaternions against transforms3d.

Source: transforms3d 0.4 (Debian python3-transforms3d): transforms3d.euler.euler2mat /
mat2euler with axes codes 'r' + axes (rotating = intrinsic) and 's' + axes (static =
extrinsic), angles in application order; transforms3d.quaternions.mat2quat (Bar-Itzhack
2000, w >= 0) and quat2mat, scalar first (references.md 2.3).
Pitfalls minded (references.md 4): for the odd-parity proper sequences xzx, yxy, zyz
transforms3d returns the middle angle in [-pi, 0] (attiscope: [0, pi]), so angles are
compared after the map (a1 + pi, -a2, a3 + pi); at lock transforms3d sets the *first* angle
to 0 (attiscope the third), so at lock only matrices are compared.
"""
import math
import sys

import numpy as np
import transforms3d
from transforms3d.euler import euler2mat, mat2euler
from transforms3d.quaternions import mat2quat, quat2mat

import refcommon as rc

TIGHT = 1e-12


def code(sequence, kind):
    return ("r" if kind == "intrinsic" else "s") + sequence.lower()


def main():
    exe = rc.binary()
    f = rc.Failures("transforms3d %s Euler conventions and quaternions" % transforms3d.__version__)
    rng = np.random.default_rng(rc.SEED + 1)

    # Euler in -> matrix.
    for kind in rc.KINDS:
        for seq in rc.SEQUENCES:
            for n in range(5):
                rad = rng.uniform(-math.pi, math.pi, 3)
                j = rc.convert(exe, ["--as", "euler", "--euler", seq, "--" + kind, "--rad"], rc.numbers(rad))
                want = euler2mat(rad[0], rad[1], rad[2], code(seq, kind))
                err = np.abs(rc.matrix_of(j) - want).max()
                f.check(err <= TIGHT, "%s %s %s rad: matrix differs from euler2mat by %.3g" % (kind, seq, list(rad), err))

    # Matrix in -> quaternion (mat2quat) and angles in all 24 conventions (mat2euler).
    for n in range(30):
        q = rng.normal(size=4)
        q /= np.linalg.norm(q)
        m = quat2mat(q)
        j = rc.convert(exe, ["--as", "matrix-rows"], rc.numbers(m.reshape(-1)))
        mine = rc.quat_wxyz(j)
        ref = mat2quat(m)
        f.check(np.abs(mine - ref).max() <= TIGHT, "matrix %s: quaternion %s, mat2quat %s" % (list(m.reshape(-1)), list(mine), list(ref)))
        for e in j["euler_all"]:
            c = code(e["sequence"], e["kind"])
            a = np.radians(e["angles_deg"])
            err = np.abs(euler2mat(a[0], a[1], a[2], c) - m).max()
            f.check(err <= TIGHT, "%s: angles %s give a matrix off by %.3g" % (c, e["angles_deg"], err))
            if e["lock_margin_deg"] > 1e-3:
                t = np.degrees(mat2euler(m, c))
                if e["sequence"] in ("XZX", "YXY", "ZYZ"):
                    t = np.array([t[0] + 180.0, -t[1], t[2] + 180.0])
                worst = max(rc.angle_diff_deg(x, y) for x, y in zip(e["angles_deg"], t))
                f.check(worst <= 1e-9, "%s: angles %s, mat2euler (branch-mapped) %s" % (c, e["angles_deg"], list(t)))

    # At lock: matrices only (transforms3d zeroes the first angle, attiscope the third).
    for kind in rc.KINDS:
        for seq in rc.SEQUENCES:
            mids = [0.0, 180.0] if seq[0] == seq[2] else [90.0, -90.0]
            for mid in mids:
                triple = [40.0, mid, -25.0]
                j = rc.convert(exe, ["--as", "euler", "--euler", seq, "--" + kind], rc.numbers(triple))
                want = euler2mat(*np.radians(triple), code(seq, kind))
                a = np.radians(j["euler"]["angles_deg"])
                err = np.abs(euler2mat(a[0], a[1], a[2], code(seq, kind)) - want).max()
                f.check(j["euler"]["at_lock"] and j["euler"]["angles_deg"][2] == 0.0,
                        "%s %s at lock: %s" % (kind, seq, j["euler"]))
                f.check(err <= TIGHT, "%s %s at lock: locked angles %s give a matrix off by %.3g" % (kind, seq, j["euler"]["angles_deg"], err))
    return f.report()


if __name__ == "__main__":
    sys.exit(main())
