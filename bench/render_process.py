#!/usr/bin/python3
"""Whole-process time of `attiscope render` for a 1024x768 PNG (a benchmark that prints).

usage: bench/render_process.py PATH_TO_attiscope [RUNS]

Prints the median and the 90th percentile wall time of the whole process with a warm Mesa
shader cache and with the cache disabled (MESA_SHADER_CACHE_DISABLE=true: every shader is
compiled again, as on a fresh machine), and CPU time (user + system, all threads).
"""
import os
import resource
import statistics
import subprocess
import sys
import tempfile
import time

import machine_speed


def run(exe, env, runs, out):
    walls, cpus = [], []
    args = [exe, "render", "--as", "euler", "--euler", "ZYX", "30 20 10", "--size", "1024x768",
            "--model", "quadcopter", "--out", out]
    subprocess.run(args, env=env, check=True)  # warm the page cache (and the shader cache)
    for _ in range(runs):
        before = resource.getrusage(resource.RUSAGE_CHILDREN)
        t = time.perf_counter()
        subprocess.run(args, env=env, check=True)
        walls.append((time.perf_counter() - t) * 1e3)
        after = resource.getrusage(resource.RUSAGE_CHILDREN)
        cpus.append(((after.ru_utime - before.ru_utime) + (after.ru_stime - before.ru_stime)) * 1e3)
    walls.sort()
    return statistics.median(walls), walls[min(len(walls) - 1, int(len(walls) * 0.9))], statistics.median(cpus)


def main():
    if len(sys.argv) < 2:
        print(__doc__)
        return 2
    exe = sys.argv[1]
    runs = int(sys.argv[2]) if len(sys.argv) > 2 else 15
    machine_speed.main()
    with tempfile.TemporaryDirectory() as d:
        out = os.path.join(d, "bench.png")
        warm = dict(os.environ)
        cold = dict(os.environ, MESA_SHADER_CACHE_DISABLE="true")
        for name, env in (("warm shader cache", warm), ("cold (cache disabled)", cold)):
            med, p90, cpu = run(exe, env, runs, out)
            print(f"attiscope render 1024x768, {name:22s} median {med:6.1f} ms  p90 {p90:6.1f} ms  "
                  f"cpu {cpu:6.1f} ms  ({runs} runs)")
    return 0


if __name__ == "__main__":
    sys.exit(main())
