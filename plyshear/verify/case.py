"""The verification case record, its registry and the model helpers the cases share."""

from __future__ import annotations

import functools
from collections.abc import Callable
from dataclasses import dataclass
from typing import TYPE_CHECKING

if TYPE_CHECKING:
    from plyshear.codes.check import CheckItem
    from plyshear.mechanics.results import Solution
    from plyshear.model.joint import Joint

KIP = 4448.2216152605  #: N per kip (exact: 1 lbf = 0.45359237 kg × 9.80665 m/s²)
IN = 25.4  #: mm per inch (exact)
KSI = KIP / IN**2  #: MPa per ksi

#: A value printed to three significant figures.
REL_PRINTED_3 = 5e-3
#: Two forms of one formula, or statics: round-off only.
REL_ROUND_OFF = 1e-9
#: Statics through a solved stack (the equilibrium residual of the solve).
REL_STATICS = 1e-6
#: A check item against the clause's formula worked by hand: the same arithmetic.
REL_END_TO_END = 1e-6
#: Hetényi's beam: the load spread over a thin ply shifts w and M by ~βt/2 ≈ 0.2 %.
REL_HETENYI = 1e-2
#: The pin formula assumes uniform bearing; the pin's flexibility adds ~4e-6 (measured).
REL_PIN_FORMULA = 5e-3
#: The collapse LP converges to 0.5 % on mesh doubling (its default tolerance).
REL_COLLAPSE = 5e-3
#: The incremental analysis' regularising stiffness lifts a plateau by ~1e-8 k0·δ.
REL_PLATEAU = 1e-4
#: The rigid-plastic moment is approached as the elastic core shrinks (c = r/1000 here).
REL_SHAPE_FACTOR = 1e-3

GROUPS = ("mechanics", "AISC 360-22", "EN 1993-1-8", "capacity", "rows")


@dataclass(frozen=True)
class Case:
    """One verification case, evaluated.

    Attributes:
        group: One of :data:`GROUPS`.
        name: Short identifier (also the test's id).
        source: The reference: standard and clause, book, paper, example.
        quantity: What is compared, with its unit.
        reference: The source's value.
        value: plyshear's value.
        tol: Allowed relative difference.
    """

    group: str
    name: str
    source: str
    quantity: str
    reference: float
    value: float
    tol: float

    @property
    def ratio(self) -> float:
        """The value over the reference."""
        return self.value / self.reference

    @property
    def passes(self) -> bool:
        """True when the two agree within ``tol`` (relative)."""
        return abs(self.value - self.reference) <= self.tol * abs(self.reference)


CaseFn = Callable[[], Case]
_REGISTRY: dict[str, CaseFn] = {}


def case(fn: CaseFn) -> CaseFn:
    """Register a case function under its name (without the leading ``case_``)."""
    _REGISTRY[fn.__name__.removeprefix("case_")] = fn
    return fn


def names() -> list[str]:
    """Every case's name, in the document's order."""
    return list(_REGISTRY)


@functools.cache
def run(name: str) -> Case:
    """Evaluate one case (cached: the tests and the document share one run)."""
    return _REGISTRY[name]()


def run_all() -> list[Case]:
    """Evaluate every case."""
    return [run(n) for n in names()]


# --- model helpers shared by the case modules --------------------------------------


def model(text: str) -> Joint:
    """Parse a case's model-file text through the model file's own validation."""
    from plyshear.model.modelfile import loads

    return loads(text, "<verification case>")


def ply(name: str, member: str | None, t: float, extra: str = "") -> str:
    """One ``[[ply]]`` table (no member: a loose filler)."""
    owner = f'member = "{member}"\n' if member else ""
    return f'[[ply]]\nname = "{name}"\n{owner}thickness = {t!r}\n{extra}'


def solve(text: str) -> tuple[Joint, Solution]:
    """Parse and solve a case's model."""
    import plyshear

    joint = model(text)
    return joint, plyshear.solve(joint)


def item(text: str, what: str, where: str) -> CheckItem:
    """The one check item ``what`` at ``where`` of a case's model, solved and checked."""
    import plyshear

    joint, sol = solve(text)
    items = [i for i in plyshear.check(joint, sol).items if i.what == what and i.where == where]
    if len(items) != 1:
        raise LookupError(f"expected one {what!r} item at {where!r}, found {len(items)}")
    return items[0]


def clevis(a: float, b: float, c: float, extra: str = "") -> str:
    """A stiff pin in a symmetric clevis on soft bearing (uniform bearing)."""
    soft = "fy = 355\nfu = 490\nfoundation_modulus = 50.0\n"
    return (
        'format = 1\nunits = "N-mm"\n[bolt]\ndiameter = 40\ngrade = "8.8"\n'
        'threads = "excluded"\n'
        + ply("outer-1", "clevis", a, soft)
        + ply("lug", "lug", b, soft + f"gap = {c}\n")
        + ply("outer-2", "clevis", a, soft + f"gap = {c}\n")
        + "[member.clevis]\nsupport = true\n[member.lug]\nload = 100000.0\n"
        + extra
    )
