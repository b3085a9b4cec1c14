r"""The collapse LP against Johansen's rigid-plastic yield theory of a dowel.

References:

* K. W. Johansen, "Theory of timber connections", IABSE Publications 9 (1949)
  (from memory): a dowel of yield moment My through members of embedment
  strength f_h, both rigid-plastic; every failure mode is a mechanism of
  embedment and plastic hinges.
* EN 1995-1-1:2004 §8.2.2, eq. (8.6) single shear and (8.7) double shear
  (from memory): the same modes in the code's notation, β = f_h2/f_h1, here
  WITHOUT the modification factors 1.05 and 1.15 and without the rope effect
  (F_ax/4), so that the formulas are Johansen's pure rigid-plastic loads.

Derivation (equilibrium of the rigid-plastic dowel, free ends, no axial
force). Line strengths q_i = f_hi·d (N/mm); member 1 occupies [0, t1], member
2 [t1, t1 + t2]; F is the force through the plane. In a rigid part of the
dowel the bearing is ±q_i, changing sign at a pivot; at a hinge V = 0 and
|M| = My.

(a), (b) The dowel translates in one member: F = q1·t1, or F = q2·t2.

(c) The dowel rotates as a rigid body: bearing −q1 on [0, c1], +q1 on
[c1, t1], and in member 2 −q2 on the first e of it, +q2 beyond. Force:
F = q1(t1 − 2c1) = q2(2e − t2). Moments about the plane: member 1 gives
q1(t1²/2 − u²) with u = t1 − c1 = (t1 + F/q1)/2, member 2 gives
q2(t2²/2 − e²) with e = (t2 + F/q2)/2; they cancel (free ends), so

.. math:: F^2 (1/q_1 + 1/q_2) + 2F(t_1 + t_2) − (q_1 t_1^2 + q_2 t_2^2) = 0.

(d) A hinge in member 2 at a = F/q2 from the plane (V = 0 there) and the
dowel rotating in member 1: the moment at the hinge of the loads on
[0, t1 + a] is My:

.. math:: F^2 \frac{2q_1 + q_2}{4 q_1 q_2} + \frac{F t_1}{2} − \frac{q_1 t_1^2}{4} − M_y = 0.

(e) The mirror image of (d): a hinge in member 1, the dowel rotating in 2.

(f) Hinges in both members, at a_i = F/q_i from the plane; between them V
rises to F and falls back, so 2My = F(a1 + a2)/2:

.. math:: F^2 = 4 M_y / (1/q_1 + 1/q_2).

Double shear (outer members t1, q1; central member t2, q2; symmetric, so per
plane F and the load 2F): (g) the outer members embed, F = q1·t1; (h) the
central member embeds, 2F = q2·t2; (j) per plane mode (d): the outer member's
dowel rotates, a hinge in the central member at F/q2 from each plane (the
central part between the hinges carries a constant moment and no bearing);
(k) per plane mode (f): four hinges.

Each formula is the load of one mechanism, an upper bound (kinematic
theorem); the collapse load is the least of them where that mechanism's
statics is admissible (members long enough to anchor a hinge's moment:
q(t − a)²/4 ≥ My beyond it). The strengths below are chosen so that each mode
governs by a clear margin and is admissible.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from plyshear.mechanics.collapse import Collapse, collapse
from plyshear.model.joint import Bolt, Joint, Member, Ply

# The LP's answer converges to 0.5 % (its default tol); Johansen's modes to the same.
REL_JOHANSEN = 5e-3
REL_ALGEBRA = 1e-12  # two forms of the same closed form
REL_SOLVER = 1e-9  # HiGHS' optimality tolerance, on a lower bound

# The bolt's own grade is irrelevant here: the strengths are passed as functions.
BOLT = Bolt(diameter=20.0, grade="8.8", fyb=640.0, fub=800.0, stress_area=245.0, threads="excluded")


def _no_limit(z: np.ndarray) -> np.ndarray:
    """Shear strength: none (Johansen's dowel does not shear off)."""
    return np.full_like(z, np.inf)


def _moment(my: float):
    """A constant yield moment My along the dowel."""
    return lambda z: np.full_like(z, my)


def _ply(name: str, member: str, t: float) -> Ply:
    return Ply(name=name, member=member, thickness=t, fy=355.0, fu=490.0)


def _single(t1: float, t2: float) -> Joint:
    """Two members in single shear: m1 held, m2 pulled."""
    return Joint(
        bolt=BOLT,
        plies=(_ply("m1", "m1", t1), _ply("m2", "m2", t2)),
        members=(Member("m1", support=True), Member("m2", load=(1000.0, 0.0))),
    )


def _double(t1: float, t2: float) -> Joint:
    """Outer members (held, one member) and a pulled central member."""
    return Joint(
        bolt=BOLT,
        plies=(_ply("out-1", "outer", t1), _ply("mid", "mid", t2), _ply("out-2", "outer", t1)),
        members=(Member("outer", support=True), Member("mid", load=(1000.0, 0.0))),
    )


def _root(a: float, b: float, c: float) -> float:
    """The positive root of a·F² + b·F + c = 0 (a > 0, c < 0)."""
    return (-b + math.sqrt(b * b - 4 * a * c)) / (2 * a)


def _hinge_in_2(t1: float, q1: float, q2: float, my: float) -> float:
    """Mode (d): a hinge in member 2, the dowel rotating in member 1 (derived above)."""
    return _root((2 * q1 + q2) / (4 * q1 * q2), t1 / 2, -q1 * t1**2 / 4 - my)


def single_shear(t1: float, t2: float, q1: float, q2: float, my: float) -> dict[str, float]:
    """Johansen's single-shear modes, derived above, N."""
    return {
        "a": q1 * t1,
        "b": q2 * t2,
        "c": _root(1 / q1 + 1 / q2, 2 * (t1 + t2), -(q1 * t1**2 + q2 * t2**2)),
        "d": _hinge_in_2(t1, q1, q2, my),
        "e": _hinge_in_2(t2, q2, q1, my),
        "f": math.sqrt(4 * my / (1 / q1 + 1 / q2)),
    }


def double_shear(t1: float, t2: float, q1: float, q2: float, my: float) -> dict[str, float]:
    """Johansen's double-shear modes, derived above: the load through both planes, N."""
    return {
        "g": 2 * q1 * t1,
        "h": q2 * t2,
        "j": 2 * _hinge_in_2(t1, q1, q2, my),
        "k": 2 * math.sqrt(4 * my / (1 / q1 + 1 / q2)),
    }


def published_single(t1: float, t2: float, q1: float, q2: float, my: float) -> dict[str, float]:
    """EN 1995-1-1 eq. (8.6) without 1.05, 1.15 and the rope effect (from memory), q1 = f_h1·d."""
    b = q2 / q1
    r = t2 / t1
    return {
        "a": q1 * t1,
        "b": q1 * t2 * b,
        "c": q1
        * t1
        / (1 + b)
        * (math.sqrt(b + 2 * b**2 * (1 + r + r**2) + b**3 * r**2) - b * (1 + r)),
        "d": q1
        * t1
        / (2 + b)
        * (math.sqrt(2 * b * (1 + b) + 4 * b * (2 + b) * my / (q1 * t1**2)) - b),
        "e": q1
        * t2
        / (1 + 2 * b)
        * (math.sqrt(2 * b**2 * (1 + b) + 4 * b * (1 + 2 * b) * my / (q1 * t2**2)) - b),
        "f": math.sqrt(2 * b / (1 + b)) * math.sqrt(2 * my * q1),
    }


def published_double(t1: float, t2: float, q1: float, q2: float, my: float) -> dict[str, float]:
    """EN 1995-1-1 eq. (8.7) per plane, times two planes (from memory), unmodified."""
    b = q2 / q1
    per_plane = {
        "g": q1 * t1,
        "h": 0.5 * q2 * t2,
        "j": q1
        * t1
        / (2 + b)
        * (math.sqrt(2 * b * (1 + b) + 4 * b * (2 + b) * my / (q1 * t1**2)) - b),
        "k": math.sqrt(2 * b / (1 + b)) * math.sqrt(2 * my * q1),
    }
    return {k: 2 * v for k, v in per_plane.items()}


# (t1, t2, q1, q2, My) in mm, N/mm, N·mm: chosen so that the named mode governs
# (by 26 % or more over the next) and its mechanism is admissible.
SINGLE = {
    "a": (10.0, 40.0, 1000.0, 1500.0, 1e6),  # stiff dowel, thin member 1
    "b": (40.0, 10.0, 1500.0, 1000.0, 1e6),
    "c": (10.0, 12.0, 1000.0, 1500.0, 1e6),  # stiff dowel, two thin members: it rotates
    "d": (10.0, 60.0, 1000.0, 1500.0, 2e4),  # thick member 2 takes a hinge
    "e": (60.0, 10.0, 1500.0, 1000.0, 2e4),
    "f": (40.0, 40.0, 1000.0, 1500.0, 2e4),  # slender dowel, thick members
}
DOUBLE = {
    "g": (10.0, 40.0, 1000.0, 1000.0, 1e6),
    "h": (20.0, 10.0, 1000.0, 1000.0, 1e6),
    "j": (10.0, 60.0, 1000.0, 1500.0, 2e4),
    "k": (40.0, 60.0, 1000.0, 1500.0, 2e4),
}
MARGIN = 1.2  # the governing mode is at least this much below the next


def _run(joint: Joint, q: list[float], my: float) -> Collapse:
    return collapse(joint, q, _moment(my), _no_limit)


@pytest.mark.parametrize("case", list(SINGLE.values()) + list(DOUBLE.values()))
def test_derived_forms_equal_the_published_shapes(case) -> None:
    # from memory: EN 1995-1-1:2004 eq. (8.6)/(8.7), unmodified: same algebra as derived
    for derived, published in ((single_shear, published_single), (double_shear, published_double)):
        mine, theirs = derived(*case), published(*case)
        for mode in mine:
            assert mine[mode] == pytest.approx(theirs[mode], rel=REL_ALGEBRA), mode


def _plies_with_hinges(joint: Joint, result: Collapse) -> list[str]:
    starts = joint.ply_starts()
    names = []
    for h in result.mechanism.hinges:
        j = int(np.searchsorted(starts, h.z, side="right")) - 1
        names.append(joint.plies[j].name)
    return names


# mode: (plies at full bearing, plies holding a hinge)
SINGLE_MECHANISM = {
    "a": ({"m1"}, []),
    "b": ({"m2"}, []),
    "c": ({"m1", "m2"}, []),
    "d": ({"m1"}, ["m2"]),
    "e": ({"m2"}, ["m1"]),
    "f": (set(), ["m1", "m2"]),
}
DOUBLE_MECHANISM = {
    "g": ({"out-1", "out-2"}, []),
    "h": ({"mid"}, []),
    "j": ({"out-1", "out-2"}, ["mid", "mid"]),
    "k": (set(), ["out-1", "mid", "mid", "out-2"]),
}


def _check(
    mode: str,
    modes: dict[str, float],
    result: Collapse,
    joint: Joint,
    expected: tuple[set[str], list[str]],
) -> None:
    ranked = sorted(modes, key=modes.get)
    assert ranked[0] == mode  # the case is built so that this mode governs
    assert modes[ranked[1]] > MARGIN * modes[mode]
    # Johansen (1949), mode as derived in the module docstring
    assert result.load == pytest.approx(modes[mode], rel=REL_JOHANSEN)
    # static theorem: the LP's field is admissible, so never above the collapse load
    assert result.load <= modes[mode] * (1 + REL_SOLVER)
    bearing, hinged = expected
    assert {name for _, name in result.mechanism.bearing} == bearing
    assert _plies_with_hinges(joint, result) == hinged
    assert result.mechanism.planes == ()


@pytest.mark.parametrize("mode", list(SINGLE))
def test_single_shear_mode(mode: str) -> None:
    t1, t2, q1, q2, my = SINGLE[mode]
    joint = _single(t1, t2)
    result = _run(joint, [q1, q2], my)
    _check(mode, single_shear(t1, t2, q1, q2, my), result, joint, SINGLE_MECHANISM[mode])


@pytest.mark.parametrize("mode", list(DOUBLE))
def test_double_shear_mode(mode: str) -> None:
    t1, t2, q1, q2, my = DOUBLE[mode]
    joint = _double(t1, t2)
    result = _run(joint, [q1, q2, q1], my)
    _check(mode, double_shear(t1, t2, q1, q2, my), result, joint, DOUBLE_MECHANISM[mode])


@pytest.mark.parametrize(("mode", "member"), [("d", 2), ("f", 1), ("f", 2)])
def test_hinge_sits_where_the_shear_vanishes(mode: str, member: int) -> None:
    t1, t2, q1, q2, my = SINGLE[mode]
    joint = _single(t1, t2)
    result = _run(joint, [q1, q2], my)
    force = single_shear(t1, t2, q1, q2, my)[mode]
    # derived above: the hinge is F/q_i from the plane, where V = 0
    at = t1 + force / q2 if member == 2 else t1 - force / q1
    element = (t2 if member == 2 else t1) / result.elements
    assert min(abs(h.z - at) for h in result.mechanism.hinges) == pytest.approx(0.0, abs=element)
