"""Unit systems of the model file and of the results.

Internally plyshear works in N, mm and MPa. A model file names one of the
systems below; every bare number in it is read in that system and every result
is written in it. A value may instead be a string with its own unit
(``"0.5 in"``, ``"250 kN"``), parsed by pint. pint is imported only when such a
string is met, so the mechanics and ``plyshear --help`` never load it.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from functools import cache
from typing import Any

#: Dimensions a model-file value can have, as (force exponent, length exponent).
DIMENSIONS: dict[str, tuple[int, int]] = {
    "force": (1, 0),
    "length": (0, 1),
    "stress": (1, -2),
    "moment": (1, 1),
    "stiffness": (1, -1),  # force per length (a link or spring)
    "area": (0, 2),
}

#: pint spelling of the internal units of each dimension.
_INTERNAL_PINT = {
    "force": "newton",
    "length": "millimeter",
    "stress": "megapascal",
    "moment": "newton * millimeter",
    "stiffness": "newton / millimeter",
    "area": "millimeter ** 2",
}

N_PER_KIP = 4448.2216152605  # exact: 1000 lbf, 1 lbf = 4.4482216152605 N
MM_PER_IN = 25.4  # exact


@dataclass(frozen=True)
class UnitSystem:
    """A named unit system: how one of its numbers converts to N and mm.

    Attributes:
        name: The model-file name, e.g. ``"kN-mm"``.
        force: Newtons in one unit of force.
        length: Millimetres in one unit of length.
        force_label: Printed name of the force unit.
        length_label: Printed name of the length unit.
        stress_label: Printed name of the stress unit.
        stress_factor: MPa in one unit of stress (stresses in metric systems
            are always MPa, never kN/mm²).
    """

    name: str
    force: float
    length: float
    force_label: str
    length_label: str
    stress_label: str
    stress_factor: float

    def factor(self, dimension: str) -> float:
        """Return the internal value (N, mm, MPa) of one unit of ``dimension``.

        Args:
            dimension: One of :data:`DIMENSIONS`.

        Returns:
            The multiplier from this system's unit to the internal unit.
        """
        if dimension == "stress":
            return self.stress_factor
        fe, le = DIMENSIONS[dimension]
        return self.force**fe * self.length**le

    def to_internal(self, value: float, dimension: str) -> float:
        """Convert a number in this system to N/mm/MPa."""
        return value * self.factor(dimension)

    def from_internal(self, value: Any, dimension: str) -> Any:
        """Convert an internal number (or numpy array) to this system."""
        return value / self.factor(dimension)

    def labels(self) -> dict[str, str]:
        """Return the unit labels used in the JSON result and the tables."""
        return {
            "force": self.force_label,
            "length": self.length_label,
            "moment": f"{self.force_label}*{self.length_label}",
            "stress": self.stress_label,
        }

    def label(self, dimension: str) -> str:
        """Return the printed unit of ``dimension`` (e.g. ``"kN*mm"``)."""
        if dimension == "stiffness":
            return f"{self.force_label}/{self.length_label}"
        if dimension == "area":
            return f"{self.length_label}^2"
        return self.labels()[dimension]


SYSTEMS: dict[str, UnitSystem] = {
    "N-mm": UnitSystem("N-mm", 1.0, 1.0, "N", "mm", "MPa", 1.0),
    "kN-mm": UnitSystem("kN-mm", 1000.0, 1.0, "kN", "mm", "MPa", 1.0),
    "kip-in": UnitSystem(
        "kip-in", N_PER_KIP, MM_PER_IN, "kip", "in", "ksi", N_PER_KIP / MM_PER_IN**2
    ),
}


def system(name: str) -> UnitSystem:
    """Return the unit system called ``name``.

    Raises:
        KeyError: For an unknown name (the message lists the known ones).
    """
    try:
        return SYSTEMS[name]
    except KeyError:
        raise KeyError(f"unknown units '{name}'; known: {', '.join(SYSTEMS)}") from None


#: A number (or a fraction such as 3/4) and a unit made of names, products, quotients
#: and small integer powers; nothing pint would evaluate as an expression.
_QUANTITY = re.compile(
    r"^\s*[-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d{1,3})?(?:\s*/\s*\d+(?:\.\d*)?)?"
    r"\s*[A-Za-zµ°][A-Za-z0-9µ°_ */^.]*$"
)


@cache
def _registry() -> Any:
    import pint  # lazy: only needed for strings with units

    return pint.UnitRegistry()


def parse_quantity(text: str, dimension: str) -> float:
    """Parse a string with its own unit into the internal unit of ``dimension``.

    Args:
        text: E.g. ``"0.5 in"``, ``"250 kN"``, ``"65 ksi"``.
        dimension: The dimension the value must have.

    Returns:
        The value in N, mm, MPa, N·mm or N/mm.

    Raises:
        ValueError: If the string does not parse, has no unit, or has the
            wrong dimension; the message says what was expected.
    """
    import pint

    if re.fullmatch(r"\s*[-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?\s*", text):
        raise ValueError(f"'{text}' has no unit; expected a {dimension}")
    if len(text) > 64 or not _QUANTITY.match(text) or "**" in text:
        raise ValueError(f"cannot read '{text}' as a quantity: write a number and a unit, "
                         "e.g. '12 mm', '3/4 in', '250 kN'")
    ureg = _registry()
    try:
        q = ureg.Quantity(text)
    except Exception as exc:  # pint raises many kinds on malformed text; all mean "unreadable"
        raise ValueError(f"cannot read '{text}' as a quantity ({exc.__class__.__name__})") from None
    if not isinstance(q, ureg.Quantity) or q.dimensionless:
        raise ValueError(f"'{text}' has no unit; expected a {dimension}")
    try:
        value = float(q.to(_INTERNAL_PINT[dimension]).magnitude)
    except pint.errors.DimensionalityError:
        raise ValueError(f"'{text}' is not a {dimension}") from None
    if not math.isfinite(value):
        raise ValueError(f"'{text}' is not finite")
    return value
