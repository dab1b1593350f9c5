#!/usr/bin/python3
"""Reference check: attiscope's quaternion layouts, matrix storages, axis-angle, rotation
vector, MRP and Gibbs vector against scipy.spatial.transform.Rotation.

Source: scipy 1.10.1 (Debian python3-scipy): from_quat/as_quat are scalar-last (x, y, z, w)
and keep the sign given; from_matrix (Markley 2008) makes the largest component positive,
not w >= 0, so quaternions are compared up to sign; as_rotvec reduces the angle to [0, pi];
as_mrp is q_v / (1 + q_w) with w >= 0 (Shuster 1993 pp. 475-476, cited by scipy's
docstring); the Gibbs vector q_v / q_w is derived here from scipy's quaternion
(references.md 2.2 and section 4).
"""
import math
import sys

import numpy as np
import scipy
from scipy.spatial.transform import Rotation

import refcommon as rc

TIGHT = 1e-12


def same_up_to_sign(a, b):
    return min(np.abs(a - b).max(), np.abs(a + b).max())


def main():
    exe = rc.binary()
    f = rc.Failures("scipy %s representations" % scipy.__version__)
    rots = list(Rotation.random(30, random_state=rc.SEED))
    # Edge cases: 180 degrees about x, y, z and a skew axis, 1e-9 rad, identity, negative w.
    skew = np.array([1.0, -2.0, 3.0]) / math.sqrt(14.0)
    for axis in (np.eye(3)[0], np.eye(3)[1], np.eye(3)[2], skew):
        rots.append(Rotation.from_rotvec(math.pi * axis))
        rots.append(Rotation.from_rotvec(1e-9 * axis))
    rots.append(Rotation.identity())
    rots.append(Rotation.from_quat([0.5, -0.5, 0.5, -0.5]))

    for r in rots:
        xyzw = r.as_quat()
        wxyz = np.roll(xyzw, 1)
        m = r.as_matrix()
        name = "rotation xyzw %s" % list(xyzw)
        outs = {
            "quat-xyzw": rc.convert(exe, ["--as", "quat-xyzw"], rc.numbers(xyzw)),
            "quat-wxyz": rc.convert(exe, ["--as", "quat-wxyz"], rc.numbers(wxyz)),
            "matrix-rows": rc.convert(exe, ["--as", "matrix-rows"], rc.numbers(m.reshape(-1))),
            "matrix-cols": rc.convert(exe, ["--as", "matrix-cols"], rc.numbers(m.T.reshape(-1))),
            "rotvec": rc.convert(exe, ["--as", "rotvec"], rc.numbers(r.as_rotvec())),
        }
        angle = r.magnitude()
        if angle > 0:
            axis = r.as_rotvec() / angle
            outs["axis-angle"] = rc.convert(exe, ["--as", "axis-angle", "--rad"], rc.numbers(list(axis) + [angle]))
        for reading, j in outs.items():
            what = "%s read as %s" % (name, reading)
            q = rc.quat_wxyz(j)
            f.check(same_up_to_sign(q, wxyz) <= TIGHT, what + ": quaternion %s, scipy %s" % (list(q), list(wxyz)))
            f.check(q[0] >= 0.0, what + ": canonical quaternion has w < 0")
            err = np.abs(rc.matrix_of(j) - m).max()
            f.check(err <= TIGHT, what + ": matrix differs from scipy by %.3g" % err)
            # The quaternion scipy reads from attiscope's scalar-last output is the same rotation.
            back = Rotation.from_quat(j["quaternion_xyzw"])
            f.check((back.inv() * r).magnitude() <= TIGHT, what + ": quaternion_xyzw is not scipy's rotation")
            rv = np.array(j["rotation_vector_rad"])
            ref_rv = r.as_rotvec()
            if abs(angle - math.pi) > 1e-9:  # at 180 degrees u and -u are both right
                f.check(np.abs(rv - ref_rv).max() <= TIGHT, what + ": rotvec %s, scipy %s" % (list(rv), list(ref_rv)))
            else:
                f.check(same_up_to_sign(rv, ref_rv) <= TIGHT, what + ": rotvec %s, scipy %s" % (list(rv), list(ref_rv)))
            f.check(abs(j["axis_angle"]["angle_deg"] - math.degrees(angle)) <= 1e-10, what + ": angle %r, scipy %r" % (j["axis_angle"]["angle_deg"], math.degrees(angle)))
            mrp = np.array(j["mrp"])
            ref_mrp = r.as_mrp()
            tol = TIGHT if abs(angle - math.pi) > 1e-9 else 2.0  # at 180 both signs are the set |p| = 1
            f.check(np.abs(mrp - ref_mrp).max() <= tol or same_up_to_sign(mrp, ref_mrp) <= TIGHT,
                    what + ": MRP %s, scipy as_mrp %s" % (list(mrp), list(ref_mrp)))
            f.check((Rotation.from_mrp(mrp).inv() * r).magnitude() <= TIGHT, what + ": scipy from_mrp(attiscope MRP) is another rotation")
            if j["mrp_shadow"] is not None:
                f.check((Rotation.from_mrp(j["mrp_shadow"]).inv() * r).magnitude() <= 1e-11,
                        what + ": scipy from_mrp(shadow) is another rotation")
            cw = wxyz if wxyz[0] >= 0 else -wxyz
            if cw[0] < 1e-12:
                f.check(j["gibbs"] is None, what + ": Gibbs vector should be null at 180 degrees")
            else:
                g = np.array(j["gibbs"])
                ref_g = cw[1:] / cw[0]
                f.check(np.abs(g - ref_g).max() <= TIGHT * max(1.0, np.abs(ref_g).max()), what + ": Gibbs %s, q_v/q_w %s" % (list(g), list(ref_g)))
    return f.report()


if __name__ == "__main__":
    sys.exit(main())
