"""Helpers for tests that run the command line as real processes and signal them."""

from __future__ import annotations

import os
import shutil
import subprocess
import sys
import time
from pathlib import Path

#: Longest a test waits for a process to reach a state, s (a loaded 2-core machine).
PATIENCE = 60.0


def command() -> list[str]:
    """The installed console script beside this interpreter (or ``python -m``)."""
    script = Path(sys.executable).with_name("plyshear")
    if script.exists():
        return [str(script)]
    found = shutil.which("plyshear")
    return [found] if found else [sys.executable, "-m", "plyshear.cli"]


def start(args: list[str], cwd: Path) -> subprocess.Popen[str]:
    """Start ``plyshear ARGS`` in its own session (so its whole tree can be found)."""
    env = {**os.environ, "PYTHONUNBUFFERED": "1"}
    return subprocess.Popen(
        [*command(), *args],
        cwd=cwd,
        env=env,
        text=True,
        stdout=subprocess.PIPE,
        stderr=subprocess.PIPE,
        start_new_session=True,
    )


def run(args: list[str], cwd: Path) -> subprocess.CompletedProcess[str]:
    """Run ``plyshear ARGS`` to its end."""
    return subprocess.run(
        [*command(), *args],
        cwd=cwd,
        text=True,
        capture_output=True,
        timeout=PATIENCE * 3,
        check=False,
    )


def data_lines(path: Path) -> int:
    """Complete lines in a file (0 if it does not exist yet)."""
    try:
        return path.read_bytes().count(b"\n")
    except FileNotFoundError:
        return 0


def wait_lines(path: Path, count: int, proc: subprocess.Popen[str]) -> None:
    """Wait until ``path`` holds ``count`` complete lines (the process still running)."""
    deadline = time.monotonic() + PATIENCE
    while data_lines(path) < count:
        assert proc.poll() is None, f"ended early: {proc.returncode} {proc.communicate()}"
        assert time.monotonic() < deadline, f"{path} never reached {count} lines"
        time.sleep(0.05)


def session(sid: int) -> list[tuple[int, int, str]]:
    """Live processes of a session: (pid, parent pid, command line), zombies left out."""
    out = []
    for entry in Path("/proc").iterdir():
        if not entry.name.isdigit():
            continue
        try:
            stat = (entry / "stat").read_text()
            cmdline = (entry / "cmdline").read_bytes().replace(b"\0", b" ").decode()
        except OSError:
            continue
        fields = stat[stat.rindex(")") + 2 :].split()
        state, ppid, _, session_id = fields[0], int(fields[1]), fields[2], int(fields[3])
        if session_id == sid and state != "Z":
            out.append((int(entry.name), ppid, cmdline))
    return out


def wait_gone(sid: int, within: float) -> list[tuple[int, int, str]]:
    """Wait up to ``within`` seconds for a session to have no live process; return the rest."""
    deadline = time.monotonic() + within
    left = session(sid)
    while left and time.monotonic() < deadline:
        time.sleep(0.1)
        left = session(sid)
    return left


def workers(main_pid: int) -> list[int]:
    """The sweep's worker processes: the children of its fork server."""
    procs = session(main_pid)
    servers = {pid for pid, ppid, cmd in procs if ppid == main_pid and "forkserver" in cmd}
    return [pid for pid, ppid, _ in procs if ppid in servers]
