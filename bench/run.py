"""plyshear's benchmarks, measured in one run on this machine, printed as a table of ratios.

    python bench/run.py            # about two minutes on a 2-core machine
    python bench/run.py --quick    # fewer repeats and a 2 000-case sweep

(a) the linear solve of one bolt through 3 … 101 plies;
(b) sweep throughput for 10 000 cases, the batch path against a per-case loop;
(c) the same beam-on-springs model solved by the general FE library of the tests
    (PyNiteFEA, the builder of tests/verification/test_pynite_reference.py);
(d) ``solve()`` of a 101-ply joint against a bare scipy banded solve of its own
    matrix (the floor);
(e) a 20-bolt × 11-ply row to its capacity (every answer), with its parts;
(f) the start-up of ``plyshear --help`` and of ``plyshear solve`` on the demo;
(g) the capacity summaries of the examples; the demo fork's against its single solve;
(h) the hole-position scatter of the demo, a sample against the single solve;
(i) ``sweep --capacity full``, per case.

``--baseline DIR`` (an older checkout, e.g. ``git worktree add /tmp/old <commit>``)
also times (a), (d), (f), (g), (h) and (i) on that tree in subprocesses of this run,
and prints the speed-ups beside.

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
    from plyshear.mechanics.collapse import collapse
    from plyshear.mechanics.incremental import analyse, reference_pattern
    from plyshear.mechanics.loadpath import plastic_bound
    from plyshear.mechanics.strengths import strengths

    joint = modelfile.loads(stack(11, thickness=8.0, stations=20))
    t0 = time.perf_counter()
    s = summarize(joint)
    t = time.perf_counter() - t0
    ref = reference_pattern(joint)
    st = strengths(ref)
    parts = []
    for name, func in (
            ("nonlinear", lambda: analyse(ref, strength=st)),
            ("collapse LP", lambda: collapse(ref, list(st.bearing), st.moment, st.shear,
                                             list(st.net_section))),
            ("shear-only bound", lambda: plastic_bound(ref, list(st.plane), list(st.ply_force),
                                                       list(st.net_section)))):
        t1 = time.perf_counter()
        func()
        parts.append(f"{name} {time.perf_counter() - t1:.2f} s")
    return [row("(e) 20 bolts x 11 plies to capacity (every answer)",
                f"{t:.1f} s  ({'; '.join(parts)}; {len(s.analysis.history)} load steps, "
                f"nonlinear {s.nonlinear.load / 1e3:.0f} kN, {s.nonlinear.event})",
                "<= 1 s", t <= 1.0)]


def bench_capacity(repeat: int) -> list[list[str]]:
    """The capacity summary of the examples: the demo fork and the six-bolt splice."""
    from plyshear.mechanics.capacity import summarize

    fork = plyshear.load_model(FORK)
    t_solve = median_time(lambda: plyshear.solve(fork), repeat, 10)
    t_cap = median_time(lambda: summarize(fork), max(3, repeat // 3))
    ratio = t_cap / t_solve
    out = [row("(g) capacity summary of the demo fork / its single solve",
               f"x{ratio:.0f}  ({t_cap * 1e3:.0f} ms / {t_solve * 1e3:.2f} ms)", "<= x30",
               ratio <= 30)]
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


def bench_scatter(samples: int) -> list[list[str]]:
    """A sample of the hole-position scatter of the demo against the demo's single solve."""
    from plyshear.mechanics.studies import hole_scatter

    fork = plyshear.load_model(FORK)
    t_solve = median_time(lambda: plyshear.solve(fork), 15, 10)
    hole_scatter(fork, 1, 0)
    t0 = time.perf_counter()
    hole_scatter(fork, samples, 0)
    per = (time.perf_counter() - t0) / samples
    ratio = per / t_solve
    est = 1000 * per  # the scatter runs its samples one after another in one process
    return [row(f"(h) scatter of the demo: a sample / its single solve ({samples} samples)",
                f"x{ratio:.0f}  ({per * 1e3:.0f} ms a sample)", "<= x10", ratio <= 10),
            row("(h) capacity --scatter 1000 on the demo (from the samples above)",
                f"{est:.0f} s", "< 20 s", est < 20)]


def sweep_full_per_case(cases: int) -> float:
    """Seconds a case of ``sweep --capacity full`` on the demo (one core)."""
    data = modelfile.read(FORK)
    keys, rows = sk.cases([sk.parse_vary(f"ply[1].thickness=10:{10 + (cases - 1) * 0.5:g}:0.5",
                                         data)])
    t0 = time.perf_counter()
    sr.run(data, str(FORK), keys, rows, sr.Options(capacity="full"), workers=1)
    return (time.perf_counter() - t0) / len(rows)


def bench_sweep_full(cases: int) -> list[list[str]]:
    per = sweep_full_per_case(cases)
    return [row(f"(i) sweep --capacity full, {cases} cases of the demo, one core",
                f"{per * 1e3:.0f} ms a case")]


def startup_times(repeat: int) -> tuple[float, float]:
    """``plyshear --help`` and ``plyshear solve`` of the demo (console script), s."""
    exe = Path(sys.executable).with_name("plyshear")
    base = [str(exe)] if exe.exists() else [sys.executable, "-m", "plyshear.cli"]

    def run(*args: str) -> float:
        cmd = base + list(args)
        return median_time(lambda: subprocess.run(cmd, capture_output=True, check=True),
                           repeat)

    return run("--help"), run("solve", str(FORK))


def bench_help(repeat: int) -> list[list[str]]:
    t_help, t_solve = startup_times(repeat)
    return [row("(f) plyshear --help start-up", f"{t_help:.2f} s", "< 0.5 s", t_help < 0.5),
            row("(f) plyshear solve of the demo, start to end", f"{t_solve:.2f} s")]


BASELINE_CODE = """from __future__ import annotations
import json, os, statistics, sys, time
from pathlib import Path
sys.path.insert(0, sys.argv[1])
import plyshear
from plyshear.model import modelfile
from plyshear.sweep import keys as sk
from plyshear.sweep import run as sr
from plyshear.mechanics.capacity import summarize
from plyshear.mechanics.studies import hole_scatter
FORK = Path(sys.argv[1]) / "plyshear" / "models" / "fork-four-planes.toml"
{helpers}
out = {{}}
j5 = modelfile.loads(stack(5, 10.0)); j101 = modelfile.loads(stack(101, 10.0))
fork = plyshear.load_model(FORK)
out["solve5"] = median_time(lambda: plyshear.solve(j5), 15, 10)
out["solve101"] = median_time(lambda: plyshear.solve(j101), 15, 1)
out["summary"] = median_time(lambda: summarize(fork), 5)
hole_scatter(fork, 1, 0)
t0 = time.perf_counter(); hole_scatter(fork, int(sys.argv[2]), 0)
out["sample"] = (time.perf_counter() - t0) / int(sys.argv[2])
out["full"] = sweep_full_per_case(int(sys.argv[3]))
print(json.dumps(out))
"""


def child_cpu(cmd: list[str], env: dict[str, str], repeat: int) -> float:
    """Least CPU time (user + system) of a command over ``repeat`` runs, s.

    CPU time, not wall time: on a shared machine the wall time of a start-up is
    mostly the wait for a core.
    """
    import resource

    times = []
    for _ in range(repeat):
        before = resource.getrusage(resource.RUSAGE_CHILDREN)
        subprocess.run(cmd, env=env, capture_output=True, check=True)
        after = resource.getrusage(resource.RUSAGE_CHILDREN)
        times.append(after.ru_utime - before.ru_utime + after.ru_stime - before.ru_stime)
    return min(times)


def bench_baseline(old: Path, repeat: int, samples: int, cases: int) -> list[list[str]]:
    """The same measures on an older tree, in subprocesses of this run, and the speed-ups."""
    import inspect
    import json

    from plyshear.mechanics.capacity import summarize
    from plyshear.mechanics.studies import hole_scatter

    # the helpers of this file drive the old tree too (its own bench may lack them)
    helpers = "\n\n".join(inspect.getsource(f) for f in (median_time, stack,
                                                          sweep_full_per_case))
    probe = BASELINE_CODE.format(helpers=helpers)
    res = subprocess.run([sys.executable, "-c", probe, str(old), str(samples), str(cases)],
                         capture_output=True, text=True, check=True,
                         env={**os.environ, "PYTHONPATH": str(old)})
    was = json.loads(res.stdout.strip().splitlines()[-1])
    j5, j101 = modelfile.loads(stack(5, 10.0)), modelfile.loads(stack(101, 10.0))
    fork = plyshear.load_model(FORK)
    now = {"solve5": median_time(lambda: plyshear.solve(j5), repeat, 10),
           "solve101": median_time(lambda: plyshear.solve(j101), repeat, 1),
           "summary": median_time(lambda: summarize(fork), 5)}
    t0 = time.perf_counter()
    hole_scatter(fork, samples, 0)
    now["sample"] = (time.perf_counter() - t0) / samples
    now["full"] = sweep_full_per_case(cases)
    old_exe = [sys.executable, "-c", "import sys; sys.argv[0] = 'plyshear'; "
               "from plyshear.cli import main; main()", "solve", str(FORK)]
    t_old = child_cpu(old_exe, {**os.environ, "PYTHONPATH": str(old)}, repeat)
    t_new = child_cpu(old_exe, {**os.environ, "PYTHONPATH": str(ROOT)}, repeat)
    out = []
    for key, label, target, need in (
            ("solve5", "solve(), 5 plies", "", None),
            ("solve101", "solve(), 101 plies", "", None),
            ("summary", "capacity summary of the demo", "", None),
            ("sample", "a scatter sample of the demo", "", None),
            ("full", "sweep --capacity full, a case", ">= x5", 5.0)):
        if was.get(key) is None:
            continue
        gain = was[key] / now[key]
        out.append(row(f"(baseline) {label}: before / now",
                       f"x{gain:.1f}  ({was[key] * 1e3:.1f} ms / {now[key] * 1e3:.1f} ms)",
                       target, None if need is None else gain >= need))
    gain = t_old / t_new
    out.append(row("(baseline) plyshear solve start-up: before / now (CPU time of the process)",
                   f"x{gain:.2f}  ({t_old:.2f} s / {t_new:.2f} s)", ">= x1.3", gain >= 1.3))
    return out


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--quick", action="store_true", help="fewer repeats, 2000 cases")
    parser.add_argument("--baseline", type=Path, default=None,
                        help="an older checkout to time beside (its speed-ups are printed)")
    parser.add_argument("--no-row", action="store_true",
                        help="skip (e), the 20 x 11 row (minutes while the collapse LP is slow)")
    args = parser.parse_args()
    repeat = 5 if args.quick else 15
    rows: list[list[str]] = []
    plies, t101 = bench_plies(repeat)
    rows += plies
    rows += bench_floor(t101, repeat)
    rows += bench_sweep(2_000 if args.quick else 10_000)
    rows += bench_pynite(repeat)
    if not args.no_row:
        rows += bench_row_capacity()
    rows += bench_capacity(repeat)
    rows += bench_scatter(5 if args.quick else 20)
    rows += bench_sweep_full(10 if args.quick else 40)
    rows += bench_help(repeat)
    if args.baseline is not None:
        rows += bench_baseline(args.baseline, repeat, 5 if args.quick else 20,
                               10 if args.quick else 40)
    from plyshear.report.text import table

    print(f"plyshear {plyshear.__version__}, Python {sys.version.split()[0]}, numpy "
          f"{np.__version__}, {os.cpu_count()} cores, {time.strftime('%Y-%m-%d')}")
    print(table(["measure", "value", "target", "met"], rows, align="llll"))


if __name__ == "__main__":
    main()
