"""The errors plyshear raises, in one place.

Every one of them ends a command with one line (``cli.fail``), never a
traceback: the message names the file and the key where there is one.
"""

from __future__ import annotations


class ModelError(ValueError):
    """A model that cannot be used, with where and why.

    Attributes:
        path: The model file (or ``"<model>"``).
        key: The key path, e.g. ``ply[2].thickness`` (may be empty).
        message: What is wrong and what is expected.
    """

    def __init__(self, path: str, key: str, message: str) -> None:
        self.path = path
        self.key = key
        self.message = message
        super().__init__(str(self))

    def __str__(self) -> str:
        where = f"{self.path}: {self.key}: " if self.key else f"{self.path}: "
        return where + self.message


class ResourceError(ModelError):
    """A model too large to solve here (the system would not fit in memory).

    No key of the file is wrong, so none is named. It is a :class:`ModelError`
    so that whatever reports bad input (exit 2, the sweep's error column) reports it.
    """

    def __init__(self, path: str, message: str) -> None:
        super().__init__(path, "", message)


class SolveError(RuntimeError):
    """The system could not be solved (singular or not positive definite)."""


class CapacityError(RuntimeError):
    """A capacity analysis did not converge, or its loads cannot be scaled."""


__all__ = ["CapacityError", "ModelError", "ResourceError", "SolveError"]
