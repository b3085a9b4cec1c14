"""One machine-readable citation record per clause function.

Every function in ``codes/`` is decorated with :func:`clause`, which attaches a
:class:`Clause` record (standard and clause or equation). The same record feeds
the docstring, the check table's clause column and the report, so citations
cannot drift between them.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass
from typing import Any, TypeVar

F = TypeVar("F", bound=Callable[..., Any])


@dataclass(frozen=True)
class Clause:
    """Where a rule is printed: a standard and a clause, table or equation.

    Attributes:
        standard: The standard with its edition, e.g. ``"AISC 360-22"``.
        ref: The clause, table or equation, e.g. ``"J3.6"`` or ``"Table 3.4"``.
    """

    standard: str
    ref: str

    def __str__(self) -> str:
        return f"{self.standard} {self.ref}"


_REGISTRY: list[tuple[Clause, Callable[..., Any]]] = []


def clause(standard: str, ref: str) -> Callable[[F], F]:
    """Attach a citation record to a clause function.

    Args:
        standard: The standard and edition.
        ref: The clause, table or equation inside it.

    Returns:
        A decorator that stores the record as ``func.clause`` and prefixes the
        docstring with the citation.
    """
    record = Clause(standard, ref)

    def decorate(func: F) -> F:
        func.clause = record  # type: ignore[attr-defined]
        func.__doc__ = f"[{record}] {func.__doc__ or ''}"
        _REGISTRY.append((record, func))
        return func

    return decorate


def cited(func: Callable[..., Any]) -> Clause:
    """Return the citation record of a decorated clause function.

    Args:
        func: A function decorated with :func:`clause`.

    Returns:
        Its :class:`Clause`.
    """
    record = getattr(func, "clause", None)
    if not isinstance(record, Clause):
        raise TypeError(f"{func.__name__} has no clause record")
    return record


def registry() -> list[tuple[Clause, Callable[..., Any]]]:
    """Return every registered (clause, function) pair, in definition order."""
    return list(_REGISTRY)
