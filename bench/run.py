"""plyshear's benchmarks, measured in one run on this machine, printed as a table of ratios.

    python bench/run.py            # about two minutes on a 2-core machine
    python bench/run.py --quick    # fewer repeats and a 2 000-case sweep

(a) the linear solve of one bolt through 3 … 101 plies;
(b) sweep throughput for 10 000 cases, the batch path against a per-case loop;
(c) the same beam-on-springs model solved by the general FE library of the tests
    (PyNiteFEA, the builder of tests/verification/test_pynite_reference.py);
(d) ``solve()`` of a 101-ply joint against a bare scipy banded solve of its own
    matrix (the floor);
(e) a 20-bolt × 11-ply row to its capacity (incremental nonlinear analysis);
(f) the start-up of ``plyshear --help``.

Timings are medians of repeated runs with single-threaded BLAS (small banded
solves lose to thread start-up when BLAS spreads them over cores). Run it from
the repository root in the environment of the test extra. Not a test: timings
vary between machines; the targets are the issue's and are printed beside.
"""

from __future__ import annotations

import os

os.environ.setdefault("OPENBLAS_NUM_THREADS", "1")
os.environ.setdefault("OMP_NUM_THREADS", "1")
os.environ.setdefault("MKL_NUM_THREADS", "1")

import argparse  # noqa: E402
import statistics  # noqa: E402
import subprocess  # noqa: E402
import sys  # noqa: E402
import time  # noqa: E402
from collections.abc import Callable  # noqa: E402
from pathlib import Path  # noqa: E402

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))

import numpy as np  # noqa: E402
from scipy.linalg import cho_solve_banded, cholesky_banded  # noqa: E402

import plyshear  # noqa: E402
from plyshear.mechanics.assembly import assemble  # noqa: E402
from plyshear.model import modelfile  # noqa: E402
from plyshear.sweep import keys as sk  # noqa: E402
from plyshear.sweep import run as sr  # noqa: E402

FORK = ROOT / "plyshear" / "models" / "fork-four-planes.toml"


def median_time(func: Callable[[], object], repeat: int, number: int = 1) -> float:
    """Median over ``repeat`` runs of the mean time of ``number`` calls, s."""
    func()
    times = []
    for _ in range(repeat):
        t0 = time.perf_counter()
        for _ in range(number):
            func()
        times.append((time.perf_counter() - t0) / number)
    return statistics.median(times)


def stack(plies: int, thickness: float = 4.0, stations: int = 1) -> str:
    """Two members alternating through ``plies`` plies (the head-side member held)."""
    text = ('format = 1\nunits = "kN-mm"\n[bolt]\ndiameter = 24\ngrade = "10.9"\n'
            'threads = "excluded"\n')
    if stations > 1:
        text += f"[pattern]\ncount = {stations}\npitch = 75\n"
    for j in range(plies):
        text += (f'[[ply]]\nname = "p{j}"\nmember = "{"a" if j % 2 else "b"}"\n'
                 f"thickness = {thickness}\nfy = 355\nfu = 490\n")
        if stations > 1:
            text += "width = 200\n"
    text += "[member.a]\nload = 300\n[member.b]\nsupport = true\n"
    if stations > 1:
        text += 'enters = "after"\n'
    return text


def row(name: str, value: str, target: str = "", met: bool | None = None) -> list[str]:
    return [name, value, target, "" if met is None else ("yes" if met else "NO")]


def bench_plies(repeat: int) -> tuple[list[list[str]], float]:
    out = []
    base = None
    t101 = 0.0
    for n in (3, 5, 11, 21, 51, 101):
        joint = modelfile.loads(stack(n, 10.0))
        t = median_time(lambda j=joint: plyshear.solve(j), repeat, 5 if n < 51 else 1)
        base = base or (t if n == 3 else None)
        if n == 5:
            base = t
        na = assemble(joint).ab.shape[1]
        out.append(row(f"(a) solve(), {n} plies ({na} DOF)", f"{t * 1e3:.2f} ms",
                       "ms-class" if n == 5 else ""))
        if n == 101:
            t101 = t
    for r in out:
        t = float(r[1].split()[0]) / 1e3
        r[1] += f"  (x{t / base:.1f} of 5 plies)"
    return out, t101


def bench_floor(t101: float, repeat: int) -> list[list[str]]:
    joint = modelfile.loads(stack(101, 10.0))
    sys_ = assemble(joint)
    rhs = np.ones((sys_.ab.shape[1], 2))

    def bare() -> None:
        cb = cholesky_banded(sys_.ab, lower=False, check_finite=False)
        cho_solve_banded((cb, False), rhs, check_finite=False)

    t_bare = median_time(bare, repeat, 20)
    ratio = t101 / t_bare
    return [row("(d) solve() 101 plies / bare banded solve of its matrix",
                f"x{ratio:.1f}  ({t101 * 1e3:.2f} ms / {t_bare * 1e3:.3f} ms, "
                f"{sys_.ab.shape[1]} DOF, bandwidth {sys_.ab.shape[0] - 1})",
                "<= x10", ratio <= 10)]


def bench_sweep(cases: int) -> list[list[str]]:
    data = modelfile.read(FORK)
    count = cases // 10
    keys, rows = sk.cases([sk.parse_vary(f"ply[1].thickness=10:{10 + (count - 1) * 0.01:.2f}:0.01",
                                         data),
                           sk.parse_vary("bolt.diameter=20,22,24,27,30,33,36,39,42,45", data)])
    out = []
    for label, options in (("linear (solve only)", sr.Options(capacity="none", check=False)),
                           ("with check and elastic capacity", sr.Options())):
        t0 = time.perf_counter()
        sr.run(data, str(FORK), keys, rows, options, workers=1)
        t_batch = time.perf_counter() - t0
        sample = rows[:: max(1, len(rows) // 1000)]
        slow = sr.Options(capacity=options.capacity, check=options.check, batch=False)
        t0 = time.perf_counter()
        sr.run(data, str(FORK), keys, sample, slow, workers=1)
        per_case = (time.perf_counter() - t0) / len(sample)
        rate_batch, rate_loop = len(rows) / t_batch, 1.0 / per_case
        out.append(row(f"(b) sweep {len(rows)} cases, {label}, one core",
                       f"{t_batch:.2f} s: {rate_batch:.0f} cases/s batch, {rate_loop:.0f} "
                       f"per-case loop, x{rate_batch / rate_loop:.1f}",
                       "< 10 s" if cases == 10_000 else "", t_batch < 10.0 if cases == 10_000
                       else None))
    return out


def bench_pynite(repeat: int) -> list[list[str]]:
    try:
        from tests.verification import test_pynite_reference as ref
    except Exception as exc:  # pytest or PyNiteFEA missing: report, do not fail
        return [row("(c) PyNiteFEA / plyshear", f"skipped ({exc})")]
    name, elements = "five-ply fork and lug", 10
    joint = modelfile.loads(ref._model_text(ref.STACKS[name], elements))
    t_ours = median_time(lambda: plyshear.solve(joint), repeat, 10)
    build = ref._pynite.__wrapped__  # the uncached builder: build, solve, read back
    t_fe = median_time(lambda: build(name, elements), max(3, repeat // 3))
    ours = np.array([p.shear_xy[0] for p in plyshear.solve(joint).first_bolt_planes])
    diff = float(np.max(np.abs(ours / build(name, elements).shear - 1.0)))
    ratio = t_fe / t_ours
    return [row("(c) PyNiteFEA / plyshear, same 5-ply model",
                f"x{ratio:.0f}  ({t_fe * 1e3:.0f} ms / {t_ours * 1e3:.2f} ms; "
                f"plane shears agree to {diff:.1e})", ">= x100", ratio >= 100)]


def bench_row_capacity() -> list[list[str]]:
    from plyshear.mechanics.capacity import summarize

    joint = modelfile.loads(stack(11, thickness=8.0, stations=20))
    t0 = time.perf_counter()
    s = summarize(joint)
    t = time.perf_counter() - t0
    return [row("(e) 20 bolts x 11 plies to capacity (every answer)",
                f"{t:.1f} s  ({len(s.analysis.history)} load steps; nonlinear "
                f"{s.nonlinear.load / 1e3:.0f} kN, {s.nonlinear.event})")]


def bench_capacity(repeat: int) -> list[list[str]]:
    """The capacity summary of the examples: the demo fork and the six-bolt splice."""
    from plyshear.mechanics.capacity import summarize

    out = []
    for name in ("fork-four-planes", "splice-six-bolts"):
        joint = plyshear.load_model(ROOT / "models" / f"{name}.toml")
        s = summarize(joint)
        t = median_time(lambda j=joint: summarize(j), max(1, repeat // 5))
        out.append(row(f"(g) capacity summary of {name}",
                       f"{t:.2f} s  ({len(s.analysis.history)} states; nonlinear "
                       f"{s.nonlinear.load / 1e3:.0f} kN, collapse "
                       f"{s.collapse.load / 1e3:.0f} kN, {s.mechanism.elements} LP "
                       "elements a ply)"))
    return out


def bench_help(repeat: int) -> list[list[str]]:
    exe = Path(sys.executable).with_name("plyshear")
    cmd = [str(exe), "--help"] if exe.exists() else [sys.executable, "-m", "plyshear.cli",
                                                      "--help"]
    t = median_time(lambda: subprocess.run(cmd, capture_output=True, check=True), repeat)
    return [row("(f) plyshear --help start-up", f"{t:.2f} s", "< 0.5 s", t < 0.5)]


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--quick", action="store_true", help="fewer repeats, 2000 cases")
    args = parser.parse_args()
    repeat = 5 if args.quick else 15
    rows: list[list[str]] = []
    plies, t101 = bench_plies(repeat)
    rows += plies
    rows += bench_floor(t101, repeat)
    rows += bench_sweep(2_000 if args.quick else 10_000)
    rows += bench_pynite(repeat)
    rows += bench_row_capacity()
    rows += bench_capacity(repeat)
    rows += bench_help(repeat)
    from plyshear.report.text import table

    print(f"plyshear {plyshear.__version__}, Python {sys.version.split()[0]}, numpy "
          f"{np.__version__}, {os.cpu_count()} cores, {time.strftime('%Y-%m-%d')}")
    print(table(["measure", "value", "target", "met"], rows, align="llll"))


if __name__ == "__main__":
    main()
