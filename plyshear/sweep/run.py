"""Evaluate the cases of a sweep: in chunks, batched, on local processes or a Dask cluster.

Each case is the model file with its varied values set
(:func:`plyshear.sweep.keys.apply`), loaded by the model loader, solved, checked
against the model's standard and, if asked, scaled to its capacity. A case that
cannot be built or solved (a value outside a catalogue's range, a mechanism)
becomes a row with its one-line error; the sweep goes on.

Cases are cut into chunks; a chunk is solved by the batch path
(:func:`plyshear.mechanics.batch.solve_many`), which assembles and factorises
same-shaped joints together. Chunks run in this process, on local worker
processes, or on a Dask distributed cluster (``dask.distributed``, an optional
extra: ``pip install 'plyshear[dask]'``); the rows are the same either way and
come back in case order.
"""

from __future__ import annotations

import math
import os
from collections.abc import Callable, Mapping, Sequence
from concurrent.futures import ProcessPoolExecutor, as_completed
from dataclasses import dataclass
from typing import Any

from plyshear.sweep.keys import Key, apply

#: Cases per chunk: large enough for the batch path, small enough for a progress bar.
CHUNK = 250
CAPACITY_MODES = ("none", "elastic", "full")
#: Columns of every row, before the plane shears (see :func:`columns`).
BASE_COLUMNS = ("case", "error", "max_shear", "worst_plane", "max_moment", "utilization",
                "governing", "passes", "informative")


@dataclass(frozen=True)
class Options:
    """What a sweep computes for every case.

    Attributes:
        capacity: ``"none"``; ``"elastic"``: the linear solution scaled to its
            first failure event (cheap; nominal strengths, as ``plyshear capacity``);
            ``"full"``: also the nonlinear and the
            plastic capacity (an incremental analysis per case, about 0.1 s).
        check: Check every case against the model's standard.
        batch: Solve same-shaped cases together (the batch path); False solves
            them one by one (the reference the batch path is tested against).
    """

    capacity: str = "elastic"
    check: bool = True
    batch: bool = True

    def __post_init__(self) -> None:
        if self.capacity not in CAPACITY_MODES:
            raise ValueError(f"capacity must be one of {', '.join(CAPACITY_MODES)}")


def columns(keys: Sequence[Key], planes: int, options: Options, bolts: int = 1) -> list[str]:
    """The column titles of the result table, in order (``worst_bolt`` for a row of bolts)."""
    cols = ["case", *(k.text for k in keys), *BASE_COLUMNS[1:]]
    if bolts > 1:
        cols.insert(cols.index("worst_plane"), "worst_bolt")
    if not options.check:
        cols = [c for c in cols if c not in ("utilization", "governing", "passes",
                                             "informative")]
    cols += [f"shear_plane_{i}" for i in range(1, planes + 1)]
    if options.capacity != "none":
        cols += ["capacity_elastic", "load_factor", "capacity_event"]
    if options.capacity == "full":
        cols += ["capacity_nonlinear", "nonlinear_event", "capacity_collapse",
                 "capacity_plastic", "efficiency_nonlinear"]
    return cols


def evaluate(base: Mapping[str, Any], source: str, keys: Sequence[Key],
             cases: Sequence[Sequence[Any]], options: Options, first: int = 1
             ) -> list[dict[str, Any]]:
    """Evaluate cases in this process.

    Args:
        base: The parsed model file.
        source: Its file name (for error messages).
        keys: The varied keys.
        cases: One list of values per case, in the order of ``keys``.
        options: What to compute.
        first: The number of the first case (1-based).

    Returns:
        One row per case: column → value, in the model's units.
    """
    from plyshear.mechanics.batch import solve_many
    from plyshear.mechanics.solve import SolveError
    from plyshear.mechanics.solve import solve as solve_one
    from plyshear.model.modelfile import ModelError, from_dict

    rows: list[dict[str, Any]] = []
    joints = []
    for n, values in enumerate(cases):
        row: dict[str, Any] = {"case": first + n}
        row.update({k.text: v for k, v in zip(keys, values, strict=True)})
        try:
            joints.append((row, from_dict(apply(base, keys, values), source)))
        except ModelError as exc:
            row["error"] = _error_text(exc, source)
        rows.append(row)
    if options.batch:
        outcomes: list[Any] = solve_many([j for _, j in joints])
    else:
        outcomes = []
        for _, joint in joints:
            try:
                outcomes.append(solve_one(joint))
            except (ModelError, SolveError) as exc:
                outcomes.append(exc)
    for (row, joint), outcome in zip(joints, outcomes, strict=True):
        if isinstance(outcome, Exception):
            row["error"] = _error_text(outcome, source)
        else:
            row.update(_responses(joint, outcome, options, source))
    return rows


def _error_text(exc: Exception, source: str) -> str:
    """The error without the file name every row would repeat."""
    text = str(exc)
    prefix = f"{source}: "
    return text[len(prefix):] if text.startswith(prefix) else text


def _responses(joint: Any, sol: Any, options: Options, source: str) -> dict[str, Any]:
    """The table columns of one solved case, in the model's units."""
    import numpy as np

    from plyshear import units as _units
    from plyshear.mechanics.capacity import CapacityError, elastic_capacity, pattern_total

    u = _units.system(joint.units)
    f, mo = u.factor("force"), u.factor("moment")
    shears = np.array([[p.shear for p in b.planes] for b in sol.bolts])  # (bolts, planes)
    per_plane = shears.max(axis=0) if shears.size else np.zeros(0)
    out: dict[str, Any] = {"error": ""}
    if per_plane.size:
        bolt, worst = np.unravel_index(int(np.argmax(shears)), shears.shape)
        out["max_shear"] = float(shears[bolt, worst]) / f
        out["worst_plane"] = int(worst) + 1
        if len(sol.bolts) > 1:
            out["worst_bolt"] = int(bolt) + 1
    out["max_moment"] = max(b.max_moment for b in sol.bolts) / mo
    for i, v in enumerate(per_plane, start=1):
        out[f"shear_plane_{i}"] = float(v) / f
    if options.check:
        from plyshear.codes.check import check

        try:
            res = check(joint, sol)
        except ValueError as exc:
            out["error"] = _error_text(exc, source)
        else:
            gov = res.governing
            if gov is not None:
                out["utilization"] = _finite(gov.utilization)
                out["governing"] = f"{gov.what}, {gov.place(joint.units)}"
            out["passes"] = res.passes
            # items outside the standard's text (a bolt's bending): shown, never deciding
            info = [i.utilization for i in res.items if i.informative]
            out["informative"] = _finite(max(info)) if info else None
    if options.capacity != "none":
        try:
            el = elastic_capacity(joint, sol)
        except CapacityError as exc:
            out["capacity_event"] = str(exc)
        else:
            out["capacity_elastic"] = el.load / f
            out["load_factor"] = el.load / pattern_total(joint)  # > 0: a load was scaled
            out["capacity_event"] = f"{el.event}, {el.where}"
    if options.capacity == "full":
        from plyshear.mechanics.capacity import summarize

        try:
            s = summarize(sol)
        except CapacityError as exc:
            out["nonlinear_event"] = str(exc)
        else:
            out["capacity_nonlinear"] = s.nonlinear.load / f
            out["nonlinear_event"] = f"{s.nonlinear.event}, {s.nonlinear.where}"
            out["capacity_collapse"] = s.collapse.load / f
            out["capacity_plastic"] = s.plastic.load / f  # the shear-only bound
            out["efficiency_nonlinear"] = _finite(s.efficiency(s.nonlinear.load))
    return out


def _finite(value: float) -> float | None:
    return value if math.isfinite(value) else None


def _chunk(args: tuple[Any, ...]) -> list[dict[str, Any]]:
    """One chunk on a worker (a top-level function, so that it pickles)."""
    return evaluate(*args)


def run(base: Mapping[str, Any], source: str, keys: Sequence[Key],
        cases: Sequence[Sequence[Any]], options: Options, workers: int | None = None,
        scheduler: str | None = None, chunk: int = CHUNK,
        progress: Callable[[int], None] | None = None) -> list[dict[str, Any]]:
    """Evaluate every case; rows come back in case order.

    Args:
        base: The parsed model file.
        source: Its file name.
        keys: The varied keys.
        cases: One list of values per case.
        options: What to compute.
        workers: Local worker processes (default: one per core; 1 runs in this
            process). Ignored with ``scheduler``.
        scheduler: Address of a Dask distributed scheduler (``tcp://host:8786``),
            or None for local execution.
        chunk: Cases per chunk.
        progress: Called with the number of cases finished, after each chunk.

    Returns:
        One row per case.

    Raises:
        RuntimeError: If ``scheduler`` is given and dask.distributed is not installed
            or the scheduler cannot be reached.
    """
    jobs = [(base, source, keys, cases[i:i + chunk], options, i + 1)
            for i in range(0, len(cases), chunk)]
    results: list[list[dict[str, Any]] | None] = [None] * len(jobs)
    tick = progress or (lambda n: None)
    if scheduler is not None:
        _run_dask(scheduler, jobs, results, tick)
    else:
        n_workers = min(workers or os.cpu_count() or 1, len(jobs))
        if n_workers <= 1:
            for i, job in enumerate(jobs):
                results[i] = _chunk(job)
                tick(len(job[3]))
        else:
            with ProcessPoolExecutor(max_workers=n_workers, mp_context=_context()) as pool:
                futures = {pool.submit(_chunk, job): i for i, job in enumerate(jobs)}
                for fut in as_completed(futures):
                    i = futures[fut]
                    results[i] = fut.result()
                    tick(len(jobs[i][3]))
    return [row for part in results if part is not None for row in part]


def _context() -> Any:
    """Worker processes forked from a server that has plyshear loaded.

    Forking the caller itself is unsafe once it runs threads (a Dask client, a
    GUI); a fresh interpreter per worker pays the imports each time. Where the
    platform has no fork server, the platform's default.
    """
    import multiprocessing

    try:
        ctx = multiprocessing.get_context("forkserver")
    except ValueError:
        return multiprocessing.get_context()
    ctx.set_forkserver_preload(["plyshear.sweep.run", "plyshear.mechanics.batch",
                                "plyshear.codes.check", "plyshear.model.modelfile"])
    return ctx


def _run_dask(address: str, jobs: list[tuple[Any, ...]],
              results: list[list[dict[str, Any]] | None], tick: Callable[[int], None]) -> None:
    try:
        from distributed import Client
        from distributed import as_completed as dask_completed
    except ImportError:
        raise RuntimeError("--scheduler needs dask.distributed: "
                           "pip install 'plyshear[dask]'") from None
    try:
        client = Client(address, timeout="10s")
    except (OSError, TimeoutError, ValueError) as exc:
        raise RuntimeError(f"cannot reach the Dask scheduler at {address} ({exc})") from None
    try:
        futures = client.map(_chunk, jobs, pure=False)
        index = {f.key: i for i, f in enumerate(futures)}
        for fut in dask_completed(futures):
            i = index[fut.key]
            results[i] = fut.result()
            tick(len(jobs[i][3]))
    finally:
        client.close()
