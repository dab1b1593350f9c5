#!/usr/bin/python3
"""Writes tests/core/fixtures/euler24.json: exact matrices and quaternions of the 24 Euler
conventions, computed with sympy (exact arithmetic, then 25 significant digits).

Source of every number: sympy's exact products of the active elementary rotations
  Rx(t) = [[1,0,0],[0,c,-s],[0,s,c]], Ry(t) = [[c,0,s],[0,1,0],[-s,0,c]], Rz(t) = [[c,-s,0],[s,c,0],[0,0,1]]
(written out here: sympy's own rot_axis1/2/3 are the passive transposes, references.md 2.5),
intrinsic (a, b, c) about (i, j, k) = Ri(a) Rj(b) Rk(c), extrinsic = Rk(c) Rj(b) Ri(a)
(design.md). The quaternion is the product of sympy Quaternion.from_axis_angle half-angle
quaternions in the same order, an independent path; the script checks that the two agree.

Usage: gen_euler_fixtures.py [OUTPUT]   (default: tests/core/fixtures/euler24.json next to this file)
"""
import json
import os
import sys

import mpmath
import sympy
from sympy import Matrix, Rational, cos, pi, sin
from sympy.algebras.quaternion import Quaternion

DIGITS = 25
SEQUENCES = ["XYZ", "XZY", "YXZ", "YZX", "ZXY", "ZYX", "XYX", "XZX", "YXY", "YZY", "ZXZ", "ZYZ"]
# Triples in degrees (exact rationals). Three ordinary ones for every sequence, plus the lock
# cases of its family: Tait-Bryan locks at middle +/-90, proper Euler at 0 and 180.
ORDINARY = [(30, 20, 10), (-45, 60, 135), (170, -35, -100)]
LOCK_TAIT_BRYAN = [(30, 90, 10), (30, -90, 10), (0, 90, 0)]
LOCK_PROPER = [(30, 0, 10), (30, 180, 10), (90, 180, -90)]


def elementary(axis, t):
    c, s = cos(t), sin(t)
    if axis == "X":
        return Matrix([[1, 0, 0], [0, c, -s], [0, s, c]])
    if axis == "Y":
        return Matrix([[c, 0, s], [0, 1, 0], [-s, 0, c]])
    return Matrix([[c, -s, 0], [s, c, 0], [0, 0, 1]])


def elementary_quaternion(axis, t):
    u = {"X": (1, 0, 0), "Y": (0, 1, 0), "Z": (0, 0, 1)}[axis]
    return Quaternion.from_axis_angle(u, t)


def digits(x):
    value = sympy.N(x, DIGITS + 10)
    if value == 0:
        return "0"
    return mpmath.nstr(mpmath.mpf(str(value)), DIGITS, min_fixed=-5, max_fixed=5)


def case(sequence, kind, triple):
    angles = [Rational(a) * pi / 180 for a in triple]
    mats = [elementary(axis, a) for axis, a in zip(sequence, angles)]
    quats = [elementary_quaternion(axis, a) for axis, a in zip(sequence, angles)]
    if kind == "intrinsic":
        m = mats[0] * mats[1] * mats[2]
        q = quats[0] * quats[1] * quats[2]
    else:
        m = mats[2] * mats[1] * mats[0]
        q = quats[2] * quats[1] * quats[0]
    qv = [q.a, q.b, q.c, q.d]
    if sympy.N(qv[0], 40) < 0:
        qv = [-x for x in qv]
    # The two independent paths must agree (to far below the 25 digits written). The
    # quaternion's matrix is evaluated at 40 digits from the usual formula (sympy's own
    # to_rotation_matrix simplifies symbolically and is a hundred times slower).
    w, x, y, z = [sympy.N(e, 40) for e in qv]
    from_q = [[1 - 2 * (y * y + z * z), 2 * (x * y - w * z), 2 * (x * z + w * y)],
              [2 * (x * y + w * z), 1 - 2 * (x * x + z * z), 2 * (y * z - w * x)],
              [2 * (x * z - w * y), 2 * (y * z + w * x), 1 - 2 * (x * x + y * y)]]
    worst = max(abs(from_q[i][j] - sympy.N(m[i, j], 40)) for i in range(3) for j in range(3))
    assert worst < 1e-30, (sequence, kind, triple, worst)
    proper = sequence[0] == sequence[2]
    lock_set = LOCK_PROPER if proper else LOCK_TAIT_BRYAN
    return {
        "sequence": sequence,
        "kind": kind,
        "angles_deg": [str(a) for a in triple],
        "at_lock": triple in lock_set,
        "matrix": [[digits(m[i, j]) for j in range(3)] for i in range(3)],
        "quaternion_wxyz": [digits(x) for x in qv],
    }


def generate():
    cases = []
    for kind in ("intrinsic", "extrinsic"):
        for sequence in SEQUENCES:
            proper = sequence[0] == sequence[2]
            for triple in ORDINARY + (LOCK_PROPER if proper else LOCK_TAIT_BRYAN):
                cases.append(case(sequence, kind, triple))
    return {
        "about": "Exact products of active elementary rotations for the 24 Euler conventions, "
                 "intrinsic Ri(a) Rj(b) Rk(c) and extrinsic Rk(c) Rj(b) Ri(a), written by "
                 "tests/reference/gen_euler_fixtures.py. Numbers are strings with "
                 + str(DIGITS) + " significant digits.",
        "versions": {"sympy": sympy.__version__, "mpmath": mpmath.__version__},
        "cases": cases,
    }


def main():
    here = os.path.dirname(os.path.abspath(__file__))
    out = sys.argv[1] if len(sys.argv) > 1 else os.path.join(here, "..", "core", "fixtures", "euler24.json")
    with open(out, "w", encoding="utf-8") as f:
        json.dump(generate(), f, indent=1)
        f.write("\n")
    print("wrote", out)


if __name__ == "__main__":
    main()
