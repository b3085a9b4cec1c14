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

import numpy as np

from plyshear import units as _units
from plyshear.codes import aisc360_check, en1993_1_8_check
from plyshear.codes.common import (
    StandardItems,
    geometry_notes,
    load_level,
    row_note,
    strength_level,
)
from plyshear.codes.result import UNVERIFIED, CheckItem, CheckResult
from plyshear.mechanics.results import Solution
from plyshear.model import catalog
from plyshear.model.joint import STANDARDS, Joint
from plyshear.units import length_str

#: A solve is not trusted for a check above these (relative residual, condition estimate).
UNVERIFIED_RESIDUAL = 1e-6
UNVERIFIED_CONDITION = 1e12
#: A utilization above this is far more likely a load or size typed in the wrong
#: unit system than a real design (common practice, no source).
UTILIZATION_SUSPECT = 20.0
#: What each standard asks of a bolt, by the model file's name of the standard.
ITEMS: dict[str, StandardItems] = {
    s.standard: s for s in (aisc360_check.ITEMS, en1993_1_8_check.ITEMS)
}


def check(
    solution: Solution, standard: str | None = None, method: str | None = None
) -> CheckResult:
    """Check every plane, ply and bolt of a solved joint.

    Args:
        solution: The solution (it carries its joint); demands at the design load
            level of the method: factored for LRFD and EN, service for ASD.
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

    joint = solution.joint
    standard = standard or joint.check.standard
    method = method or joint.check.method
    if standard not in ITEMS:
        raise ValueError(f"unknown standard '{standard}'; known: {', '.join(STANDARDS)}")
    service_only = pin_plates.service_only(joint, standard, method)
    if not service_only:
        require_load_level(joint, standard, method)
    if standard != joint.check.standard and joint.check.slip_class is not None:
        # The classes share letters but not friction coefficients (AISC Class A is
        # mu 0.30, EN Class A is mu 0.5): never carry one across.
        raise ValueError(
            f"check.slip_class '{joint.check.slip_class}' is a class of "
            f"{joint.check.standard}, not of {standard}; check with the "
            "model's standard or change [check]"
        )
    if service_only:  # a replaceable pin's service loads: the serviceability rules alone
        from plyshear.codes.en1993_1_8 import STANDARD as EDITION

        result = CheckResult(
            standard=standard,
            method="partial-factors",
            edition=EDITION,
            items=(),
            units=joint.units,
        )
    else:
        result = run(ITEMS[standard], solution, method)
    result = pin_plates.extend(joint, solution, result, method)
    notes = list(result.notes)
    fitted = fitted_holes_note(joint)
    if fitted:
        notes.append(fitted)
    return _trusted(
        dataclasses.replace(
            result,
            loads=load_level(joint, standard, method),
            notes=tuple(dict.fromkeys(notes)),
            warnings=tuple(check_warnings(joint, result)),
        ),
        solution,
    )


def run(items: StandardItems, solution: Solution, method: str) -> CheckResult:
    """The per-bolt driver: one standard's items for every bolt of the row.

    Args:
        items: What the standard asks of a bolt.
        solution: The solution.
        method: The method (ignored by a standard with a fixed method).

    Returns:
        The items of every bolt, each placed on its bolt, and the notes.
    """
    joint = solution.joint
    method = items.method or method
    notes = geometry_notes(joint) + items.notes(joint)
    row = len(solution.bolts)
    found: list[CheckItem] = []
    for k, bolt in enumerate(solution.bolts):
        found += [
            dataclasses.replace(i, bolt=k, row=row) for i in items.bolt(joint, bolt, method, notes)
        ]
    factor, rule = items.long_joint(joint)
    note = row_note(solution, factor, rule)
    if note:
        notes.append(note)
    return CheckResult(
        standard=items.standard,
        method=method,
        edition=items.edition,
        items=tuple(found),
        notes=tuple(dict.fromkeys(notes)),
        units=joint.units,
    )


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
        standard, standard
    )
    fix = (
        'check them by LRFD or EN 1993-1-8, or give service loads and [check] loads = "service"'
        if have == "factored"
        else 'check them by ASD, or give factored loads and [check] loads = "factored"'
    )
    raise ValueError(
        f"the loads are declared {have} ([check] loads) but {name} takes {need} loads: {fix}"
    )


def check_warnings(joint: Joint, result: CheckResult) -> list[str]:
    """What the engineer must read under the verdict.

    An informative item above 1.0 (outside the standard's text, so it does not
    decide the verdict), and any utilization above :data:`UTILIZATION_SUSPECT`,
    which is far more likely a value typed in the wrong unit system.
    """
    out = []
    for item in result.sorted_items():
        if item.informative and item.utilization > 1.0:
            out.append(
                f"{item.what}, {item.place(result.units)}: utilization "
                f"{item.utilization:.3f} > 1.0 on an informative item (outside the "
                "standard's text, so it does not decide the verdict): the engineer "
                "must judge it"
            )
    worst = max(result.items, key=lambda i: i.utilization, default=None)
    if worst is not None and worst.utilization > UTILIZATION_SUSPECT:
        u = _units.system(joint.units)
        load = max(joint.members, key=lambda m: float(np.hypot(*m.load)))
        shown = ", ".join(f"{v / u.factor('force'):.6g}" for v in load.load)
        out.append(
            f"utilization {worst.utilization:.6g} > {UTILIZATION_SUSPECT:g} "
            f"({worst.what} at {worst.place(result.units)}): a load or size in the "
            f'wrong units? The file\'s units = "{joint.units}" read member.'
            f"{load.name}.load as [{shown}] {u.label('force')}"
        )
    return out


def fitted_holes_note(joint: Joint) -> str | None:
    """Say that the linear split assumes fitted holes when the holes have clearance."""
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
    return (
        f"the plane shears assume fitted holes (every ply bears from the first load); "
        f"the holes have clearance{size}: study its effect on the split with "
        f"`plyshear capacity {model} --scatter 200`"
    )


def _trusted(result: CheckResult, solution: Solution) -> CheckResult:
    """Mark the check unverified when its solve is not trustworthy (it then fails)."""
    why = []
    if not solution.equilibrium_residual <= UNVERIFIED_RESIDUAL:
        why.append(
            f"equilibrium residual {solution.equilibrium_residual:.1e} of the load "
            f"(above {UNVERIFIED_RESIDUAL:.0e})"
        )
    if not solution.condition <= UNVERIFIED_CONDITION:
        why.append(
            f"condition estimate {solution.condition:.1e} (above {UNVERIFIED_CONDITION:.0e})"
        )
    return dataclasses.replace(result, unverified="; ".join(why)) if why else result


__all__ = ["UNVERIFIED", "CheckItem", "CheckResult", "check", "fitted_holes_note", "run"]
