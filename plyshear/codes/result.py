"""The result types of a design check: :class:`CheckItem` and :class:`CheckResult`.

A check item names its place by typed fields (``bolt``, ``plane``, ``ply``);
``where`` is built from them for display only, so a program keys on the fields
and never parses the text.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

import numpy as np

from plyshear import units as _units
from plyshear.codes.clause import Clause

#: The verdict of a check whose solve is not trusted.
UNVERIFIED = "NOT VERIFIED: the solve is ill-conditioned"
#: The places an item can sit: a shear plane, a ply, or the bolt as a whole.
PARTS = ("plane", "ply", "bolt")


@dataclass(frozen=True)
class CheckItem:
    """One limit state at one place.

    Attributes:
        what: The limit state, e.g. ``"bolt shear"``, ``"bearing"``.
        demand: Required strength (N, N·mm) or, for an interaction, its value.
        capacity: Design / allowable strength in the same unit, or 1.0.
        dimension: ``"force"``, ``"moment"``, ``"length"`` or ``"ratio"`` (for unit
            conversion).
        clauses: Citation records of the clauses used.
        part: ``"plane"``, ``"ply"`` or ``"bolt"``: what the item is about.
        plane: The plane's index (from 1, as ``PlaneShear.index``), or None.
        ply: The ply's index in ``joint.plies`` (from 0), or None.
        ply_name: The ply's name, for display.
        bolt: The bolt's index in the row (from 0).
        row: The number of bolts in the row (``where`` names the bolt when > 1).
        informative: True when the item lies outside the standard's text.
        note: A short remark shown beside the item.
        z: Position along the bolt, mm, for items on the bolt's diagram.
        detail: Which rule of the ply, shown after its name (``"width"``), or "".
    """

    what: str
    demand: float
    capacity: float
    dimension: str
    clauses: tuple[Clause, ...]
    part: str = "bolt"
    plane: int | None = None
    ply: int | None = None
    ply_name: str = ""
    bolt: int = 0
    row: int = 1
    informative: bool = False
    note: str = ""
    z: float | None = None
    detail: str = ""

    @property
    def where(self) -> str:
        """The place as shown: ``"plane 2"``, ``"ply outer"``, ``"bolt 3, plane 1"``."""
        if self.part == "ply":
            body = f"ply {self.ply_name}" + (f", {self.detail}" if self.detail else "")
        elif self.part == "plane":
            body = f"plane {self.plane}"
        else:
            bolt = f"bolt {self.bolt + 1}" if self.row > 1 else "bolt"
            return bolt if self.plane is None else f"{bolt}, plane {self.plane}"
        return f"bolt {self.bolt + 1}: {body}" if self.row > 1 else body

    def place(self, units: str) -> str:
        """Return ``where``, with the position along the bolt in ``units``."""
        if self.z is None:
            return self.where
        return f"{self.where} at z = {_units.length_str(units, self.z)}"

    @property
    def utilization(self) -> float:
        """Demand over capacity (inf if the capacity is zero)."""
        if self.capacity <= 0.0:
            return float("inf") if self.demand > 0 else 0.0
        return self.demand / self.capacity

    @property
    def clause(self) -> str:
        """The clause references, without the standard's name."""
        return "; ".join(dict.fromkeys(c.ref for c in self.clauses))

    def place_dict(self) -> dict[str, Any]:
        """The item's place as the contract's typed keys: bolt and plane from 1, ply by name."""
        return {
            "bolt": self.bolt + 1,
            "plane": self.plane,
            "ply": self.ply_name if self.ply is not None else None,
        }


@dataclass(frozen=True)
class CheckResult:
    """All checks of one joint to one standard.

    Attributes:
        standard: ``"aisc360-22"`` or ``"en1993-1-8"``.
        method: ``"lrfd"``, ``"asd"`` or ``"partial-factors"`` (EN).
        edition: The standard with its edition, as printed.
        items: Every check item.
        notes: Assumptions and omissions the engineer must know.
        units: Unit system of the output.
        loads: The level of the demands: "factored" or "service".
        warnings: What the engineer must read beside the verdict: informative
            items above 1.0, utilizations too large to be real.
        unverified: Why the demands cannot be trusted (an ill-conditioned solve),
            or "": a check that is not verified does not pass.
    """

    standard: str
    method: str
    edition: str
    items: tuple[CheckItem, ...]
    notes: tuple[str, ...] = field(default_factory=tuple)
    units: str = "N-mm"
    loads: str = "factored"
    warnings: tuple[str, ...] = field(default_factory=tuple)
    unverified: str = ""

    @property
    def governing(self) -> CheckItem | None:
        """The normative item with the largest utilization."""
        normative = [i for i in self.items if not i.informative]
        return max(normative, key=lambda i: i.utilization) if normative else None

    @property
    def passes(self) -> bool:
        """True when the solve is trusted and every normative item has utilization ≤ 1."""
        normative = (i for i in self.items if not i.informative)
        return not self.unverified and all(i.utilization <= 1.0 for i in normative)

    def sorted_items(self) -> list[CheckItem]:
        """Items by utilization, largest first."""
        return sorted(self.items, key=lambda i: -i.utilization)

    def plane_utilization(self) -> dict[tuple[int, int], float]:
        """The bolt-shear utilization of every plane of every bolt, by (bolt, plane)."""
        return {
            (i.bolt, i.plane): i.utilization
            for i in self.items
            if i.part == "plane" and i.plane is not None and i.what in ("bolt shear", "pin shear")
        }

    def to_dict(self) -> dict[str, Any]:
        """Return the contract's ``check`` section, in the joint's units."""
        u = _units.system(self.units)

        def conv(value: float, dim: str) -> float:
            return value if dim == "ratio" else value / u.factor(dim)

        gov = self.governing
        return {
            "standard": self.standard,
            "method": self.method,
            "edition": self.edition,
            "items": [
                {
                    "what": i.what,
                    "where": i.place(self.units),
                    **i.place_dict(),
                    "demand": conv(i.demand, i.dimension),
                    "capacity": conv(i.capacity, i.dimension),
                    "utilization": _finite(i.utilization),
                    "clause": i.clause,
                    "unit": "" if i.dimension == "ratio" else u.label(i.dimension),
                    "informative": i.informative,
                    "note": i.note,
                }
                for i in self.sorted_items()
            ],
            "governing": None
            if gov is None
            else {
                "what": gov.what,
                "where": gov.place(self.units),
                **gov.place_dict(),
                "utilization": _finite(gov.utilization),
                "clause": gov.clause,
            },
            "passes": self.passes,
            "verified": not self.unverified,
            **({"verdict": UNVERIFIED, "unverified": self.unverified} if self.unverified else {}),
            "notes": list(self.notes),
            "loads": self.loads,
            "warnings": list(self.warnings),
        }


def _finite(value: float) -> float | None:
    return value if np.isfinite(value) else None
