"""Numbers as the tables print them."""

from __future__ import annotations

from typing import TYPE_CHECKING, Protocol

if TYPE_CHECKING:
    from plyshear.codes.result import CheckItem


class Units(Protocol):
    """What the tables need of a unit system: a factor and a label per dimension."""

    def factor(self, dimension: str) -> float: ...  # noqa: D102

    def label(self, dimension: str) -> str: ...  # noqa: D102


def fmt(value: float, digits: int = 4) -> str:
    """Format a number with ``digits`` significant figures, without ``-0``."""
    if value == 0 or abs(value) < 1e-12:
        return "0"
    if 10**digits <= abs(value) < 1e10:
        return f"{value:.0f}"
    return f"{value:.{digits}g}"


def item_values(item: CheckItem, u: Units) -> tuple[str, str, str]:
    """A check item's demand, capacity and unit as the tables print them."""
    if item.dimension == "ratio":
        return fmt(item.demand, 3), fmt(item.capacity, 3), ""
    k = u.factor(item.dimension)
    return fmt(item.demand / k), fmt(item.capacity / k), u.label(item.dimension)


def item_flag(item: CheckItem, governing: bool) -> str:
    """The terminal's mark of a check item: governing, informative, failing."""
    flag = "<< governing" if governing else ("(info)" if item.informative else "")
    if item.utilization > 1.0 and not item.informative:
        flag = ("FAILS " + flag).strip()
    return flag


def item_row(item: CheckItem, units: str, u: Units, governing: bool) -> list[str]:
    """A check item's cells in the terminal table: what, where, demand ... clause, mark."""
    demand, capacity, unit = item_values(item, u)
    util = item.utilization
    return [
        item.what,
        item.place(units),
        demand,
        capacity,
        unit,
        f"{util:.3f}" if util != float("inf") else "inf",
        item.clause,
        item_flag(item, governing),
    ]
