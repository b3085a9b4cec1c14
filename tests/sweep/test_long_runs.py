"""Long sweeps as real processes: interrupts, resume, killed workers and parents, races.

Each test starts ``plyshear sweep`` (the installed console script) in its own
session and signals it as a user or the system would: SIGINT (Ctrl-C), SIGTERM,
SIGKILL of the main process or of one worker. The sweep is sized to take a few
seconds on two cores (602 cases in chunks of 50). Expected counts follow
from the ranges' arithmetic, not from a run: ``10:40:0.1`` has
(40 − 10)/0.1 + 1 = 301 values, times two diameters.

Linux only (it reads /proc to find the processes of a session).
"""

from __future__ import annotations

import csv
import os
import signal
import sys
import time
from pathlib import Path

import pytest

from plyshear.sweep import pool as sp
from tests.conftest import FORK
from tests.sweep import faulty
from tests.sweep.procs import PATIENCE, run, start, wait_gone, wait_lines, workers

pytestmark = pytest.mark.skipif(
    not sys.platform.startswith("linux"), reason="reads /proc to find a session's processes"
)

VALUES = 301 * 2  # from the arithmetic of the ranges below
CHUNK_ROWS = 50  # rows of one finished chunk
SWEEP = [
    "--vary",
    "ply[2].thickness=10:40:0.1",
    "--vary",
    "bolt.diameter=20,24",
    "--workers",
    "2",
    "--quiet",
    "--chunk",
    str(CHUNK_ROWS),
]
#: A stop waits up to the pool's grace period for running chunks, then ends them;
#: a second more covers the interpreter's exit on a loaded machine.
PROMPT_S = sp.GRACE + 2.0
#: After the main process dies, its workers notice within their watch's latency.
ORPHAN_S = 5.0


def _rows(path: Path) -> list[dict[str, str]]:
    with path.open(encoding="utf-8", newline="") as fh:
        return list(csv.DictReader(fh))


def _sweep(tmp_path: Path, out: Path) -> list[str]:
    model = tmp_path / "fork.toml"
    model.write_text(FORK, encoding="utf-8")
    return ["sweep", str(model), *SWEEP, "-o", str(out)]


def test_interrupt_keeps_rows_exits_130_and_resume_completes(tmp_path: Path) -> None:
    out = tmp_path / "out.csv"
    partial = tmp_path / "out.csv.partial"
    args = _sweep(tmp_path, out)
    proc = start(args, tmp_path)
    wait_lines(partial, 1 + CHUNK_ROWS, proc)  # the header and one chunk
    t0 = time.monotonic()
    proc.send_signal(signal.SIGINT)
    _, err = proc.communicate(timeout=PATIENCE)
    assert time.monotonic() - t0 < PROMPT_S
    assert proc.returncode == 130, err  # 128 + SIGINT, the shells' rule
    kept = _rows(partial)
    assert CHUNK_ROWS <= len(kept) < VALUES
    assert all(r["max_shear"] and r["case_key"] for r in kept)  # every row whole
    assert f"interrupted: {len(kept)} of {VALUES} cases done" in err
    assert "--resume" in err
    assert out.exists()
    assert out.stat().st_size == 0

    done = run([*args, "--resume"], tmp_path)
    assert done.returncode == 0, done.stderr
    rows = _rows(out)
    assert [int(r["case"]) for r in rows] == list(range(1, VALUES + 1))  # each exactly once
    assert len({r["case_key"] for r in rows}) == VALUES
    assert not partial.exists()
    assert f"({len(kept)} from the earlier run)" in done.stderr

    before = (out.read_bytes(), out.stat().st_mtime_ns)
    again = run([*args, "--resume"], tmp_path)  # a finished sweep resumed: a no-op
    assert again.returncode == 0, again.stderr
    assert (out.read_bytes(), out.stat().st_mtime_ns) == before


@pytest.mark.parametrize("sig", [signal.SIGTERM, signal.SIGKILL])
def test_no_process_outlives_a_terminated_or_killed_sweep(tmp_path: Path, sig: int) -> None:
    out = tmp_path / "out.csv"
    proc = start(_sweep(tmp_path, out), tmp_path)
    wait_lines(tmp_path / "out.csv.partial", 1 + CHUNK_ROWS, proc)
    assert workers(proc.pid)  # the pool is running
    t0 = time.monotonic()
    proc.send_signal(sig)
    _, err = proc.communicate(timeout=PATIENCE)
    if sig == signal.SIGTERM:
        assert proc.returncode == 143, err  # 128 + SIGTERM
        assert time.monotonic() - t0 < PROMPT_S
        assert "terminated:" in err
    else:
        assert proc.returncode == -signal.SIGKILL
    assert wait_gone(proc.pid, ORPHAN_S) == []  # no fork server, no worker left


def test_a_killed_workers_chunk_is_run_again(tmp_path: Path) -> None:
    out = tmp_path / "out.csv"
    proc = start(_sweep(tmp_path, out), tmp_path)
    wait_lines(tmp_path / "out.csv.partial", 2, proc)  # the header and a first row
    victims = workers(proc.pid)
    assert len(victims) == 2
    os.kill(victims[0], signal.SIGKILL)
    _, err = proc.communicate(timeout=PATIENCE * 2)
    assert proc.returncode == 0, err
    rows = _rows(out)
    assert [int(r["case"]) for r in rows] == list(range(1, VALUES + 1))
    assert not any(r["error"] for r in rows)  # the lost chunk ran again, whole
    assert "1 worker process(es) died" in err


def test_a_chunk_whose_worker_dies_twice_is_error_rows_and_the_rest_goes_on() -> None:
    results: dict[int, str] = {}
    errors: dict[int, str] = {}
    jobs = ["a", "die", "b", "raise", "c"]
    with sp.Stopper() as stop:
        report = sp.run_jobs(
            faulty.job, jobs, 2, results.__setitem__, stop, on_error=errors.__setitem__
        )
    assert results == {0: "A", 2: "B", 4: "C"}
    assert report.deaths == sp.ATTEMPTS  # the first run and one retry on a fresh worker
    assert "killed by SIGKILL" in errors[1]
    assert "twice" in errors[1]
    assert errors[3] == "ValueError: a bug in one job"


def test_two_sweeps_on_one_new_path_exactly_one_wins(tmp_path: Path) -> None:
    model = tmp_path / "fork.toml"
    model.write_text(FORK, encoding="utf-8")
    out = tmp_path / "same.csv"
    args = ["sweep", str(model), "--vary", "bolt.diameter=20,24", "--workers", "1", "-o", str(out)]
    procs = [start(args, tmp_path) for _ in range(2)]
    ends = [p.communicate(timeout=PATIENCE) for p in procs]
    codes = sorted(p.returncode for p in procs)
    assert codes == [0, 2], ends
    loser = ends[[p.returncode for p in procs].index(2)][1]
    assert loser.strip().count("\n") == 0
    assert "exists" in loser
    assert [r["bolt.diameter"] for r in _rows(out)] == ["20", "24"]


def test_a_worker_killed_between_chunks_is_replaced_and_counted() -> None:
    """The next chunk sent to a worker that died idle goes to a fresh one, not a traceback."""
    results: dict[int, object] = {}

    def kill_the_answerer(index: int, value: object) -> None:
        results[index] = value
        if isinstance(value, int):  # the "pid" job: its worker is idle now; kill it
            os.kill(value, signal.SIGKILL)
            time.sleep(0.3)  # dead before the pool sends it the next chunk

    with sp.Stopper() as stop:
        report = sp.run_jobs(faulty.job, ["pid", "a", "b"], 1, kill_the_answerer, stop)
    assert (results[1], results[2]) == ("A", "B")
    assert report.deaths == 1  # an idle death is still a death the user is told of
    assert not report.lost
