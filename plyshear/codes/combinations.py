"""The design check of every load combination, and its governing lines.

Each combination is checked exactly as a single-load joint is
(:func:`plyshear.codes.check.check` on :meth:`Joint.for_combination`); the
combination is added at the result level, never inside the item builders. Per
item (limit state and place) the governing line is the combination with the
largest utilization; the verdict is over all combinations.
"""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass
from typing import Any

import plyshear
from plyshear.codes.check import CheckItem, CheckResult
from plyshear.mechanics.combine import Combined

#: Utilizations within this relative difference are a tie (round-off of equal demands):
#: the first combination in the model's order keeps the line.
TIE = 1e-9


@dataclass(frozen=True)
class GoverningLine:
    """One item at the combination that governs it.

    Attributes:
        combination: The combination's name.
        item: The item of that combination's check.
    """

    combination: str
    item: CheckItem


@dataclass(frozen=True)
class CombinedCheck:
    """The checks of every combination.

    Attributes:
        results: Combination name → its check, in the model's order.
    """

    results: dict[str, CheckResult]

    @property
    def governing_combination(self) -> str:
        """The combination whose governing item has the largest utilization.

        A combination that is not verified (ill-conditioned) comes first.
        """

        def rank(name: str) -> tuple[bool, float]:
            res = self.results[name]
            gov = res.governing
            return (bool(res.unverified), gov.utilization if gov is not None else 0.0)

        return max(self.results, key=rank)

    @property
    def passes(self) -> bool:
        """True when every combination passes."""
        return all(r.passes for r in self.results.values())

    def lines(self) -> list[GoverningLine]:
        """The governing line of every item, largest utilization first.

        Items are matched by limit state and place (``what``, ``where``); ties go
        to the first combination in the model's order (within :data:`TIE`).
        """
        best: dict[tuple[str, str], GoverningLine] = {}
        for name, res in self.results.items():
            for item in res.items:
                key = (item.what, item.where)
                held = best.get(key)
                if held is None or item.utilization > held.item.utilization * (1 + TIE):
                    best[key] = GoverningLine(combination=name, item=item)
        return sorted(best.values(), key=lambda line: -line.item.utilization)

    def summary(self) -> CheckResult:
        """A result whose items are the governing lines; its verdict is over all combinations.

        Settings, notes and warnings are those of the governing combination's
        check, with the notes and warnings of the others added.
        """
        gov = self.results[self.governing_combination]
        unverified = next((r.unverified for r in self.results.values() if r.unverified), "")
        warnings = dict.fromkeys(w for r in self.results.values() for w in r.warnings)
        notes = dict.fromkeys(n for r in self.results.values() for n in r.notes)
        return dataclasses.replace(
            gov,
            items=tuple(line.item for line in self.lines()),
            unverified=unverified,
            warnings=tuple(warnings),
            notes=tuple(notes),
        )

    def to_dict(self) -> dict[str, Any]:
        """The ``check`` section: governing lines, each with its ``combination``."""
        lines = self.lines()
        summary = self.summary()
        data = summary.to_dict()
        for entry, line in zip(data["items"], lines, strict=True):
            entry["combination"] = line.combination
        if data.get("governing") is not None:
            data["governing"]["combination"] = self.governing_combination
        data["combination"] = self.governing_combination
        data["passes"] = self.passes and not summary.unverified
        return data


def check_combinations(
    combined: Combined,
    standard: str | None = None,
    method: str | None = None,
    only: str | None = None,
) -> CombinedCheck:
    """Check every combination of a solved joint (or only one).

    Args:
        combined: The cases and combinations, solved.
        standard: The standard (default: the model's).
        method: The AISC method (default: the model's).
        only: Check this combination alone.

    Returns:
        The :class:`CombinedCheck`.

    Raises:
        ValueError: As :func:`plyshear.codes.check.check` (a level the method does
            not take), or for an unknown combination.
        KeyError: For an unknown combination name.
    """
    names = [only] if only is not None else list(combined.combinations)
    results = {}
    for name in names:
        sol = combined.combinations[name]
        # the public API: its signature is stable across the codes/ restructuring
        results[name] = plyshear.check(sol.joint, sol, standard, method)
    return CombinedCheck(results=results)
