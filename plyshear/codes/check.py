"""Check a solved joint against a design standard.

Every demand comes from the stiffness solution: each plane's own shear, each
ply's own bearing, the bolt's solved moment diagram; never from an assumed
equal split. The standard is passed in; there is no global "current standard".

The result is a list of :class:`CheckItem` (what, where, demand, capacity,
utilization, clause) and the governing item. Items marked ``informative`` are
reported but lie outside the standard's text; they do not decide pass or fail.
"""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass, field
from typing import Any

import numpy as np

from plyshear import units as _units
from plyshear.codes.clause import Clause
from plyshear.mechanics.results import BoltResult, Solution
from plyshear.model.joint import Joint

STANDARDS = ("aisc360-22", "en1993-1-8")
#: A solve is not trusted for a check above these (relative residual, condition estimate).
UNVERIFIED_RESIDUAL = 1e-6
UNVERIFIED_CONDITION = 1e12
#: The verdict of a check whose solve is not trusted.
UNVERIFIED = "NOT VERIFIED: the solve is ill-conditioned"
#: Planes whose shear is below this fraction of the load transfer nothing (slip).
SLIP_PLANE_MIN_SHARE = 1e-6
#: A utilization above this is far more likely a load or size typed in the wrong
#: unit system than a real design (common practice, no source).
UTILIZATION_SUSPECT = 20.0


@dataclass(frozen=True)
class CheckItem:
    """One limit state at one place.

    Attributes:
        what: The limit state, e.g. ``"bolt shear"``, ``"bearing"``.
        where: ``"plane 2"``, ``"ply fork-outer-1"`` or ``"bolt"``.
        demand: Required strength (N, N·mm) or, for an interaction, its value.
        capacity: Design / allowable strength in the same unit, or 1.0.
        dimension: ``"force"``, ``"moment"`` or ``"ratio"`` (for unit conversion).
        clauses: Citation records of the clauses used.
        informative: True when the item lies outside the standard's text.
        note: A short remark shown beside the item.
        z: Position along the bolt, mm, for items on the bolt's diagram.
    """

    what: str
    where: str
    demand: float
    capacity: float
    dimension: str
    clauses: tuple[Clause, ...]
    informative: bool = False
    note: str = ""
    z: float | None = None

    def place(self, units: str) -> str:
        """Return ``where``, with the position along the bolt in ``units``."""
        if self.z is None:
            return self.where
        return f"{self.where} at z = {length_str(units, self.z)}"

    @property
    def utilization(self) -> float:
        """Demand over capacity (inf if the capacity is zero)."""
        if self.capacity <= 0.0:
            return float("inf") if self.demand > 0 else 0.0
        return self.demand / self.capacity

    @property
    def clause(self) -> str:
        """The clause references, without the standard's name."""
        seen: list[str] = []
        for c in self.clauses:
            if c.ref not in seen:
                seen.append(c.ref)
        return "; ".join(seen)


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
                {"what": i.what, "where": i.place(self.units),
                 "demand": conv(i.demand, i.dimension),
                 "capacity": conv(i.capacity, i.dimension),
                 "utilization": _finite(i.utilization), "clause": i.clause,
                 "unit": "" if i.dimension == "ratio" else u.label(i.dimension),
                 "informative": i.informative, "note": i.note}
                for i in self.sorted_items()
            ],
            "governing": None if gov is None else {
                "what": gov.what, "where": gov.place(self.units),
                "utilization": _finite(gov.utilization),
                "clause": gov.clause},
            "passes": self.passes,
            "verified": not self.unverified,
            **({"verdict": UNVERIFIED, "unverified": self.unverified} if self.unverified
               else {}),
            "notes": list(self.notes),
            "loads": self.loads,
            "warnings": list(self.warnings),
        }


def _finite(value: float) -> float | None:
    return value if np.isfinite(value) else None


def check(joint: Joint, solution: Solution, standard: str | None = None,
          method: str | None = None) -> CheckResult:
    """Check every plane, ply and the bolt of a solved joint.

    Args:
        joint: The joint.
        solution: Its solution (demands at the design load level of the method:
            factored for LRFD and EN, service for ASD).
        standard: ``"aisc360-22"`` or ``"en1993-1-8"``; the model's by default.
        method: ``"lrfd"`` or ``"asd"`` (AISC); the model's by default.

    Returns:
        The :class:`CheckResult`.

    Raises:
        ValueError: For an unknown standard, a slip class given for another
            standard, or loads of the wrong level for the method (factored loads
            checked by ASD, service loads by LRFD or EN).
    """
    from plyshear.codes import pin_plates

    standard = standard or joint.check.standard
    method = method or joint.check.method
    service_only = pin_plates.service_only(joint, standard, method)
    if not service_only:
        require_load_level(joint, standard, method)
    if standard != joint.check.standard and joint.check.slip_class is not None:
        # The classes share letters but not friction coefficients (AISC Class A is
        # mu 0.30, EN Class A is mu 0.5): never carry one across.
        raise ValueError(f"check.slip_class '{joint.check.slip_class}' is a class of "
                         f"{joint.check.standard}, not of {standard}; check with the "
                         "model's standard or change [check]")
    if service_only:  # a replaceable pin's service loads: the serviceability rules alone
        from plyshear.codes.en1993_1_8 import STANDARD as EDITION

        result = CheckResult(standard=standard, method="partial-factors", edition=EDITION,
                             items=(), units=joint.units)
    elif standard == "aisc360-22":
        from plyshear.codes import check_aisc

        result = check_aisc.check(joint, solution, method)
    elif standard == "en1993-1-8":
        from plyshear.codes import check_en

        result = check_en.check(joint, solution)
    else:
        raise ValueError(f"unknown standard '{standard}'; known: {', '.join(STANDARDS)}")
    result = pin_plates.extend(joint, solution, result, method)
    notes = list(result.notes)
    fitted = fitted_holes_note(joint)
    if fitted:
        notes.append(fitted)
    return _trusted(dataclasses.replace(result, loads=load_level(joint, standard, method),
                                        notes=tuple(dict.fromkeys(notes)),
                                        warnings=tuple(check_warnings(joint, result))),
                    solution)


def strength_level(standard: str, method: str) -> str:
    """The load level a strength check takes: service for ASD, factored otherwise."""
    return "service" if standard == "aisc360-22" and method == "asd" else "factored"


def load_level(joint: Joint, standard: str, method: str) -> str:
    """The level of the model's loads: as declared, else what the method takes."""
    return joint.check.loads or strength_level(standard, method)


def require_load_level(joint: Joint, standard: str, method: str) -> None:
    """Refuse a strength check of loads declared at the other level.

    ASD divides the nominal strength by Ω and compares it with service loads;
    LRFD and EN 1993-1-8 compare design resistances with factored loads. The
    same numbers cannot be both.

    Raises:
        ValueError: With one line that says how to fix it.
    """
    have = load_level(joint, standard, method)
    need = strength_level(standard, method)
    if have == need:
        return
    name = {"aisc360-22": f"AISC 360-22 {method.upper()}", "en1993-1-8": "EN 1993-1-8"}.get(
        standard, standard)
    fix = ("check them by LRFD or EN 1993-1-8, or give service loads and [check] loads = "
           "\"service\"" if have == "factored" else
           "check them by ASD, or give factored loads and [check] loads = \"factored\"")
    raise ValueError(f"the loads are declared {have} ([check] loads) but {name} takes {need} "
                     f"loads: {fix}")


def check_warnings(joint: Joint, result: CheckResult) -> list[str]:
    """What the engineer must read under the verdict.

    An informative item above 1.0 (outside the standard's text, so it does not
    decide the verdict), and any utilization above :data:`UTILIZATION_SUSPECT`,
    which is far more likely a value typed in the wrong unit system.
    """
    out = []
    for item in result.sorted_items():
        if item.informative and item.utilization > 1.0:
            out.append(f"{item.what}, {item.place(result.units)}: utilization "
                       f"{item.utilization:.3f} > 1.0 on an informative item (outside the "
                       "standard's text, so it does not decide the verdict): the engineer "
                       "must judge it")
    worst = max(result.items, key=lambda i: i.utilization, default=None)
    if worst is not None and worst.utilization > UTILIZATION_SUSPECT:
        u = _units.system(joint.units)
        load = max(joint.members, key=lambda m: float(np.hypot(*m.load)))
        shown = ", ".join(f"{v / u.factor('force'):.6g}" for v in load.load)
        out.append(f"utilization {worst.utilization:.6g} > {UTILIZATION_SUSPECT:g} "
                   f"({worst.what} at {worst.place(result.units)}): a load or size in the "
                   f"wrong units? The file's units = \"{joint.units}\" read member."
                   f"{load.name}.load as [{shown}] {u.label('force')}")
    return out


def fitted_holes_note(joint: Joint) -> str | None:
    """Say that the linear split assumes fitted holes when the holes have clearance."""
    from plyshear.model import catalog

    clearance = joint.analysis.hole_clearance
    if clearance is None:
        d = joint.bolt.diameter
        try:
            clearance = catalog.hole_diameter(d, joint.bolt.hole, joint.check.standard) - d
        except (catalog.CatalogError, ValueError):
            clearance = None
    if clearance is not None and clearance <= 0.0:
        return None
    size = "" if clearance is None else f" ({length_str(joint.units, clearance)} diametral)"
    model = joint.source if joint.source and " " not in joint.source else "MODEL"
    return (f"the plane shears assume fitted holes (every ply bears from the first load); "
            f"the holes have clearance{size}: study its effect on the split with "
            f"`plyshear capacity {model} --scatter 200`")


def _trusted(result: CheckResult, solution: Solution) -> CheckResult:
    """Mark the check unverified when its solve is not trustworthy (it then fails)."""
    why = []
    if not solution.equilibrium_residual <= UNVERIFIED_RESIDUAL:
        why.append(f"equilibrium residual {solution.equilibrium_residual:.1e} of the load "
                   f"(above {UNVERIFIED_RESIDUAL:.0e})")
    if not solution.condition <= UNVERIFIED_CONDITION:
        why.append(f"condition estimate {solution.condition:.1e} (above "
                   f"{UNVERIFIED_CONDITION:.0e})")
    return dataclasses.replace(result, unverified="; ".join(why)) if why else result


# Helpers shared by the standards ------------------------------------------------


def packs(joint: Joint) -> list[tuple[list[int], float]]:
    """Return the filler packs: runs of consecutive filler plies and their thickness, mm."""
    out: list[tuple[list[int], float]] = []
    run: list[int] = []
    for j, ply in enumerate(joint.plies + (None,)):  # type: ignore[operator]
        if ply is not None and ply.is_filler:
            run.append(j)
        elif run:
            out.append((run, sum(joint.plies[i].thickness for i in run)))
            run = []
    return out


def pack_at_plane(joint: Joint, above: int, below: int) -> float:
    """Return the thickness of the filler pack that a plane bounds (0 if none), mm."""
    for members, t in packs(joint):
        if above in members or below in members:
            return t
    return 0.0


def separates_members(joint: Joint, above: int, below: int) -> bool:
    """True if a plane lies between plies that can move relative to each other."""
    a, b = joint.plies[above].member, joint.plies[below].member
    return a is None or b is None or a != b


def slip_planes(joint: Joint, bolt: BoltResult) -> int:
    """Count the slip planes that transfer load.

    A slip plane lies between consecutive plies of different members; a filler
    pack between them is transparent (its two faces act in series: slip on
    either lets the joint slip), so it adds no plane. A plane counts when the
    bolt shear across it is not negligible.
    """
    load = max((float(np.hypot(*m.load)) for m in joint.members), default=0.0)
    shear = {(p.above, p.below): p.shear for p in bolt.planes}
    real = [j for j, p in enumerate(joint.plies) if not p.is_filler]
    count = 0
    for a, b in zip(real, real[1:], strict=False):
        if joint.plies[a].member == joint.plies[b].member:
            continue
        across = min(shear[(j, j + 1)] for j in range(a, b))
        if across > SLIP_PLANE_MIN_SHARE * load:
            count += 1
    return count


def transferred_force(joint: Joint, bolt: BoltResult) -> float:
    """The largest force one member passes through the bolt, N (slip demand)."""
    totals: dict[str, np.ndarray] = {}
    for pb in bolt.plies:
        m = joint.plies[pb.ply].member
        if m is not None:
            totals[m] = totals.get(m, np.zeros(2)) + np.array(pb.force_xy)
    return max((float(np.hypot(*v)) for v in totals.values()), default=0.0)


def bolt_section_diameter(joint: Joint, threaded: bool) -> float:
    """Diameter of the bolt section: the shank, or the stress-area equivalent, mm."""
    if threaded:
        return float(np.sqrt(4.0 * joint.bolt.stress_area / np.pi))
    return joint.bolt.diameter


def node_threads(joint: Joint, bolt: BoltResult) -> np.ndarray:
    """Whether the bolt is threaded at each node."""
    return joint.bolt.threaded_along(bolt.z)


def resultants(values: np.ndarray) -> np.ndarray:
    """Resultant magnitudes of (n, 2) vectors."""
    return np.hypot(values[:, 0], values[:, 1])


def length_str(units: str, value: float) -> str:
    """Format a length given in mm in the unit system ``units``."""
    u = _units.system(units)
    return f"{value / u.factor('length'):.4g} {u.label('length')}"


def force_str(units: str, value: float) -> str:
    """Format a force given in N in the unit system ``units``."""
    u = _units.system(units)
    return f"{value / u.factor('force'):.4g} {u.label('force')}"


def geometry_notes(joint: Joint) -> list[str]:
    """Notes on what the model file leaves to assumption."""
    notes = []
    if joint.bolt.threads_assumed:
        notes.append("thread position unknown (no bolt.length): threads assumed in every "
                     "plane, which is conservative")
    for ply in joint.plies:
        if ply.edge is None and not ply.is_filler:
            notes.append(f"ply {ply.name}: no edge distance given; tear-out and edge "
                         "effects not checked")
    return notes


def joint_length(joint: Joint) -> float:
    """Length of the bolt pattern along the force for the long-joint rules, mm.

    The row's own length, or the model's ``[check] joint_length`` if longer
    (a single bolt standing for a longer row).
    """
    return max(joint.check.joint_length, joint.pattern_length)


def tag_bolt(items: list[CheckItem], index: int, count: int) -> list[CheckItem]:
    """Prefix the items of bolt ``index`` (from 0) with the bolt when a row has several."""
    if count <= 1:
        return items
    return [dataclasses.replace(i, where=f"bolt {index + 1}: {i.where}") for i in items]


def bolt_loads(joint: Joint, solution: Solution) -> np.ndarray:
    """The force each bolt of a row transfers (the largest member force through it), N."""
    return np.array([transferred_force(joint, b) for b in solution.bolts])


def row_note(joint: Joint, solution: Solution, factor: float, rule: str) -> str | None:
    """Contrast the standard's long-joint factor with the model's own end-bolt share."""
    if len(solution.bolts) < 2:
        return None
    loads = bolt_loads(joint, solution)
    mean = float(loads.mean())
    end = float(max(loads[0], loads[-1]))
    if mean <= 0.0 or end <= 0.0:
        return None  # nothing to share: no load reaches the row
    return (f"bolt row of {len(loads)}, length {length_str(joint.units, joint.pattern_length)}: "
            f"{rule} factor {factor:.3f} (the standard's allowance for uneven sharing); the "
            f"model's end bolt carries {end / mean:.3f} x the mean bolt load "
            f"(an equal share would need a factor of {mean / end:.3f})")
