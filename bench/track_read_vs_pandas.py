#!/usr/bin/env python3
"""Reads the same 60 MB, one-million-line `t,qw,qx,qy,qz` log with attiscope's track reader
and with pandas read_csv (Debian's python3-pandas, C engine) in one run, and prints MB/s of
each and their ratio. The log is an invented slow tumble, written once to a temporary file.

usage: /usr/bin/python3 bench/track_read_vs_pandas.py BUILD_DIR/bench/track_read_bench
"""
import json
import os
import subprocess
import sys
import tempfile
import time

import numpy as np
import pandas as pd


def write_log(path, rows=1_000_000):
    rng = np.random.default_rng(20261201)
    q = rng.normal(size=(rows, 4))
    q /= np.linalg.norm(q, axis=1, keepdims=True)
    t = np.arange(rows) * 0.001
    with open(path, "w") as f:
        f.write("t,qw,qx,qy,qz\n")
        np.savetxt(f, np.column_stack([t, q]), fmt=["%.3f", "%.9f", "%.9f", "%.9f", "%.9f"], delimiter=",")


def pandas_mb_s(path, repeats=5):
    size = os.path.getsize(path)
    best = []
    for _ in range(repeats):
        start = time.process_time()  # CPU time, as Google Benchmark's bytes_per_second uses
        df = pd.read_csv(path, engine="c")
        arrays = [df[c].to_numpy(dtype=np.float64) for c in df.columns]  # to arrays in memory
        best.append(time.process_time() - start)
        assert len(arrays[0]) == 1_000_000
    best.sort()
    return size / best[len(best) // 2] / 1e6


def attiscope_mb_s(bench, path):
    env = dict(os.environ, ATTISCOPE_TRACK_FILE=path)
    out = subprocess.run([bench, "--benchmark_format=json", "--benchmark_repetitions=5",
                          "--benchmark_report_aggregates_only=true"],
                         env=env, check=True, capture_output=True, text=True).stdout
    runs = json.loads(out)["benchmarks"]
    def median(name):
        return [r for r in runs if r.get("aggregate_name") == "median" and r["run_name"].startswith(name)][0]
    return (median("BM_ReadTrackFile")["bytes_per_second"] / 1e6,
            median("BM_FromCharsOnly")["bytes_per_second"] / 1e6)


def main():
    if len(sys.argv) != 2:
        sys.exit(__doc__)
    with tempfile.TemporaryDirectory() as tmp:
        path = os.path.join(tmp, "track.csv")
        write_log(path)
        mb = os.path.getsize(path) / 1e6
        ours, limit = attiscope_mb_s(sys.argv[1], path)
        theirs = pandas_mb_s(path)
        print(f"file: {mb:.1f} MB, 1000000 lines t,qw,qx,qy,qz")
        print(f"attiscope read_track_file: {ours:8.1f} MB/s (median of 5, CPU time)")
        print(f"pandas {pd.__version__} read_csv:   {theirs:8.1f} MB/s (median of 5, CPU time)")
        print(f"std::from_chars alone:     {limit:8.1f} MB/s (median of 5, CPU time, from memory)")
        print(f"ratio attiscope / pandas:  {ours / theirs:8.2f}")
        print(f"ratio from_chars / attiscope: {limit / ours:5.2f}")


if __name__ == "__main__":
    main()
