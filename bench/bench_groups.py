"""Cost of a bolt row: doubling the stations should roughly double the solve time.

Prints, from one run on this machine, the median solve time of rows of 5, 10, 20
and 40 bolts through a 5-ply stack and the ratio of each to the previous size.
Not a test: timings vary from machine to machine.
"""

from __future__ import annotations

import os

# Small banded solves lose to thread start-up when OpenBLAS spreads them over
# cores; measure the single-thread cost (set before numpy is imported).
os.environ.setdefault("OPENBLAS_NUM_THREADS", "1")

import statistics  # noqa: E402
import time  # noqa: E402

import plyshear  # noqa: E402
from plyshear.model import modelfile  # noqa: E402

STACK = """\
format = 1
units = "kN-mm"
[bolt]
diameter = 20
grade = "10.9"
threads = "excluded"
[pattern]
count = {n}
pitch = 70
""" + "".join(
    f'[[ply]]\nname = "p{j}"\nmember = "{"a" if j % 2 else "b"}"\nthickness = 12\n'
    'steel = "S355"\nwidth = 200\n' for j in range(5)
) + '[member.a]\nload = 500\n[member.b]\nsupport = true\nenters = "after"\n'


def median_time(n: int, repeat: int = 15) -> float:
    joint = modelfile.loads(STACK.format(n=n))
    plyshear.solve(joint)
    times = []
    for _ in range(repeat):
        t = time.perf_counter()
        plyshear.solve(joint)
        times.append(time.perf_counter() - t)
    return statistics.median(times)


def main() -> None:
    previous = None
    print(f"{'bolts':>6} {'solve [ms]':>11} {'ratio':>7}")
    for n in (5, 10, 20, 40):
        t = median_time(n)
        ratio = "" if previous is None else f"{t / previous:7.2f}"
        print(f"{n:6d} {1e3 * t:11.2f} {ratio}")
        previous = t


if __name__ == "__main__":
    main()
