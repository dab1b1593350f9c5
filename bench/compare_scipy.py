#!/usr/bin/python3
"""Runs batch_bench and scipy's Rotation on the same kind of data in one run and prints
the conversions per second of each and their ratio.

    /usr/bin/python3 bench/compare_scipy.py [build/bench/batch_bench] [--repetitions 3]

Both sides convert uniformly distributed (Haar) random rotations with a fixed seed;
figures are medians of CPU time over the repetitions, in millions of conversions per
second on one thread. Shared machines drift between runs: compare the ratios of one run.
scipy runs in a child process without OPENBLAS_CORETYPE and OPENBLAS_L2_SIZE in its
environment (a value set for another CPU model can slow it down or stop it).
"""
import argparse
import json
import os
import pathlib
import platform
import statistics
import subprocess
import sys
import time

SEQUENCES = ["XYZ", "XZY", "YXZ", "YZX", "ZXY", "ZYX", "XYX", "XZX", "YXY", "YZY", "ZXZ", "ZYZ"]
SEED = 20261201


def scipy_sequence(kind, seq):
    # scipy's Rotation: upper case letters are intrinsic turns, lower case extrinsic.
    return seq if kind == "intrinsic" else seq.lower()


def scipy_worker(count, repetitions):
    """Times scipy (in the child process) and prints {name: M/s} as JSON."""
    import numpy as np
    from scipy.spatial.transform import Rotation

    rot = Rotation.random(count, random_state=SEED)
    quat_xyzw = rot.as_quat()
    angles_zyx = rot.as_euler("ZYX")
    angles_zxz_ext = rot.as_euler("zxz")
    matrices = rot.as_matrix()

    def rate(fn):
        times = []
        for _ in range(repetitions):
            start = time.process_time()
            fn()
            times.append(time.process_time() - start)
        return count / statistics.median(times) / 1e6

    out = {}
    for kind in ("intrinsic", "extrinsic"):
        for seq in SEQUENCES:
            s = scipy_sequence(kind, seq)
            out["quat_to_euler/%s_%s" % (kind, seq)] = rate(lambda s=s: Rotation.from_quat(quat_xyzw).as_euler(s))
    out["euler_to_quat/intrinsic_ZYX"] = rate(lambda: Rotation.from_euler("ZYX", angles_zyx).as_quat())
    out["euler_to_quat/extrinsic_ZXZ"] = rate(lambda: Rotation.from_euler("zxz", angles_zxz_ext).as_quat())
    out["matrix_to_quat/shepperd"] = rate(lambda: Rotation.from_matrix(matrices).as_quat())
    out["quat_to_matrix/eigen_expansion"] = rate(lambda: Rotation.from_quat(quat_xyzw).as_matrix())
    out["_version"] = __import__("scipy").__version__
    out["_numpy"] = np.__version__
    json.dump(out, sys.stdout)


def run_bench(binary, repetitions):
    cmd = [str(binary), "--benchmark_format=json", "--benchmark_repetitions=%d" % repetitions,
           "--benchmark_min_time=0.2"]
    raw = json.loads(subprocess.run(cmd, check=True, capture_output=True, text=True).stdout)
    runs = {}
    for b in raw["benchmarks"]:
        if b.get("run_type", "iteration") == "iteration" and "items_per_second" in b:
            runs.setdefault(b.get("run_name", b["name"]), []).append(b["items_per_second"] / 1e6)
    return {name: statistics.median(v) for name, v in runs.items()}, raw.get("context", {})


def cpu_model():
    try:
        for line in pathlib.Path("/proc/cpuinfo").read_text().splitlines():
            if line.startswith("model name"):
                return line.split(":", 1)[1].strip()
    except OSError:
        pass
    return platform.processor() or "unknown CPU"


def main():
    parser = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    parser.add_argument("binary", nargs="?", default=str(pathlib.Path(__file__).resolve().parent.parent
                                                         / "build" / "bench" / "batch_bench"))
    parser.add_argument("--repetitions", type=int, default=3)
    parser.add_argument("--scipy-count", type=int, default=200000,
                        help="rotations per scipy call (scipy's Euler conversion runs at about 0.5 M/s)")
    parser.add_argument("--scipy-worker", action="store_true", help=argparse.SUPPRESS)
    args = parser.parse_args()
    if args.scipy_worker:
        scipy_worker(args.scipy_count, args.repetitions)
        return 0

    binary = pathlib.Path(args.binary)
    if not binary.exists():
        print("compare_scipy: no benchmark binary at %s (build the batch_bench target)" % binary, file=sys.stderr)
        return 2
    ours, context = run_bench(binary, args.repetitions)
    env = {k: v for k, v in os.environ.items() if k not in ("OPENBLAS_CORETYPE", "OPENBLAS_L2_SIZE")}
    child = subprocess.run([sys.executable, __file__, "--scipy-worker", "--scipy-count", str(args.scipy_count),
                            "--repetitions", str(args.repetitions)], check=True, capture_output=True, text=True,
                           env=env)
    theirs = json.loads(child.stdout)

    path = context.get("attiscope_batch_path_auto", "?")
    print("machine: %s, %s CPUs, load average %s" % (cpu_model(), os.cpu_count(),
                                                    " ".join("%.1f" % x for x in os.getloadavg())))
    print("attiscope batch path: %s; scipy %s, numpy %s; medians of %d runs, M conversions/s, one thread"
          % (path, theirs["_version"], theirs["_numpy"], args.repetitions))
    print("attiscope: 1e6 rotations per call; scipy: %d per call" % args.scipy_count)
    print()
    header = "%-34s %12s %12s %10s %10s" % ("conversion", "attiscope", "single-pose", "scipy", "ratio")
    print(header)
    print("-" * len(header))
    rows = []
    for kind in ("intrinsic", "extrinsic"):
        rows += ["quat_to_euler/%s_%s" % (kind, s) for s in SEQUENCES]
    rows += ["euler_to_quat/intrinsic_ZYX", "euler_to_quat/extrinsic_ZXZ", "matrix_to_quat/shepperd",
             "quat_to_matrix/eigen_expansion"]
    for name in rows:
        batch = ours.get(name + "/auto")
        single = ours.get(name + "/single_pose")
        scipy = theirs.get(name)
        ratio = batch / scipy if batch and scipy else None
        print("%-34s %12s %12s %10s %10s" % (
            name, "%.1f" % batch if batch else "-", "%.1f" % single if single else "",
            "%.2f" % scipy if scipy else "-", "%.0fx" % ratio if ratio else "-"))
    print()
    print("by path (intrinsic ZYX):")
    for work in ("quat_to_euler/intrinsic_ZYX", "euler_to_quat/intrinsic_ZYX", "matrix_to_quat/shepperd",
                 "quat_to_matrix/eigen_expansion"):
        cells = []
        for p in ("baseline", "avx2", "avx512"):
            v = ours.get("%s/%s" % (work, p))
            if v:
                cells.append("%s %.1f" % (p, v))
        print("  %-32s %s" % (work, ", ".join(cells)))
    return 0


if __name__ == "__main__":
    sys.exit(main())
