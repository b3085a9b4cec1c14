"""Load cases: one model with 10 cases (and 10 combinations) against one plain case.

    python bench/bench_cases.py [--plies 11] [--repeat 50]

Every case is one more right-hand side of one factorisation, and the cases and
combinations are recovered as one batch, so the issue's target is a solve of
10 cases within 1.5x of a single case's solve. Medians, single-threaded BLAS.
Not a test: timings vary between machines.
"""

from __future__ import annotations

import os

os.environ.setdefault("OPENBLAS_NUM_THREADS", "1")
os.environ.setdefault("OMP_NUM_THREADS", "1")

import argparse  # noqa: E402
import dataclasses  # noqa: E402
import statistics  # noqa: E402
import sys  # noqa: E402
import time  # noqa: E402
from pathlib import Path  # noqa: E402

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

import numpy as np  # noqa: E402

import plyshear  # noqa: E402
from plyshear.mechanics.combine import solve_combinations  # noqa: E402
from plyshear.model.joint import Combination, Joint, LoadCase, Ply  # noqa: E402

FORK = ROOT / "plyshear" / "models" / "fork-four-planes.toml"


def stack(plies: int) -> Joint:
    """The demo fork's bolt through ``plies`` alternating plies (fork held, hanger loaded)."""
    base = plyshear.load_model(FORK)
    proto = base.plies[0]
    new = tuple(dataclasses.replace(proto, name=f"p{i}", member="fork" if i % 2 == 0
                                    else "hanger", thickness=10.0) for i in range(plies))
    return dataclasses.replace(base, plies=new, bolt=dataclasses.replace(
        base.bolt, length=None, thread_length=None))


def with_cases(joint: Joint, n: int) -> Joint:
    rng = np.random.default_rng(1)
    cases = tuple(LoadCase(name=f"case{k}", loads=tuple(
        (0.0, 0.0) if m.support else tuple(float(v) for v in rng.uniform(-1, 1, 2) * 1e5)
        for m in joint.members)) for k in range(n))
    combos = tuple(Combination(name=f"c{k}", factors=tuple(
        (c.name, float(f)) for c, f in zip(cases, rng.uniform(0.5, 1.6, n), strict=True)))
        for k in range(n))
    return dataclasses.replace(joint, cases=cases, combinations=combos).for_combination("c0")


def median_time(func, repeat: int) -> float:
    func()
    times = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        func()
        times.append(time.perf_counter() - t0)
    return statistics.median(times)


def main() -> None:
    ap = argparse.ArgumentParser()
    ap.add_argument("--plies", type=int, default=11)
    ap.add_argument("--repeat", type=int, default=50)
    args = ap.parse_args()
    joint = stack(args.plies)
    assert not any(isinstance(p, Ply) and p.member is None for p in joint.plies)
    one = median_time(lambda: plyshear.solve(joint), args.repeat)
    print(f"{args.plies} plies: one case {one * 1e3:.2f} ms")
    for n in (1, 10, 30):
        multi = with_cases(joint, n)
        t = median_time(lambda multi=multi: solve_combinations(multi), args.repeat)
        print(f"  {n:3d} cases + {n:3d} combinations: {t * 1e3:.2f} ms = {t / one:.2f} x one "
              "case (target for 10: 1.5 x)")


if __name__ == "__main__":
    main()
