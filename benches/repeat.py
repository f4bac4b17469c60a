"""Runs a command N times and prints the least and the median wall time, processor
time (user + system, all threads) and the peak resident memory of the runs.

    python3 benches/repeat.py N COMMAND [ARGS...]

The measurements in README.md were taken with it: a single run on a shared two-core
machine varies by up to a third, so the figures give the least and the median of
several runs. The command's output is discarded.
"""
import resource
import statistics
import subprocess
import sys
import time


def main():
    n = int(sys.argv[1])
    cmd = sys.argv[2:]
    walls, cpus = [], []
    for _ in range(n):
        before = resource.getrusage(resource.RUSAGE_CHILDREN)
        t = time.perf_counter()
        subprocess.run(cmd, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL, check=False)
        walls.append(time.perf_counter() - t)
        after = resource.getrusage(resource.RUSAGE_CHILDREN)
        cpus.append(after.ru_utime - before.ru_utime + after.ru_stime - before.ru_stime)
    peak = resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss / 1024
    print(
        f"wall least {min(walls):.3f} s, median {statistics.median(walls):.3f} s; "
        f"cpu least {min(cpus):.3f} s, median {statistics.median(cpus):.3f} s; "
        f"peak {peak:.0f} MB"
    )


if __name__ == "__main__":
    main()
