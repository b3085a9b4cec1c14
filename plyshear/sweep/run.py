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

:func:`run_stream` hands rows over chunk by chunk as they finish (the CLI
appends them to its output file), skips cases already done, stops promptly on
SIGINT or SIGTERM and survives a worker's death (its chunk runs again once;
a second death makes its cases error rows). :func:`run` collects them.
"""

from __future__ import annotations

import contextlib
import math
import os
import time
from collections.abc import Callable, Mapping, Sequence
from dataclasses import dataclass, field
from typing import Any

from plyshear.sweep import pool as _pool
from plyshear.sweep.keys import Key, apply
from plyshear.sweep.stream import case_key

#: Cases per chunk: large enough for the batch path, small enough for a progress bar.
CHUNK = 250
#: Cases per chunk with ``capacity="full"`` (about 0.1 s a case: a chunk of a second),
#: so that progress, interrupts and retries stay fine-grained.
FULL_CHUNK = 10
CAPACITY_MODES = ("none", "elastic", "full")
#: Columns of every row, before the plane shears (see :func:`columns`).
BASE_COLUMNS = (
    "case",
    "case_key",
    "error",
    "max_shear",
    "worst_plane",
    "max_moment",
    "utilization",
    "governing",
    "passes",
    "informative",
)


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


def chunk_size(options: Options) -> int:
    """Cases per chunk for these options (a chunk takes about a second or less)."""
    return FULL_CHUNK if options.capacity == "full" else CHUNK


def columns(keys: Sequence[Key], planes: int, options: Options, bolts: int = 1) -> list[str]:
    """The column titles of the result table, in order (``worst_bolt`` for a row of bolts)."""
    cols = ["case", "case_key", *(k.text for k in keys), *BASE_COLUMNS[2:]]
    if bolts > 1:
        cols.insert(cols.index("worst_plane"), "worst_bolt")
    if not options.check:
        cols = [c for c in cols if c not in ("utilization", "governing", "passes", "informative")]
    cols += [f"shear_plane_{i}" for i in range(1, planes + 1)]
    if options.capacity != "none":
        cols += ["capacity_elastic", "load_factor", "capacity_event"]
    if options.capacity == "full":
        cols += [
            "capacity_nonlinear",
            "nonlinear_event",
            "capacity_collapse",
            "capacity_plastic",
            "efficiency_nonlinear",
        ]
    return cols


def evaluate(
    base: Mapping[str, Any],
    source: str,
    keys: Sequence[Key],
    cases: Sequence[Sequence[Any]],
    options: Options,
    first: int = 1,
    numbers: Sequence[int] | None = None,
) -> list[dict[str, Any]]:
    """Evaluate cases in this process.

    Args:
        base: The parsed model file.
        source: Its file name (for error messages).
        keys: The varied keys.
        cases: One list of values per case, in the order of ``keys``.
        options: What to compute.
        first: The number of the first case (1-based).
        numbers: The number of every case (instead of ``first``, ``first + 1``, ...).

    Returns:
        One row per case: column → value, in the model's units.
    """
    from plyshear.errors import ModelError, SolveError
    from plyshear.mechanics.batch import solve_many
    from plyshear.mechanics.solve import solve as solve_one
    from plyshear.model.modelfile import from_dict

    rows: list[dict[str, Any]] = []
    joints = []
    names = [k.text for k in keys]
    for n, values in enumerate(cases):
        row: dict[str, Any] = {
            "case": numbers[n] if numbers is not None else first + n,
            "case_key": case_key(names, values),
        }
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


#: How the error of a row whose case could not run (its worker died twice) begins:
#: a fault, not the case's own error; ``--resume`` runs it again.
FAULT_MARK = "fault, not run: "


def is_fault(row: Mapping[str, Any]) -> bool:
    """True if the row is a fault (its case never ran), not a result."""
    return str(row.get("error") or "").startswith(FAULT_MARK)


#: Longest error text in a row (as the command line's error lines).
MAX_ERROR_CHARS = 300


def _error_text(exc: Exception | str, source: str) -> str:
    """The error without the file name every row would repeat, on one line."""
    text = str(exc)
    prefix = f"{source}: "
    text = text[len(prefix) :] if text.startswith(prefix) else text
    text = "".join(ch if ch.isprintable() else ascii(ch)[1:-1] for ch in text)
    return text if len(text) <= MAX_ERROR_CHARS else text[: MAX_ERROR_CHARS - 3] + "..."


def _responses(joint: Any, sol: Any, options: Options, source: str) -> dict[str, Any]:
    """The table columns of one solved case, in the model's units."""
    import numpy as np

    from plyshear import units as _units
    from plyshear.errors import CapacityError
    from plyshear.mechanics.capacity import elastic_capacity, pattern_total

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
            res = check(sol)
        except ValueError as exc:
            out["error"] = _error_text(exc, source)
        else:
            gov = res.governing
            if gov is not None:
                out["utilization"] = _finite(gov.utilization)
                out["governing"] = f"{gov.what}, {gov.place(joint.units)}"
            if res.unverified:  # it fails for this, not for its governing item
                from plyshear.codes.check import UNVERIFIED

                out["governing"] = f"{UNVERIFIED} ({res.unverified})" + (
                    f"; largest: {out['governing']}" if gov is not None else ""
                )
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
        from plyshear.codes.resistance import nominal_bearing
        from plyshear.mechanics.capacity import summarize

        try:
            s = summarize(sol, nominal_bearing(joint))
        except (CapacityError, ValueError) as exc:
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


@dataclass
class Outcome:
    """How a streamed run ended.

    Attributes:
        done: Cases finished in this run (rows handed over).
        skipped: Cases skipped as already done.
        stopped: The signal that stopped the run (SIGINT, SIGTERM), or None.
        fault: Why the run could not finish (a lost cluster), or "".
        lost: Cases that became error rows because their worker died twice.
        deaths: Worker deaths seen.
    """

    done: int = 0
    skipped: int = 0
    stopped: int | None = None
    fault: str = ""
    lost: int = 0
    deaths: int = 0
    failed_chunks: list[int] = field(default_factory=list)


def run(
    base: Mapping[str, Any],
    source: str,
    keys: Sequence[Key],
    cases: Sequence[Sequence[Any]],
    options: Options,
    workers: int | None = None,
    scheduler: str | None = None,
    chunk: int = CHUNK,
    progress: Callable[[int], None] | None = None,
) -> list[dict[str, Any]]:
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
            or the scheduler cannot be reached, or the run could not finish.
    """
    rows: list[dict[str, Any]] = []

    def sink(part: list[dict[str, Any]]) -> None:
        rows.extend(part)
        if progress is not None:
            progress(len(part))

    out = run_stream(
        base, source, keys, cases, options, sink, workers=workers, scheduler=scheduler, chunk=chunk
    )
    if out.fault:
        raise RuntimeError(out.fault)
    return sorted(rows, key=lambda r: r["case"])


def run_stream(
    base: Mapping[str, Any],
    source: str,
    keys: Sequence[Key],
    cases: Sequence[Sequence[Any]],
    options: Options,
    sink: Callable[[list[dict[str, Any]]], None],
    *,
    skip: Callable[[str], bool] | None = None,
    workers: int | None = None,
    scheduler: str | None = None,
    chunk: int = CHUNK,
    stopper: _pool.Stopper | None = None,
    worker_timeout: float = 60.0,
) -> Outcome:
    """Evaluate the cases, handing each chunk's rows to ``sink`` as it finishes.

    Args:
        base: The parsed model file.
        source: Its file name.
        keys: The varied keys.
        cases: One list of values per case (case numbers are 1-based positions).
        options: What to compute.
        sink: Receives the rows of every finished chunk, in this process.
        skip: Given a case key, True to skip the case (done in an earlier run).
        workers: Local worker processes (default: one per core; 1: this process).
        scheduler: A Dask scheduler's address, or None.
        chunk: Cases per chunk.
        stopper: Its SIGINT/SIGTERM stops the run (finished rows are kept).
        worker_timeout: With ``scheduler``: seconds without any worker before the
            run ends.

    Returns:
        The :class:`Outcome`.

    Raises:
        RuntimeError: If ``scheduler`` is given and dask.distributed is not
            installed or the scheduler cannot be reached.
    """
    names = [k.text for k in keys]
    todo = [n for n in range(len(cases)) if skip is None or not skip(case_key(names, cases[n]))]
    outcome = Outcome(skipped=len(cases) - len(todo))
    jobs = [
        (
            base,
            source,
            keys,
            [cases[n] for n in todo[i : i + chunk]],
            options,
            1,
            [n + 1 for n in todo[i : i + chunk]],
        )
        for i in range(0, len(todo), chunk)
    ]
    stop = stopper or _pool.Stopper()

    def deliver(i: int, rows: list[dict[str, Any]]) -> None:
        sink(rows)
        outcome.done += len(rows)

    def lost(i: int, cause: str) -> None:
        rows = _fault_rows(jobs[i], cause)
        outcome.lost += len(rows)
        outcome.failed_chunks.append(i)
        deliver(i, rows)

    if scheduler is not None:
        _run_dask(scheduler, jobs, deliver, lost, stop, outcome, worker_timeout)
        return outcome
    n_workers = min(workers or os.cpu_count() or 1, len(jobs))
    if n_workers <= 1:
        for i, job in enumerate(jobs):
            if stop.stopped:
                break
            try:
                with stop.raise_inside():
                    rows = _chunk(job)
            except _pool.Interrupted:
                break
            deliver(i, rows)
        outcome.stopped = stop.signum
        return outcome
    try:
        report = _pool.run_jobs(_chunk, jobs, n_workers, deliver, stop, on_error=lost)
    except _pool.PoolError as exc:
        outcome.fault = str(exc)
        return outcome
    outcome.stopped = report.stopped
    outcome.deaths = report.deaths
    return outcome


def _fault_rows(job: tuple[Any, ...], cause: str) -> list[dict[str, Any]]:
    """Error rows for the cases of a chunk that could not be run."""
    _, source, keys, cases, _, _, numbers = job
    names = [k.text for k in keys]
    rows = []
    for n, values in zip(numbers, cases, strict=True):
        row = {
            "case": n,
            "case_key": case_key(names, values),
            "error": _error_text(FAULT_MARK + cause, source),
        }
        row.update(zip(names, values, strict=True))
        rows.append(row)
    return rows


def _context() -> Any:
    """Worker processes forked from a server with plyshear loaded (see :func:`pool.context`)."""
    return _pool.context()


def _run_dask(
    address: str,
    jobs: list[tuple[Any, ...]],
    deliver: Callable[[int, list[dict[str, Any]]], None],
    lost: Callable[[int, str], None],
    stop: _pool.Stopper,
    outcome: Outcome,
    worker_timeout: float,
) -> None:
    """Run the chunks on a Dask cluster.

    A chunk lost with its worker is resubmitted by the scheduler (up to its
    ``allowed-failures``; then its cases are error rows). No worker for
    ``worker_timeout`` seconds, or a lost scheduler, ends the run with
    ``outcome.fault`` set; the rows delivered so far stand.
    """
    try:
        from distributed import Client, KilledWorker, wait
    except ImportError:
        raise RuntimeError(
            "--scheduler needs dask.distributed: pip install 'plyshear[dask]'"
        ) from None
    try:
        client = Client(address, timeout="10s")
    except (OSError, TimeoutError, ValueError) as exc:
        raise RuntimeError(f"cannot reach the Dask scheduler at {address} ({exc})") from None
    try:
        futures = {f: i for i, f in enumerate(client.map(_chunk, jobs, pure=False))}
        last_worker = time.monotonic()
        while futures and not stop.stopped:
            try:
                ready = wait(list(futures), timeout=1.0, return_when="FIRST_COMPLETED").done
            except TimeoutError:
                ready = set()
            for fut in ready:
                i = futures.pop(fut)
                try:
                    rows = fut.result()
                except KilledWorker as exc:
                    lost(i, f"the chunk's workers died ({exc.__class__.__name__})")
                    continue
                except Exception as exc:  # noqa: BLE001 - one chunk's failure is its rows
                    if _scheduler_lost(exc):
                        raise
                    lost(i, f"{type(exc).__name__}: {exc}")
                    continue
                deliver(i, rows)
            if client.status != "running":
                raise OSError("the client lost its scheduler")
            if len(client.nthreads()):
                last_worker = time.monotonic()
            elif time.monotonic() - last_worker > worker_timeout:
                outcome.fault = (
                    f"no Dask worker for {worker_timeout:g} s at {address}; the run cannot finish"
                )
                break
        outcome.stopped = stop.signum
        for fut in futures:
            fut.cancel()
    except (OSError, TimeoutError) as exc:
        outcome.fault = f"lost the Dask scheduler at {address} ({type(exc).__name__})"
    except Exception as exc:
        if not _scheduler_lost(exc):
            raise
        outcome.fault = f"lost the Dask scheduler at {address} ({type(exc).__name__})"
    finally:
        with contextlib.suppress(Exception):
            client.close(timeout=2)


def _scheduler_lost(exc: BaseException) -> bool:
    from distributed.comm.core import CommClosedError

    return isinstance(exc, CommClosedError | OSError | TimeoutError)
