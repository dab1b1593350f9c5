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
          "(0.93-0.98 s in a normal minute of 2026-12-02; more is a slower minute)")


if __name__ == "__main__":
    main()
