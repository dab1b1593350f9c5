#!/usr/bin/python3
"""Reference check of house-convention frame changes and of the convention finder against
scipy 1.10.1 (Debian python3-scipy) scipy.spatial.transform.Rotation.

Usage: test_convention_frames.py PATH_TO_attiscope
Exit 0 when every check passes, 1 otherwise (each failure is printed).
"""
import json
import os
import subprocess
import sys

import numpy as np
from scipy.spatial.transform import Rotation

ATTISCOPE = sys.argv[1]
HERE = os.path.dirname(os.path.abspath(__file__))
ASSETS = os.path.join(HERE, "..", "..", "assets", "conventions")
SURVEY = os.path.join(ASSETS, "survey-aircraft.toml")  # NED/FRD, intrinsic ZYX (invented demo)
ROVER = os.path.join(ASSETS, "orchard-rover.toml")  # ENU/FLU, intrinsic ZYX printed roll, pitch, yaw
SEED = 20261201

failures = []


def run(*args):
    p = subprocess.run([ATTISCOPE, *args], capture_output=True, text=True)
    if p.returncode != 0:
        failures.append(f"attiscope {' '.join(args)} exited {p.returncode}: {p.stderr}")
        return None
    return json.loads(p.stdout)


def angle_between(m1, m2):
    return Rotation.from_matrix(m1.T @ m2).magnitude()


# Frame matrices: references.md T13 (common practice), NED/FRD from ISO 1151 [F1] (memory),
# ENU from IOGP GN 7-2 [F8], FLU from ISO 8855 [F3] and ROS REP 103 [F7].
C_ENU_NED = np.array([[0.0, 1, 0], [1, 0, 0], [0, 0, -1]])
C_FLU_FRD = np.diag([1.0, -1, -1])

rng = np.random.default_rng(SEED)
for n in range(25):
    ypr = [rng.uniform(-180, 180), rng.uniform(-80, 80), rng.uniform(-180, 180)]
    # scipy: upper-case axes are intrinsic; 'ZYX' = R_z(yaw) R_y(pitch) R_x(roll).
    r_ned = Rotation.from_euler("ZYX", ypr, degrees=True).as_matrix()
    # world change on the left, body change on the right: ENU_R_FLU = C_ENU<-NED R C_FRD<-FLU.
    r_enu = C_ENU_NED @ r_ned @ C_FLU_FRD.T
    yaw, pitch, roll = Rotation.from_matrix(r_enu).as_euler("ZYX", degrees=True)
    pose = f"{ypr[0]!r} {ypr[1]!r} {ypr[2]!r}"
    j = run("convention", SURVEY, "--to", ROVER, "--pose", pose, "--json")
    if j is None:
        continue
    got = j["pose_to"]["euler"]["values"]  # roll, pitch, yaw (the rover's print order)
    want = [roll, pitch, yaw]
    for g, w, name in zip(got, want, ["roll", "pitch", "yaw"]):
        d = (g - w + 180.0) % 360.0 - 180.0
        if abs(d) > 1e-9:
            failures.append(f"seed {SEED} sample {n}: {name} {g} != scipy {w} for NED/FRD {ypr}")
    # T13's rule (90 - yaw, -pitch, roll) for both frames switched.
    d = ((90.0 - ypr[0]) - got[2] + 180.0) % 360.0 - 180.0
    if abs(d) > 1e-9 or abs(got[1] + ypr[1]) > 1e-9 or abs(((got[0] - ypr[2] + 180) % 360) - 180) > 1e-9:
        failures.append(f"sample {n}: T13 rule fails: {got} from {ypr}")
    # The house matrix of the rover (body-to-world rows) is scipy's ENU/FLU matrix.
    m = np.array(j["pose_to"]["matrix"]["numbers"]).reshape(3, 3)
    if angle_between(m, r_enu) > 1e-12:
        failures.append(f"sample {n}: rover matrix differs from scipy by {angle_between(m, r_enu)} rad")

# The finder: scipy writes quaternions x y z w (scalar last, Hamilton, active). An Euler
# triple and scipy's quaternion of it must be explained by that layout, top-ranked, for
# intrinsic and extrinsic sequences (scipy: lower-case axes are extrinsic).
for seq in ["ZYX", "XYZ", "zxz", "yxy", "xzy"]:
    kind = "intrinsic" if seq.isupper() else "extrinsic"
    for n in range(4):
        middle = rng.uniform(20, 70) if seq[0].lower() != seq[2].lower() else rng.uniform(20, 160)
        angles = [rng.uniform(-170, 170), middle, rng.uniform(-170, 170)]
        q = Rotation.from_euler(seq, angles, degrees=True).as_quat()
        j = run("find", "--json", " ".join(repr(a) for a in angles), " ".join(repr(x) for x in q))
        if j is None:
            continue
        best = j["matches"][0]["residual_deg"]
        top = [m for m in j["matches"] if m["residual_deg"] - best < 1e-7]
        ok = any(
            m["euler"]["sequence"] == seq.upper()
            and m["euler"]["kind"] == kind
            and m["quaternion_layout"] == "xyzw"
            and m["algebra"] == "hamilton"
            and m["direction"] == "body_to_world"
            and m["unit"] == "degrees"
            and m["print_order"] == [1, 2, 3]
            for m in top
        )
        if not ok or best > 1e-7:
            failures.append(f"finder: scipy {seq} {angles} not top-ranked (best {best} deg)")

for f in failures:
    print("FAIL:", f)
print(f"{'FAILED' if failures else 'ok'}: convention frames and finder against scipy (seed {SEED})")
sys.exit(1 if failures else 0)
