"""Reference check: `attiscope compare` (relative rotations) and `attiscope compare --mean`
(mean and spread) against scipy's Rotation (Debian python3-scipy 1.10.1).

Run by ctest as `/usr/bin/python3 test_compare_mean.py PATH_TO_attiscope`. scipy's
Rotation.mean is the Markley, Cheng, Crassidis, Oshman 2007 eigenvector mean
(references.md [I2], verified there).
"""
import json
import os
import subprocess
import sys
import tempfile

import numpy as np
from scipy.spatial.transform import Rotation

ATTISCOPE = sys.argv[1]
SEED = 20261201
failures = []


def check(ok, message):
    if not ok:
        failures.append(message)


def wxyz(r):
    x, y, z, w = r.as_quat()
    return "%.17g %.17g %.17g %.17g" % (w, x, y, z)


def as_scipy(q):
    return Rotation.from_quat([q["x"], q["y"], q["z"], q["w"]])


def angle_between(r1, r2):
    return (r1.inv() * r2).magnitude()


def attiscope(*args):
    p = subprocess.run([ATTISCOPE, *args], capture_output=True, text=True)
    return p.returncode, (json.loads(p.stdout) if p.stdout.strip() else None), p.stderr


# 1. compare A B: body frame A^-1 B, world frame B A^-1, angle |A^-1 B|.
for trial in range(20):
    a = Rotation.random(random_state=SEED + 2 * trial)
    b = Rotation.random(random_state=SEED + 2 * trial + 1)
    code, out, err = attiscope("compare", "--json", "--as", "quat-wxyz", wxyz(a), wxyz(b))
    check(code == 0, "compare trial %d: exit %d %s" % (trial, code, err))
    if code != 0:
        continue
    body = as_scipy(out["body"]["quaternion"])
    world = as_scipy(out["world"]["quaternion"])
    check(angle_between(body, a.inv() * b) < 1e-12, "trial %d: body difference vs scipy" % trial)
    check(angle_between(world, b * a.inv()) < 1e-12, "trial %d: world difference vs scipy" % trial)
    check(abs(np.radians(out["angle_deg"]) - (a.inv() * b).magnitude()) < 1e-12, "trial %d: angle" % trial)
    check(np.allclose(np.radians(out["body"]["turns_deg"]), (a.inv() * b).as_rotvec(), atol=1e-12),
          "trial %d: body rotation vector vs scipy as_rotvec" % trial)

# 2. compare --mean: mean vs scipy Rotation.mean, spread vs scipy magnitudes.
rng = np.random.default_rng(SEED)
for trial in range(10):
    centre = Rotation.random(random_state=SEED + 500 + trial)
    n = int(rng.integers(3, 40))
    noise = Rotation.from_rotvec(rng.normal(scale=0.05, size=(n, 3)))
    poses = centre * noise
    quats = poses.as_quat()
    signs = rng.choice([-1.0, 1.0], size=n)  # mixed hemispheres
    lines = []
    for q, s in zip(quats, signs):
        x, y, z, w = q * s
        lines.append("%.17g %.17g %.17g %.17g" % (w, x, y, z))
    with tempfile.NamedTemporaryFile("w", suffix=".txt", delete=False) as f:
        f.write("# repeated readings (generated)\n" + "\n".join(lines) + "\n")
        path = f.name
    try:
        code, out, err = attiscope("compare", "--mean", path, "--as", "quat-wxyz", "--json")
    finally:
        os.unlink(path)
    check(code == 0, "mean trial %d: exit %d %s" % (trial, code, err))
    if code != 0:
        continue
    ours = as_scipy(out["mean"]["quaternion"])
    ref = poses.mean()
    check(angle_between(ours, ref) < 1e-10, "mean trial %d: %g rad from scipy Rotation.mean" % (trial, angle_between(ours, ref)))
    # Markley 2007 definition directly: the top eigenvector of sum q q^T.
    m = sum(np.outer(q, q) for q in quats)
    _, vecs = np.linalg.eigh(m)
    top = Rotation.from_quat(vecs[:, -1])
    check(angle_between(ours, top) < 1e-10, "mean trial %d: not the top eigenvector of M" % trial)
    angles = (ref.inv() * poses).magnitude()
    check(abs(np.radians(out["max_deg"]) - angles.max()) < 1e-10, "mean trial %d: max spread" % trial)
    check(abs(np.radians(out["rms_deg"]) - np.sqrt(np.mean(angles ** 2))) < 1e-10, "mean trial %d: rms" % trial)
    check(out["count"] == n, "mean trial %d: count" % trial)

if failures:
    print("\n".join(failures))
    sys.exit(1)
print("compare and compare --mean agree with scipy Rotation (30 cases)")
