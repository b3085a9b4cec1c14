"""Sweep outputs checked before the long work, written row by row, kept on a full disk.

* The output is reserved exclusively before the first case: a missing or
  read-only folder is one error line before any case runs.
* Two runs that open the same new output at once: exactly one wins (O_EXCL).
* A full disk during the run: one error line, the rows written before intact.
* A stale temporary file of a killed figure write is removed on the next write
  (and one that a live writer holds is left alone).
* Case keys depend on the values only (not on the case's number or key order).
"""

from __future__ import annotations

import csv
import errno
import fcntl
import os
import threading
import time
from pathlib import Path

import pytest
from click.testing import CliRunner

from plyshear.cli import main
from plyshear.sweep import stream as ss
from tests.conftest import FORK

#: The issue's "in the first second" (an error before the long work), with room for a
#: shared 2-core machine running the suite in parallel with others.
BEFORE_WORK_S = 2.0
ROUNDS = 15  # the review saw 2 double successes in 15 rounds


def _no_run(monkeypatch) -> None:
    from plyshear.sweep import run as sr

    def refuse(*a, **kw):
        raise AssertionError("a case ran before the output was checked")

    monkeypatch.setattr(sr, "run_stream", refuse)


def test_a_missing_folder_is_one_line_before_any_case(write_model, tmp_path, monkeypatch):
    _no_run(monkeypatch)
    path = write_model(FORK)
    t0 = time.monotonic()
    r = CliRunner().invoke(
        main,
        [
            "sweep",
            str(path),
            "--vary",
            "bolt.diameter=20,24",
            "-o",
            str(tmp_path / "nowhere" / "out.csv"),
        ],
    )
    assert time.monotonic() - t0 < BEFORE_WORK_S
    assert r.exit_code == 2
    lines = r.stderr.strip().splitlines()
    assert len(lines) == 1
    assert "folder" in lines[0]
    assert "does not exist" in lines[0]


def test_a_folder_that_cannot_be_written_is_one_line_before_any_case(
    write_model, monkeypatch
) -> None:
    folder = Path("/sys")  # read-only even for root on Linux
    if not folder.is_dir() or os.access(folder, os.W_OK) and os.geteuid() != 0:
        pytest.skip("needs a folder this process cannot write")
    _no_run(monkeypatch)
    path = write_model(FORK)
    r = CliRunner().invoke(
        main,
        [
            "sweep",
            str(path),
            "--vary",
            "bolt.diameter=20,24",
            "-o",
            str(folder / "plyshear-out.csv"),
        ],
    )
    assert r.exit_code == 2
    lines = r.stderr.strip().splitlines()
    assert len(lines) == 1
    assert "cannot create the file" in lines[0]


def test_two_runs_opening_one_new_output_exactly_one_wins(tmp_path: Path) -> None:
    for k in range(ROUNDS):
        path = tmp_path / f"out{k}.csv"
        barrier = threading.Barrier(2)
        won: list[ss.Stream] = []
        lost: list[str] = []

        def attempt(
            path: Path = path,
            barrier: threading.Barrier = barrier,
            won: list = won,
            lost: list = lost,
        ) -> None:
            s = ss.Stream(path, ["case", "case_key"])
            barrier.wait()
            try:
                s.open()
                won.append(s)
            except ss.OutputError as exc:
                lost.append(str(exc))

        threads = [threading.Thread(target=attempt) for _ in range(2)]
        for t in threads:
            t.start()
        for t in threads:
            t.join()
        assert len(won) == 1, lost
        assert len(lost) == 1
        assert "exists" in lost[0]
        won[0].close()


def test_a_full_disk_is_one_line_and_keeps_the_rows_written(
    write_model, tmp_path, monkeypatch
) -> None:
    path = write_model(FORK)
    out = tmp_path / "out.csv"
    real = os.write
    calls = {"n": 0}

    def write(fd: int, data) -> int:
        calls["n"] += 1
        if calls["n"] == 3:  # the header, the first chunk, then the disk is full
            real(fd, bytes(data)[:100])  # a write cut short: must not leave half a row
            raise OSError(errno.ENOSPC, os.strerror(errno.ENOSPC))
        return real(fd, data)

    monkeypatch.setattr(ss.os, "write", write)
    r = CliRunner().invoke(
        main,
        [
            "sweep",
            str(path),
            "--vary",
            "ply[2].thickness=10:40:0.1",
            "--capacity",
            "none",
            "--workers",
            "1",
            "--chunk",
            "100",
            "--quiet",
            "-o",
            str(out),
        ],
    )
    assert r.exit_code == 3  # the run could not finish
    lines = r.stderr.strip().splitlines()
    assert len(lines) == 2  # the error, then the resume command on its own line
    assert lines[1].startswith("resume with: ")
    assert "the disk is full" in lines[0]
    assert "100 rows written so far are kept" in lines[0]
    with (tmp_path / "out.csv.partial").open(encoding="utf-8", newline="") as fh:
        rows = list(csv.DictReader(fh))
    assert [int(x["case"]) for x in rows] == list(range(1, 101))  # the first chunk, whole
    assert all(x["max_shear"] for x in rows)


def test_a_stale_temporary_file_is_removed_and_a_live_one_kept(write_model, tmp_path) -> None:
    path = write_model(FORK)
    fig = tmp_path / "fig.svg"
    stale = tmp_path / ".fig.svg.abc123.part"
    stale.write_bytes(b"left by a killed write")
    live = tmp_path / ".fig.svg.def456.part"
    live.write_bytes(b"being written")
    fd = os.open(live, os.O_RDONLY)
    fcntl.flock(fd, fcntl.LOCK_EX)  # as a running write holds it
    try:
        r = CliRunner().invoke(main, ["solve", str(path), "--plot", str(fig)])
        assert r.exit_code == 0, r.output
    finally:
        os.close(fd)
    assert fig.read_bytes().startswith(b"<?xml")
    assert not stale.exists()
    assert live.exists()


def test_case_keys_depend_on_the_values_only() -> None:
    a = ss.case_key(["bolt.diameter", "ply[2].thickness"], [20, 12.5])
    assert a == ss.case_key(["ply[2].thickness", "bolt.diameter"], [12.5, 20])  # any order
    assert a == ss.case_key(["bolt.diameter", "ply[2].thickness"], [20.0, 12.5])  # 20 = 20.0
    assert a != ss.case_key(["bolt.diameter", "ply[2].thickness"], [24, 12.5])
    assert len(a) == 16
    assert int(a, 16) >= 0  # hexadecimal


def test_a_cluster_without_workers_ends_in_one_line(write_model, tmp_path) -> None:
    distributed = pytest.importorskip("distributed")
    path = write_model(FORK)
    out = tmp_path / "out.csv"
    with distributed.LocalCluster(n_workers=0, processes=False, dashboard_address=None) as c:
        t0 = time.monotonic()
        r = CliRunner().invoke(
            main,
            [
                "sweep",
                str(path),
                "--vary",
                "bolt.diameter=20,24",
                "--scheduler",
                c.scheduler_address,
                "--worker-timeout",
                "1",
                "--quiet",
                "-o",
                str(out),
            ],
        )
        assert time.monotonic() - t0 < 15.0  # the timeout, the client's start and close
    assert r.exit_code == 3, r.output  # could not finish
    lines = r.stderr.strip().splitlines()
    assert len(lines) == 2  # the error, then the resume command on its own line
    assert lines[1].startswith("resume with: ")
    assert "no Dask worker for 1 s" in lines[0]
    assert "0 of 2 cases done" in lines[0]
    assert (tmp_path / "out.csv.partial").exists()  # kept for --resume
