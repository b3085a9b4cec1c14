"""Numbers as the tables print them."""

from __future__ import annotations


def fmt(value: float, digits: int = 4) -> str:
    """Format a number with ``digits`` significant figures, without ``-0``."""
    if value == 0 or abs(value) < 1e-12:
        return "0"
    if 10**digits <= abs(value) < 1e10:
        return f"{value:.0f}"
    return f"{value:.{digits}g}"
