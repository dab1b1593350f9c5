#!/usr/bin/env python3
"""Reads the same 60 MB, one-million-line `t,qw,qx,qy,qz` log with attiscope's track reader
and with pandas read_csv (Debian's python3-pandas, C engine) in one run, and prints MB/s of
each and their ratio, by wall-clock time and by CPU time (attiscope reads a long file on two
threads: its wall figure is the one a person waits for, its CPU figure counts both threads). The log is an invented slow tumble, written once to a temporary file.

usage: /usr/bin/python3 bench/track_read_vs_pandas.py BUILD_DIR/bench/track_read_bench
"""
import json
import os
import statistics
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
    """(wall MB/s, CPU MB/s) of pandas read_csv to arrays, medians of `repeats`."""
    size = os.path.getsize(path)
    wall, cpu = [], []
    for _ in range(repeats):
        start_wall, start_cpu = time.perf_counter(), time.process_time()
        df = pd.read_csv(path, engine="c")
        arrays = [df[c].to_numpy(dtype=np.float64) for c in df.columns]  # to arrays in memory
        wall.append(time.perf_counter() - start_wall)
        cpu.append(time.process_time() - start_cpu)
        assert len(arrays[0]) == 1_000_000
    return size / statistics.median(wall) / 1e6, size / statistics.median(cpu) / 1e6


def attiscope_mb_s(bench, path):
    """(wall MB/s, process CPU MB/s) of read_track_file, and from_chars alone (CPU MB/s)."""
    env = dict(os.environ, ATTISCOPE_TRACK_FILE=path)
    out = subprocess.run([bench, "--benchmark_format=json", "--benchmark_repetitions=5",
                          "--benchmark_report_aggregates_only=true"],
                         env=env, check=True, capture_output=True, text=True).stdout
    runs = json.loads(out)["benchmarks"]
    def median(name):
        return [r for r in runs if r.get("aggregate_name") == "median" and r["run_name"].startswith(name)][0]
    read = median("BM_ReadTrackFile")
    # bytes_per_second is per wall-clock second there (UseRealTime); the CPU time is the
    # whole process's (both reading threads).
    wall = read["bytes_per_second"] / 1e6
    cpu = wall * read["real_time"] / read["cpu_time"]
    return wall, cpu, median("BM_FromCharsOnly")["bytes_per_second"] / 1e6


def main():
    if len(sys.argv) != 2:
        sys.exit(__doc__)
    with tempfile.TemporaryDirectory() as tmp:
        path = os.path.join(tmp, "track.csv")
        write_log(path)
        mb = os.path.getsize(path) / 1e6
        ours_wall, ours_cpu, limit = attiscope_mb_s(sys.argv[1], path)
        theirs_wall, theirs_cpu = pandas_mb_s(path)
        load = " ".join("%.1f" % x for x in os.getloadavg())
        print(f"file: {mb:.1f} MB, 1000000 lines t,qw,qx,qy,qz; {os.cpu_count()} CPUs, load average {load}")
        print("medians of 5; wall = elapsed time, CPU = CPU time of the whole process")
        print(f"attiscope read_track_file: {ours_wall:8.1f} MB/s wall {ours_cpu:8.1f} MB/s CPU")
        print(f"pandas {pd.__version__} read_csv:   {theirs_wall:8.1f} MB/s wall {theirs_cpu:8.1f} MB/s CPU")
        print(f"std::from_chars alone:     {'':8} {'':12} {limit:8.1f} MB/s CPU (one thread, from memory)")
        print(f"ratio attiscope / pandas:  {ours_wall / theirs_wall:8.2f} wall {ours_cpu / theirs_cpu:13.2f} CPU")


if __name__ == "__main__":
    main()
