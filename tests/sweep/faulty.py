"""Jobs for the worker-pool tests (importable by the pool's worker processes)."""

from __future__ import annotations

import os
import signal


def job(name: str) -> str:
    """Return the name in capitals; a job named "die" kills its own worker (SIGKILL)."""
    if name == "die":
        os.kill(os.getpid(), signal.SIGKILL)
    if name == "raise":
        raise ValueError("a bug in one job")
    return name.upper()
