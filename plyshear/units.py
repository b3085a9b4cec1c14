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

#: The unit factors: defined here only, every other module imports them.
N_PER_KIP = 4448.2216152605  # exact: 1000 lbf, 1 lbf = 0.45359237 kg x 9.80665 m/s²
MM_PER_IN = 25.4  # exact
MPA_PER_KSI = N_PER_KIP / MM_PER_IN**2  # 6.894757293168361 MPa in 1 ksi (1000 lbf/in²)


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
    "kip-in": UnitSystem("kip-in", N_PER_KIP, MM_PER_IN, "kip", "in", "ksi", MPA_PER_KSI),
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


#: The number of a quantity: a decimal (or a fraction such as 3/4), at the start.
_NUMBER = re.compile(
    r"\s*([-+]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d{1,3})?)"
    r"(?:\s*/\s*(\d+(?:\.\d*)?|\.\d+))?"
)
#: One unit factor: a name, then an optional integer exponent of at most two digits
#: written ``**N`` or ``^N`` (e.g. ``mm``, ``in**2``, ``mm^-1``).
_FACTOR = re.compile(r"\s*([A-Za-zµ°][A-Za-z_µ°]{0,31})(?:\s*(?:\*\*|\^)\s*([-+]?\d{1,2}))?")
#: Between two factors: ``*``, ``/`` or a space (a product).
_OPERATOR = re.compile(r"\s*([*/])|\s+(?=[A-Za-zµ°])")
#: Longest unit string read (a unit is a few names; anything longer is not one).
MAX_QUANTITY_CHARS = 64
#: Most unit factors in one string.
MAX_FACTORS = 8


def _grammar(text: str) -> tuple[float, list[tuple[str, int]]] | None:
    """Split a quantity into its number and unit factors, or None if it is not one.

    The grammar is a whitelist: a number (or ``a/b``), then unit names joined by
    ``*``, ``/`` or a space, each with an optional integer exponent of at most two
    digits. Nothing else reaches pint, so no expression is ever evaluated.
    """
    m = _NUMBER.match(text)
    if m is None:
        return None
    value = float(m.group(1))
    if m.group(2) is not None:
        den = float(m.group(2))
        if den == 0.0:
            return None
        value /= den
    pos, sign, factors = m.end(), 1, []
    while True:
        f = _FACTOR.match(text, pos)
        if f is None:
            return None
        factors.append((f.group(1), sign * int(f.group(2) or 1)))
        pos = f.end()
        if text[pos:].strip() == "":
            return (value, factors) if len(factors) <= MAX_FACTORS else None
        op = _OPERATOR.match(text, pos)
        if op is None:
            return None
        sign = -1 if op.group(1) == "/" else 1
        pos = op.end()


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
    parsed = _grammar(text) if len(text) <= MAX_QUANTITY_CHARS else None
    if parsed is None:
        shown = text if len(text) <= MAX_QUANTITY_CHARS else text[:MAX_QUANTITY_CHARS] + "..."
        raise ValueError(
            f"cannot read '{shown}' as a quantity: write a number and a unit, "
            "e.g. '12 mm', '3/4 in', '250 kN', 'N/mm^2' (exponents: integers "
            "of at most two digits)"
        )
    ureg = _registry()
    number, factors = parsed
    try:
        q = ureg.Quantity(number, ureg.dimensionless)
        for name, power in factors:
            q = q * ureg.Unit(name) ** power
    except Exception as exc:  # pint raises many kinds on unknown names; all mean "unreadable"
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


def length_str(units: str, value: float) -> str:
    """Format a length given in mm in the unit system ``units``."""
    u = system(units)
    return f"{value / u.factor('length'):.4g} {u.label('length')}"


def force_str(units: str, value: float) -> str:
    """Format a force given in N in the unit system ``units``."""
    u = system(units)
    return f"{value / u.factor('force'):.4g} {u.label('force')}"
