"""Local worker processes for long work: prompt stops, retried faults, no orphans.

A small pool of our own rather than :class:`concurrent.futures.ProcessPoolExecutor`,
because a long run needs what that pool cannot give:

* a worker that dies (out of memory, a stray signal) costs only its own chunk,
  which is run again once on a fresh worker; the executor instead breaks and
  loses every queued chunk;
* a stop (Ctrl-C, SIGTERM) takes effect at once: nothing more is dispatched,
  running chunks get a few seconds to finish, then their workers are ended;
* a worker ends itself as soon as the process that started it is gone (it
  watches a pipe only that process holds), so killing the parent, even with
  SIGKILL, leaves nothing behind.

Workers are forked from a server process with plyshear loaded (see
:func:`context`); they ignore SIGINT, which the terminal sends to the whole
process group: the parent alone decides when to stop.
"""

from __future__ import annotations

import contextlib
import os
import signal
import threading
import time
from collections import deque
from collections.abc import Callable, Iterator, Sequence
from dataclasses import dataclass, field
from typing import Any

#: Seconds a stop waits for running chunks before their workers are ended.
GRACE = 3.0
#: How often the parent looks at its stop flag while it waits for workers, seconds.
POLL = 0.1
#: Runs of one chunk on a worker that died before it is given up (the first and one retry).
ATTEMPTS = 2
#: Workers that may die before the first result, per worker asked for, before the run
#: gives up: they cannot start (a broken environment), and starting more cannot help.
STARTUP_DEATHS = 2


class PoolError(RuntimeError):
    """The worker processes cannot run at all (each dies before any result)."""


class Interrupted(Exception):  # noqa: N818 (a signal, not an error)
    """Raised inside in-process work when a stop signal arrives."""


@dataclass
class Stopper:
    """Catches SIGINT and SIGTERM while long work runs; the work polls :attr:`signum`.

    Use as a context manager in the main thread. While :attr:`raising` is set
    (in-process work that cannot poll), a signal also raises :class:`Interrupted`.
    """

    signum: int | None = None
    raising: bool = False
    _saved: dict[int, Any] = field(default_factory=dict)

    def __enter__(self) -> Stopper:
        if threading.current_thread() is threading.main_thread():
            for sig in (signal.SIGINT, signal.SIGTERM):
                self._saved[sig] = signal.signal(sig, self._handle)
        return self

    def __exit__(self, *exc: object) -> None:
        for sig, handler in self._saved.items():
            signal.signal(sig, handler)
        self._saved.clear()

    def _handle(self, signum: int, frame: Any) -> None:
        first = self.signum is None
        self.signum = signum if first else self.signum
        if self.raising and first:
            self.raising = False
            raise Interrupted

    @property
    def stopped(self) -> bool:
        """True once a stop signal has arrived."""
        return self.signum is not None

    @contextlib.contextmanager
    def raise_inside(self) -> Iterator[None]:
        """Let a signal interrupt the enclosed in-process work at once."""
        if self.stopped:
            raise Interrupted
        self.raising = True
        try:
            yield
        finally:
            self.raising = False


def context() -> Any:
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
    ctx.set_forkserver_preload(
        [
            "plyshear.sweep.run",
            "plyshear.mechanics.batch",
            "plyshear.codes.check",
            "plyshear.model.modelfile",
        ]
    )
    return ctx


def _watch_parent(alive: Any) -> None:
    """End this worker when the pipe from its parent closes (the parent is gone)."""
    with contextlib.suppress(EOFError, OSError):
        alive.recv_bytes()
    os._exit(1)


def _worker(conn: Any, alive: Any, func: Callable[[Any], Any]) -> None:
    """A worker's loop: receive ``(index, job)``, send ``(index, ok, result or text)``."""
    signal.signal(signal.SIGINT, signal.SIG_IGN)  # the parent decides when to stop
    threading.Thread(target=_watch_parent, args=(alive,), daemon=True).start()
    while True:
        try:
            msg = conn.recv()
        except (EOFError, OSError):
            return
        if msg is None:
            return
        index, job = msg
        try:
            reply = (index, True, func(job))
        except Exception as exc:  # a bug in one chunk: its rows say so, the run goes on
            reply = (index, False, f"{type(exc).__name__}: {exc}")
        conn.send(reply)


@dataclass
class _Slot:
    proc: Any
    conn: Any
    alive: Any
    job: int | None = None


def death_cause(exitcode: int | None) -> str:
    """Say how a worker ended, from its exit code (negative: the signal)."""
    if exitcode is None:
        return "the worker process vanished"
    if exitcode < 0:
        try:
            name = signal.Signals(-exitcode).name
        except ValueError:
            name = f"signal {-exitcode}"
        hint = " (out of memory?)" if -exitcode == signal.SIGKILL else ""
        return f"the worker process was killed by {name}{hint}"
    return f"the worker process exited with code {exitcode}"


@dataclass
class PoolReport:
    """What a pool run did besides its results.

    Attributes:
        deaths: Worker deaths seen, busy or idle (a busy one cost an attempt of its chunk).
        lost: Chunks given up after :data:`ATTEMPTS` deaths, with the cause.
        stopped: The signal that stopped the run, or None.
    """

    deaths: int = 0
    lost: dict[int, str] = field(default_factory=dict)
    stopped: int | None = None
    exits: list[int | None] = field(default_factory=list)


def run_jobs(
    func: Callable[[Any], Any],
    jobs: Sequence[Any],
    workers: int,
    on_result: Callable[[int, Any], None],
    stopper: Stopper,
    on_error: Callable[[int, str], None] | None = None,
    grace: float = GRACE,
) -> PoolReport:
    """Run ``func(job)`` for every job on ``workers`` local processes.

    Args:
        func: A top-level (picklable) function.
        jobs: The jobs, each picklable.
        workers: Processes to start (at most one per job).
        on_result: Called in this process with ``(index, result)`` as each job ends.
        stopper: Its signal stops the run.
        on_error: Called with ``(index, cause)`` for a job that raised, or whose
            worker died :data:`ATTEMPTS` times.
        grace: Seconds a stop waits for running jobs.

    Returns:
        The :class:`PoolReport`.
    """
    from multiprocessing.connection import wait

    report = PoolReport()
    fail = on_error or (lambda i, cause: None)
    ctx = context()
    pending = deque(range(len(jobs)))
    attempts = [0] * len(jobs)
    slots: list[_Slot] = []

    def spawn() -> _Slot:
        parent, child = ctx.Pipe()
        alive_r, alive_w = ctx.Pipe(duplex=False)
        proc = ctx.Process(target=_worker, args=(child, alive_r, func), daemon=True)
        proc.start()
        child.close()
        alive_r.close()
        return _Slot(proc, parent, alive_w)

    answered = False

    def receive(slot: _Slot) -> bool:
        nonlocal answered
        try:
            index, ok, value = slot.conn.recv()
        except (EOFError, OSError):
            return False
        answered = True
        slot.job = None
        if ok:
            on_result(index, value)
        else:
            fail(index, value)
        return True

    try:
        slots = [spawn() for _ in range(max(1, min(workers, len(jobs))))]
        while pending or any(s.job is not None for s in slots):
            if stopper.stopped:
                break
            for s in slots:
                if s.job is None and pending:
                    job = pending.popleft()
                    try:
                        s.conn.send((job, jobs[job]))
                    except OSError:  # it died since the last look; its sentinel says so
                        pending.appendleft(job)
                        continue
                    s.job = job
                    attempts[job] += 1
            busy = [s for s in slots if s.job is not None]
            ready = set(
                wait([s.conn for s in busy] + [s.proc.sentinel for s in slots], timeout=POLL)
            )
            kept: list[_Slot] = []
            for s in slots:
                if s.job is not None and s.conn in ready and receive(s):
                    kept.append(s)
                    continue
                if s.proc.sentinel not in ready and s.proc.is_alive():
                    kept.append(s)
                    continue
                # It ended, busy or idle: a worker never ends on its own while the run
                # goes on. Count it, run its chunk again, and replace it if work is left.
                if s.job is not None and s.conn.poll() and receive(s):
                    pass  # it answered, then ended
                _lost_worker(s, report, attempts, pending, fail)
                _close(s)
                report.exits.append(s.proc.exitcode)
                if not answered and len(report.exits) > STARTUP_DEATHS * len(slots):
                    slots = kept + slots[slots.index(s) :]  # for the finally clause to end
                    raise PoolError(
                        f"worker processes end as they start "
                        f"({death_cause(s.proc.exitcode)}); none could run"
                    )
                if pending and not stopper.stopped:
                    kept.append(spawn())
            slots = kept
        if stopper.stopped:
            report.stopped = stopper.signum
            _drain(slots, receive, grace)
    finally:
        _end(slots)
    return report


def _lost_worker(
    s: _Slot,
    report: PoolReport,
    attempts: list[int],
    pending: deque[int],
    fail: Callable[[int, str], None],
) -> None:
    """Account for a dead worker's chunk: run it again once, then give it up."""
    s.proc.join(timeout=1.0)
    report.deaths += 1
    if s.job is None:
        return
    cause = death_cause(s.proc.exitcode)
    if attempts[s.job] >= ATTEMPTS:
        report.lost[s.job] = cause
        fail(s.job, f"{cause}, twice, while running this chunk")
    else:
        pending.appendleft(s.job)
    s.job = None


def _drain(slots: list[_Slot], receive: Callable[[_Slot], bool], grace: float) -> None:
    """After a stop, collect what running jobs finish within ``grace`` seconds."""
    from multiprocessing.connection import wait

    deadline = time.monotonic() + grace
    while any(s.job is not None and s.proc.is_alive() for s in slots):
        left = deadline - time.monotonic()
        if left <= 0:
            return
        busy = [s.conn for s in slots if s.job is not None and s.proc.is_alive()]
        for conn in wait(busy, timeout=min(left, POLL)):
            slot = next(s for s in slots if s.conn is conn)
            if not receive(slot):
                slot.job = None


def _close(s: _Slot) -> None:
    for conn in (s.conn, s.alive):
        with contextlib.suppress(OSError):
            conn.close()


def _end(slots: list[_Slot]) -> None:
    """End every worker: idle ones are told to, busy ones are terminated."""
    for s in slots:
        if s.job is None and s.proc.is_alive():
            with contextlib.suppress(OSError, ValueError):
                s.conn.send(None)
        _close(s)  # closing the alive pipe ends a worker whatever it is doing
    deadline = time.monotonic() + 1.0
    for s in slots:
        s.proc.join(timeout=max(0.0, deadline - time.monotonic()))
        if s.proc.is_alive():
            s.proc.terminate()
            s.proc.join(timeout=1.0)
        if s.proc.is_alive():
            s.proc.kill()
            s.proc.join(timeout=1.0)
