"""Verification cases of the capacity answers: collapse LP, incremental, shear-only bound."""

from __future__ import annotations

import math

import numpy as np

from plyshear.verify.case import (
    REL_COLLAPSE,
    REL_PLATEAU,
    REL_ROUND_OFF,
    Case,
    case,
    model,
    ply,
)

# --- capacity -------------------------------------------------------------------


def _johansen(t: tuple[float, ...], q: tuple[float, ...], my: float, double: bool) -> float:
    """The collapse LP of a dowel with given line strengths and constant My."""
    from plyshear.mechanics.collapse import collapse
    from plyshear.model.joint import Bolt, Joint, Member, Ply

    bolt = Bolt(
        diameter=20.0, grade="8.8", fyb=640.0, fub=800.0, stress_area=245.0, threads="excluded"
    )
    owners = ("outer", "mid", "outer") if double else ("m1", "m2")
    plies = tuple(
        Ply(name=f"p{i}", member=m, thickness=ti, fy=355.0, fu=490.0)
        for i, (m, ti) in enumerate(zip(owners, t, strict=True))
    )
    first, second = dict.fromkeys(owners)
    joint = Joint(
        bolt=bolt,
        plies=plies,
        members=(Member(first, support=True), Member(second, load=(1000.0, 0.0))),
    )
    result = collapse(
        joint, list(q), lambda z: np.full_like(z, my), lambda z: np.full_like(z, np.inf)
    )
    return result.load


def _en1995_single(t1: float, t2: float, q1: float, q2: float, my: float) -> dict[str, float]:
    """EN 1995-1-1 eq. (8.6) without 1.05, 1.15 and the rope effect (from memory)."""
    b, r = q2 / q1, t2 / t1
    return {
        "c": q1
        * t1
        / (1 + b)
        * (math.sqrt(b + 2 * b**2 * (1 + r + r**2) + b**3 * r**2) - b * (1 + r)),
        "f": math.sqrt(2 * b / (1 + b)) * math.sqrt(2 * my * q1),
    }


@case
def case_johansen_single_rotation() -> Case:
    """A stiff dowel rotating in two thin members (Johansen's mode c)."""
    t1, t2, q1, q2, my = 10.0, 12.0, 1000.0, 1500.0, 1e6
    return Case(
        "capacity",
        "johansen_single_rotation",
        "Johansen (1949), from memory; EN 1995-1-1 eq. (8.6) mode (c), unmodified",
        "collapse load, single shear [N]",
        _en1995_single(t1, t2, q1, q2, my)["c"],
        _johansen((t1, t2), (q1, q2), my, False),
        REL_COLLAPSE,
    )


@case
def case_johansen_single_two_hinges() -> Case:
    """A slender dowel with a hinge in each member (Johansen's mode f)."""
    t1, t2, q1, q2, my = 40.0, 40.0, 1000.0, 1500.0, 2e4
    return Case(
        "capacity",
        "johansen_single_two_hinges",
        "Johansen (1949), from memory; EN 1995-1-1 eq. (8.6) mode (f), unmodified",
        "collapse load, single shear [N]",
        _en1995_single(t1, t2, q1, q2, my)["f"],
        _johansen((t1, t2), (q1, q2), my, False),
        REL_COLLAPSE,
    )


@case
def case_johansen_double_four_hinges() -> Case:
    """Double shear with four hinges (Johansen's mode k), both planes."""
    t1, t2, q1, q2, my = 40.0, 60.0, 1000.0, 1500.0, 2e4
    b = q2 / q1
    ref = 2 * math.sqrt(2 * b / (1 + b)) * math.sqrt(2 * my * q1)
    return Case(
        "capacity",
        "johansen_double_four_hinges",
        "Johansen (1949), from memory; EN 1995-1-1 eq. (8.7) mode (k) × 2, unmodified",
        "collapse load, double shear [N]",
        ref,
        _johansen((t1, t2, t1), (q1, q2, q1), my, True),
        REL_COLLAPSE,
    )


def _alternating(planes: int, t: float, law: str = "component") -> str:
    """Plies alternating between two members, S355, an M20 10.9 pin (N-mm)."""
    body = ""
    for j in range(planes + 1):
        body += ply(f"p{j}", "a" if j % 2 == 0 else "b", t, 'steel = "S355"\n')
    return (
        'format = 1\nunits = "N-mm"\n[bolt]\ndiameter = 20\ngrade = "10.9"\n'
        'threads = "excluded"\n' + body + "[member.a]\nsupport = true\n[member.b]\nload = 10000.0\n"
        f'[analysis]\nbearing = "{law}"\n'
    )


@case
def case_shear_only_bound_alternating() -> Case:
    """Max-flow bound of an alternating stack with strong plies: every plane cut."""
    from plyshear.mechanics import loadpath, strengths

    joint = model(_alternating(3, 40.0))
    s = strengths.strengths(joint)
    bound = loadpath.plastic_bound(joint, list(s.plane), list(s.ply_force))
    ref = 3 * 0.62 * 1000.0 * math.pi * 20**2 / 4
    return Case(
        "capacity",
        "shear_only_bound_alternating",
        "Ford & Fulkerson (1956), min cut = 3 planes; Kulak, Fisher & Struik (1987) "
        "§4.2: 0.62 fub Ab per plane",
        "shear-only bound, 3 planes [N]",
        ref,
        bound.load,
        REL_ROUND_OFF,
    )


def _thinply() -> str:
    """A 4 mm loaded ply between two thick held plies, M20 10.9 (N-mm)."""
    s355 = 'steel = "S355"\n'
    return (
        'format = 1\nunits = "N-mm"\n[bolt]\ndiameter = 20\ngrade = "10.9"\n'
        'threads = "excluded"\n'
        + ply("held-1", "held", 30.0, s355)
        + ply("thin", "thin", 4.0, s355)
        + ply("held-2", "held", 30.0, s355)
        + "[member.held]\nsupport = true\n[member.thin]\nload = 10000.0\n"
        '[analysis]\nbearing = "elastic-plastic"\nbolt = "elastic-plastic"\n'
    )


@case
def case_collapse_thinply() -> Case:
    """Collapse LP of a joint whose thin ply governs: its bearing strength."""
    from plyshear.mechanics import strengths
    from plyshear.mechanics.collapse import collapse

    joint = model(_thinply())
    s = strengths.strengths(joint)
    lp = collapse(joint, list(s.bearing), s.moment, s.shear, list(s.net_section))
    return Case(
        "capacity",
        "collapse_thin_ply",
        "AISC 360-22 J3.10(a)(1): 2.4 d t Fu of the thin ply (statics: it alone "
        "carries its member); EN 10025-2 S355 fu = 510 MPa",
        "collapse load [N]",
        2.4 * 20 * 4 * 510.0,
        lp.load,
        REL_COLLAPSE,
    )


@case
def case_incremental_thinply() -> Case:
    """Incremental analysis of the same joint: it ends on the thin ply's plateau."""
    from plyshear.mechanics.incremental import analyse

    result = analyse(model(_thinply()))
    return Case(
        "capacity",
        "incremental_thin_ply",
        "AISC 360-22 J3.10(a)(1): 2.4 d t Fu, reached at the 1/4 in hole elongation "
        "(Commentary J3.10)",
        "nonlinear capacity [N]",
        2.4 * 20 * 4 * 510.0,
        result.load,
        REL_PLATEAU,
    )
