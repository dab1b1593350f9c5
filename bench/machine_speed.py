#!/usr/bin/python3
"""Prints how fast this machine runs right now: the wall time of a fixed Python loop.

The benchmarks print it before their figures, because on a shared machine the same work
takes a different time from one minute to the next; a figure is read against the loop's
time taken in the same minute. usage: bench/machine_speed.py
"""
import time


def main():
    t = time.perf_counter()
    sum(i * i for i in range(10**7))
    took = time.perf_counter() - t
    print(f"machine speed: a fixed Python loop (sum of squares to 1e7) takes {took:.2f} s now "
          "(0.54-1.44 s on this machine on 2026-12-02, most often 0.8-1.0 s; more is slower)")


if __name__ == "__main__":
    main()
