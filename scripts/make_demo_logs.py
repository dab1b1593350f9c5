#!/usr/bin/env python3
"""Writes the invented demo logs in assets/logs/ (run from the repository root).

All scenarios are invented for attiscope's demos; no real vehicle or test is behind them.
Poses are world_R_body, Hamilton quaternions, built from intrinsic ZYX angles
R = Rz(yaw) Ry(pitch) Rx(roll), then faults are injected where the comments say.
"""
import math
import os


def quat_zyx(yaw_deg, pitch_deg, roll_deg):
    """Hamilton quaternion (w, x, y, z) of Rz(yaw) Ry(pitch) Rx(roll)."""
    def half(a):
        return math.cos(math.radians(a) / 2), math.sin(math.radians(a) / 2)
    cz, sz = half(yaw_deg)
    cy, sy = half(pitch_deg)
    cx, sx = half(roll_deg)
    # (cz + sz k)(cy + sy j)(cx + sx i)
    w = cz * cy * cx + sz * sy * sx
    x = cz * cy * sx - sz * sy * cx
    y = cz * sy * cx + sz * cy * sx
    z = sz * cy * cx - cz * sy * sx
    return [w, x, y, z]


def rover(path):
    """Invented: a small survey rover crossing a gravel yard, IMU logged at 50 Hz for 80 s.

    Injected, as sample indices (0-based, bad rows not counted):
      yaw crosses 180 degrees (wrap)                    t = 21.2 s
      a kerb: roll 0 -> 12 -> 0 degrees in 0.2 s         t = 30.0 s (fast motion at --rate-limit 90)
      the logger's filter restarts with the opposite quaternion sign   sample 2250 (t = 45 s)
      a corrupted packet: norm 1.04                      sample 2600
      a repeated time stamp                              sample 3000
      two malformed rows (a truncated line, an error text) between samples 1500 and 1501, 3500 and 3501
    """
    rows = []
    rate = 50.0
    for i in range(4000):
        t = i / rate
        yaw = 150.3 + 1.4 * t  # slow left turn: 180 at t = 21.2
        pitch = 2.0 * math.sin(0.9 * t) + 0.6 * math.sin(3.1 * t)
        roll = 1.5 * math.sin(1.3 * t + 0.4)
        if 30.0 <= t < 30.2:
            roll += 12.0 * math.sin(math.pi * (t - 30.0) / 0.2)
        q = quat_zyx(yaw, pitch, roll)
        if i >= 2250:
            q = [-c for c in q]
        if i == 2600:
            q = [1.04 * c for c in q]
        time = (i - 1) / rate if i == 3000 else t
        rows.append((time, q))
    with open(path, "w") as f:
        f.write("# invented demo log: survey rover crossing a gravel yard (attiscope demo data)\n")
        f.write("t,qw,qx,qy,qz\n")
        for i, (time, q) in enumerate(rows):
            f.write("%.3f,%.9f,%.9f,%.9f,%.9f\n" % (time, q[0], q[1], q[2], q[3]))
            if i == 1500:
                f.write("30.020,0.51234,0.00210\n")  # truncated write
            if i == 3500:
                f.write("70.020,ERR,imu timeout,,\n")


def gimbal(path):
    """Invented: a camera tilt rig on a bench sweeps its camera from 60 degrees down through
    straight down (pitch 90, lock of intrinsic ZYX) to 120, at 100 Hz for 20 s; heading 40
    degrees, roll 2 degrees. Scalar-last quaternion columns.

    Expected with --euler ZYX: one near_lock event at the first sample past the pole (t = 10 s),
    a near-lock span around it, no wraps. With --euler XYZ: no near-lock span.
    """
    with open(path, "w") as f:
        f.write("# invented demo log: camera tilt rig sweeping through nadir (attiscope demo data)\n")
        f.write("time_s,qx,qy,qz,qw\n")
        for i in range(2000):
            t = i / 100.0
            w, x, y, z = quat_zyx(40.0, 60.0 + 3.0 * t + 0.0015, 2.0)
            f.write("%.2f,%.9f,%.9f,%.9f,%.9f\n" % (t, x, y, z, w))


def dolly(path):
    """Invented: a film camera on a dolly pans right through 200 degrees while the dolly rolls
    over a track joint, logged by the rig's controller as one JSON object per line at 30 Hz for
    12 s, the pose nested under "pose" with the scalar last, time in milliseconds.

    Injected: the joint at t = 5 s jolts the roll by 4 degrees for one frame (fast motion at
    --rate-limit 60); one line is cut off by a controller restart after sample 200; the pan
    crosses 180 degrees of yaw at t = 8.93 s; the controller writes the pose from its wrapped
    yaw, so the quaternion changes sign there too (a wrap and a sign flip at the same sample).
    """
    with open(path, "w") as f:
        f.write("# invented demo log: camera dolly pan over a track joint (attiscope demo data)\n")
        for i in range(360):
            t = i / 30.0
            yaw = 40.0 + 200.0 * (t / 12.0) ** 1.2
            yaw = (yaw + 180.0) % 360.0 - 180.0
            pitch = -5.0 + 1.0 * math.sin(0.7 * t)
            roll = 4.0 if 5.0 <= t < 5.0 + 1.0 / 30.0 else 0.3 * math.sin(2.0 * t)
            w, x, y, z = quat_zyx(yaw, pitch, roll)
            f.write('{"stamp_ms": %d, "mode": "pan", "pose": {"x": %.9f, "y": %.9f, "z": %.9f, "w": %.9f}}\n'
                    % (round(t * 1000.0), x, y, z, w))
            if i == 200:
                f.write('{"stamp_ms": 6701, "mode": "pan", "pose": {"x": 0.0012\n')


if __name__ == "__main__":
    os.makedirs("assets/logs", exist_ok=True)
    rover("assets/logs/rover_yard_run.csv")
    gimbal("assets/logs/gimbal_tilt_sweep.csv")
    dolly("assets/logs/camera_dolly_pan.jsonl")
