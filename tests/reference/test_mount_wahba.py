"""Reference check: `attiscope mount --vectors` against scipy's Rotation.align_vectors.

Run by ctest as `/usr/bin/python3 test_mount_wahba.py PATH_TO_attiscope`, with Debian's
python3-scipy (1.10.1). Pitfall (references.md section 4, item 5): align_vectors(a, b)
returns C with a ~ C b, so align_vectors(vehicle, sensor) is vehicle_R_sensor.
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


def run_mount(lines, *extra):
    with tempfile.NamedTemporaryFile("w", suffix=".txt", delete=False) as f:
        f.write("\n".join(lines) + "\n")
        path = f.name
    try:
        p = subprocess.run([ATTISCOPE, "mount", "--vectors", path, "--json", *extra],
                           capture_output=True, text=True)
    finally:
        os.unlink(path)
    return p.returncode, (json.loads(p.stdout) if p.stdout.strip() else None), p.stderr


def as_scipy(q):
    # attiscope prints Hamilton (w, x, y, z); scipy stores (x, y, z, w).
    return Rotation.from_quat([q["x"], q["y"], q["z"], q["w"]])


def angle_between(r1, r2):
    return (r1.inv() * r2).magnitude()


rng = np.random.default_rng(SEED)

# 1. Random noisy weighted sets: the SVD answer equals scipy's optimum.
for trial in range(25):
    truth = Rotation.random(random_state=SEED + trial)
    n = int(rng.integers(3, 12))
    sensor = rng.normal(size=(n, 3))
    sensor /= np.linalg.norm(sensor, axis=1)[:, None]
    vehicle = truth.apply(sensor) + rng.normal(scale=0.01, size=(n, 3))
    vehicle /= np.linalg.norm(vehicle, axis=1)[:, None]
    weights = rng.uniform(0.5, 2.0, size=n)
    scale = rng.uniform(0.5, 10.0, size=n)  # attiscope uses directions only
    lines = ["%.17g %.17g %.17g %.17g %.17g %.17g %.17g" % (*(sensor[i] * scale[i]), *vehicle[i], weights[i])
             for i in range(n)]
    code, out, err = run_mount(lines)
    check(code == 0, "trial %d: exit %d, %s" % (trial, code, err))
    if code != 0:
        continue
    c, rssd = Rotation.align_vectors(vehicle, sensor, weights)
    ours = as_scipy(out["mount"]["quaternion"])
    d = angle_between(ours, c)
    check(d < 1e-9, "trial %d (seed %d): SVD solve differs from scipy align_vectors by %g rad" % (trial, SEED, d))
    # Residuals: angle between v_i and C s_i.
    predicted = c.apply(sensor)
    expected = np.degrees(np.arccos(np.clip(np.sum(predicted * vehicle, axis=1), -1, 1)))
    got = np.array(out["residuals_deg"])
    check(np.max(np.abs(got - expected)) < 1e-6, "trial %d: residuals %s vs scipy %s" % (trial, got, expected))
    # scipy's rssd = sqrt(2 L_min) (references.md section 2.2).
    check(abs(np.sqrt(2 * out["solver"]["loss"]) - rssd) < 1e-9,
          "trial %d: loss %g vs scipy rssd %g" % (trial, out["solver"]["loss"], rssd))
    check(out["solver"]["davenport_difference_deg"] < 1e-7, "trial %d: q-method disagrees" % trial)

# 2. Noise-free pairs: TRIAD agrees with the SVD solution and with scipy.
for trial in range(10):
    truth = Rotation.random(random_state=SEED + 100 + trial)
    sensor = rng.normal(size=(4, 3))
    sensor /= np.linalg.norm(sensor, axis=1)[:, None]
    vehicle = truth.apply(sensor)
    lines = ["%.17g %.17g %.17g %.17g %.17g %.17g" % (*sensor[i], *vehicle[i]) for i in range(4)]
    code, out, err = run_mount(lines)
    check(code == 0, "noise-free trial %d: exit %d %s" % (trial, code, err))
    if code != 0:
        continue
    triad = as_scipy(out["solver"]["triad"]["quaternion"])
    c, _ = Rotation.align_vectors(vehicle, sensor)
    check(angle_between(triad, c) < 1e-9, "noise-free trial %d: TRIAD vs scipy %g rad" % (trial, angle_between(triad, c)))
    check(angle_between(as_scipy(out["mount"]["quaternion"]), truth) < 1e-9, "noise-free trial %d: SVD vs truth" % trial)

# 3. The worked example of references.md section 2.6 (measured there with scipy 1.10.1):
# vehicle {(0,1,0), (0,0,1)}, sensor {(1,0,0), (0,0,1)} -> Rz(+90) = [[0,-1,0],[1,0,0],[0,0,1]].
code, out, err = run_mount(["1 0 0  0 1 0", "0 0 1  0 0 1"])
check(code == 0, "worked example: exit %d %s" % (code, err))
if code == 0:
    m = np.array(out["mount"]["matrix"])
    c, _ = Rotation.align_vectors([[0, 1, 0], [0, 0, 1]], [[1, 0, 0], [0, 0, 1]])
    check(np.allclose(m, [[0, -1, 0], [1, 0, 0], [0, 0, 1]], atol=1e-15), "worked example matrix %s" % m)
    check(np.allclose(m, c.as_matrix(), atol=1e-15), "worked example vs scipy %s" % c.as_matrix())

# 4. Parallel vectors are refused with code 2 and a sentence, never an arbitrary answer.
code, out, err = run_mount(["0 0 9.81  0 0 1", "0 0 -9.8  0 0 -1"])
check(code == 2 and out is not None and isinstance(out["unobservable"], str) and out["mount"] is None,
      "parallel vectors: exit %d, %s" % (code, out))

if failures:
    print("\n".join(failures))
    sys.exit(1)
print("mount --vectors agrees with scipy align_vectors (%d checks)" % (25 + 10 + 2))
