"""Jobs for the worker-pool tests (importable by the pool's worker processes)."""

from __future__ import annotations

import os
import signal


def job(name: str) -> str | int:
    """Return the name in capitals; a job named "die" kills its own worker (SIGKILL).

    A job named "pid" returns its worker's process id (for a test to kill it idle).
    """
    if name == "pid":
        return os.getpid()
    if name == "die":
        os.kill(os.getpid(), signal.SIGKILL)
    if name == "raise":
        raise ValueError("a bug in one job")
    return name.upper()
