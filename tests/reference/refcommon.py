"""Shared helpers of the reference checks: run `attiscope convert --json` and collect
failures. Each test_*.py is run by ctest as `/usr/bin/python3 SCRIPT PATH_TO_attiscope`.
"""
import json
import math
import subprocess
import sys

SEED = 20261201  # the same fixed seed as the C++ property tests (tests/support/check.hpp)

SEQUENCES = ["XYZ", "XZY", "YXZ", "YZX", "ZXY", "ZYX", "XYX", "XZX", "YXY", "YZY", "ZXZ", "ZYZ"]
KINDS = ["intrinsic", "extrinsic"]


def binary():
    if len(sys.argv) < 2:
        print("usage: %s PATH_TO_attiscope" % sys.argv[0])
        sys.exit(2)
    return sys.argv[1]


class Failures:
    """Collects failures; report() prints them and gives the exit code."""

    def __init__(self, name):
        self.name = name
        self.items = []
        self.checks = 0

    def check(self, ok, what):
        self.checks += 1
        if not ok:
            self.items.append(what)
        return ok

    def report(self):
        if self.items:
            print("%s: %d of %d checks FAILED (seed %d):" % (self.name, len(self.items), self.checks, SEED))
            for line in self.items[:40]:
                print("  " + line)
            if len(self.items) > 40:
                print("  ... and %d more" % (len(self.items) - 40))
            return 1
        print("%s: all %d checks passed (seed %d)" % (self.name, self.checks, SEED))
        return 0


def convert(exe, args, text):
    """Runs `attiscope convert --json ARGS -- TEXT`; returns the parsed object, or raises."""
    p = subprocess.run([exe, "convert", "--json"] + list(args) + ["--", text], capture_output=True, text=True)
    if p.returncode != 0:
        raise RuntimeError("attiscope convert %s %r exited %d: %s" % (" ".join(args), text, p.returncode, p.stderr.strip()))
    return json.loads(p.stdout)


def numbers(values):
    """Numbers as text that round-trip exactly (repr gives 17 significant digits)."""
    return " ".join(repr(float(v)) for v in values)


def matrix_of(j):
    import numpy as np
    return np.array(j["matrix"], dtype=float)


def quat_wxyz(j):
    import numpy as np
    q = j["quaternion"]
    return np.array([q["w"], q["x"], q["y"], q["z"]], dtype=float)


def angle_diff_deg(a, b):
    """Difference of two angles in degrees, modulo 360, in [0, 180]."""
    d = math.fmod(abs(a - b), 360.0)
    return min(d, 360.0 - d)


def read_csv_rows(path):
    """A CSV file's header and its numbers as a numpy array ('#' lines skipped)."""
    import csv

    import numpy as np

    with open(path) as f:
        lines = [l for l in f if not l.startswith("#")]
    reader = csv.reader(lines)
    header = next(reader)
    return header, np.array([[float(x) for x in row] for row in reader])
