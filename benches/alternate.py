"""Runs two commands in turn, N rounds, and prints for each the least and the median wall
time, its processor time (user + system) and its peak resident memory. On a shared
machine whose speed changes by the hour, only figures taken in the same rounds compare.

    python3 benches/alternate.py N COMMAND_A [ARGS...] -- COMMAND_B [ARGS...]

Each run goes through /usr/bin/time for its own peak memory; the commands' output is
discarded.
"""
import statistics
import subprocess
import sys
import time


def run(cmd):
    t = time.perf_counter()
    p = subprocess.run(
        ["/usr/bin/time", "-f", "%M %U %S"] + cmd,
        stdout=subprocess.DEVNULL,
        stderr=subprocess.PIPE,
        text=True,
        check=False,
    )
    wall = time.perf_counter() - t
    kb, user, system = p.stderr.strip().split("\n")[-1].split()
    return wall, float(user) + float(system), int(kb) / 1024


def main():
    n = int(sys.argv[1])
    rest = sys.argv[2:]
    if "--" not in rest:
        sys.exit("usage: alternate.py N COMMAND_A [ARGS...] -- COMMAND_B [ARGS...]")
    k = rest.index("--")
    cmds = {"A": rest[:k], "B": rest[k + 1 :]}
    runs = {name: [] for name in cmds}
    for _ in range(n):
        for name, cmd in cmds.items():
            runs[name].append(run(cmd))
    for name, rs in runs.items():
        walls = [r[0] for r in rs]
        cpus = [r[1] for r in rs]
        mbs = [r[2] for r in rs]
        print(
            f"{name} ({' '.join(cmds[name][:2])} ...): wall least {min(walls):.2f} s, median "
            f"{statistics.median(walls):.2f} s; processor {min(cpus):.1f} to {max(cpus):.1f} s; "
            f"peak {min(mbs):.0f} to {max(mbs):.0f} MB"
        )


if __name__ == "__main__":
    main()
