#!/usr/bin/python3
"""ctest: regenerates tests/core/fixtures/euler24.json with sympy and diffs it against the
committed file, so a hand edit of the fixture (or a generator change not committed with its
output) fails. Skipped (exit 77) when sympy is not installed. argv[1] (the attiscope binary)
is not used: this check is about the fixture the C++ tests read.
"""
import json
import os
import sys
import tempfile

try:
    import sympy  # noqa: F401
except ImportError:
    print("sympy is not installed: skipped")
    sys.exit(77)

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)
import gen_euler_fixtures  # noqa: E402


def main():
    committed_path = os.path.join(HERE, "..", "core", "fixtures", "euler24.json")
    with open(committed_path, encoding="utf-8") as f:
        committed = json.load(f)
    fresh = gen_euler_fixtures.generate()
    if committed["versions"] != fresh["versions"]:
        print("note: fixture written with", committed["versions"], "regenerated with", fresh["versions"])
    failures = []
    if len(committed["cases"]) != len(fresh["cases"]):
        failures.append("case count %d committed, %d regenerated" % (len(committed["cases"]), len(fresh["cases"])))
    for old, new in zip(committed["cases"], fresh["cases"]):
        if old != new:
            failures.append("differs: %s %s %s" % (new["kind"], new["sequence"], new["angles_deg"]))
    if failures:
        with tempfile.NamedTemporaryFile("w", suffix=".json", delete=False) as f:
            json.dump(fresh, f, indent=1)
        print("euler24.json is not what gen_euler_fixtures.py writes:")
        for line in failures[:20]:
            print("  " + line)
        print("regenerated copy:", f.name)
        return 1
    print("euler24.json matches its generator: %d cases" % len(fresh["cases"]))
    return 0


if __name__ == "__main__":
    sys.exit(main())
