#!/usr/bin/env python3
"""Times whole commands side by side: each round runs every command once, in turn, so all of them
see the same machine load; prints the median, minimum and maximum wall-clock seconds of N rounds and
the median CPU time (user + system of the command and its children), each median's ratio to the
first command's, and the load average before and after. On a shared machine the CPU time is the
steadier figure; the wall clock is the one a user sees.

usage: side_by_side.py [-n ROUNDS] [--warmup W] LABEL=COMMAND [LABEL=COMMAND ...]
COMMAND runs through /bin/sh with stdout and stderr discarded; a non-zero exit status stops the run.
"""
import argparse
import os
import statistics
import subprocess
import sys
import time


def load():
    return "/".join(f"{x:.2f}" for x in os.getloadavg())


def run_once(cmd):
    before = os.times()
    t0 = time.perf_counter()
    r = subprocess.run(cmd, shell=True, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE)
    t = time.perf_counter() - t0
    after = os.times()
    if r.returncode != 0:
        sys.exit(f"side_by_side: '{cmd}' exited {r.returncode}: {r.stderr.decode(errors='replace')[-400:]}")
    cpu = (after.children_user - before.children_user) + (after.children_system - before.children_system)
    return t, cpu


def main():
    p = argparse.ArgumentParser()
    p.add_argument("-n", type=int, default=11)
    p.add_argument("--warmup", type=int, default=1)
    p.add_argument("commands", nargs="+")
    a = p.parse_args()
    cmds = [c.split("=", 1) for c in a.commands]
    print(f"load average (1/5/15 min) before: {load()}")
    for _ in range(a.warmup):
        for _, c in cmds:
            run_once(c)
    times = {label: [] for label, _ in cmds}
    cpus = {label: [] for label, _ in cmds}
    for _ in range(a.n):
        for label, c in cmds:
            t, cpu = run_once(c)
            times[label].append(t)
            cpus[label].append(cpu)
    base = statistics.median(times[cmds[0][0]])
    base_cpu = statistics.median(cpus[cmds[0][0]])
    for label, c in cmds:
        t = times[label]
        m = statistics.median(t)
        mc = statistics.median(cpus[label])
        print(f"{label:<16} wall median {m:7.3f} s (min {min(t):6.3f}, max {max(t):6.3f}) x{m / base:5.2f}"
              f" | CPU median {mc:7.3f} s x{mc / base_cpu:5.2f}   ({c})")
    print(f"load average (1/5/15 min) after:  {load()}   rounds {a.n}, warm-up {a.warmup}")


if __name__ == "__main__":
    main()
