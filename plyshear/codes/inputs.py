"""Input checks shared by the clause modules: out-of-range input raises ValueError naming it."""

from __future__ import annotations

import math


def positive(**values: float) -> None:
    """Require every value to be finite and > 0."""
    for name, value in values.items():
        if not (math.isfinite(value) and value > 0.0):
            raise ValueError(f"{name} must be a finite number > 0, got {value!r}")


def non_negative(**values: float) -> None:
    """Require every value to be finite and >= 0."""
    for name, value in values.items():
        if not (math.isfinite(value) and value >= 0.0):
            raise ValueError(f"{name} must be a finite number >= 0, got {value!r}")


def within(name: str, value: float, low: float, high: float) -> None:
    """Require ``low < value <= high``."""
    if not (low < value <= high):
        raise ValueError(f"{name} must be in ({low:g}, {high:g}], got {value!r}")


def count(name: str, value: int, minimum: int) -> None:
    """Require an integer ``>= minimum``."""
    if int(value) != value or value < minimum:
        raise ValueError(f"{name} must be an integer >= {minimum}, got {value!r}")
