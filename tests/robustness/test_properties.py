"""Properties of the solver over random valid joints (hypothesis).

Random stacks of 2 to 30 plies, thicknesses across three orders of magnitude
(0.5 to 500 mm, the ratio of any two at most 1000), 2 to 4 members, loose
fillers, gaps, loads in x and y, free or clamped ends, single bolts and rows
of 2 to 4 bolts (members entering before or after the row), in the kN-mm and
the kip-in systems. The properties:

* every result of every bolt is finite;
* statics of a row: each member's bearings, summed over the bolts, balance its
  load (a support's take the rest);
* the equilibrium residual is at round-off (below 1e-6 of the load), or the
  solution says it is ill-conditioned;
* a determinate stack (one ply per member, one support) gives the shears of
  statics;
* the results do not depend on the unit system (the same joint written in
  kN-mm and in kip-in through the exact conversions 1 in = 25.4 mm and
  1 kip = 4.4482216152605 kN; lengths are drawn on a 1/256 in grid so that
  both hold the same lengths to the bit);
* mirroring the stack (head ↔ nut, :meth:`Joint.mirrored`) reverses the order
  of the planes and the sign of their shears (V is the force the plies on the
  head side receive from the bolt, and the head side becomes the nut side).

``PLYSHEAR_PROPERTY_EXAMPLES`` sets the number of examples per property
(default 30, the CI run).
"""

from __future__ import annotations

import math
import os
from typing import Any

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

import plyshear
from plyshear.model import modelfile

EXAMPLES = int(os.environ.get("PLYSHEAR_PROPERTY_EXAMPLES", "30"))
SETTINGS = settings(
    max_examples=EXAMPLES, deadline=None, suppress_health_check=[HealthCheck.too_slow]
)

MM_PER_IN = 25.4
KN_PER_KIP = 4.4482216152605
MPA_PER_KSI = 4448.2216152605 / 645.16
#: The solver's threshold for flagging an ill-conditioned solution.
RESIDUAL_ROUNDOFF = 1e-6
#: Same joint in two unit systems: the inputs differ by one rounding of the
#: conversion, amplified by the conditioning of the stack.
REL_UNITS = 1e-7
#: Mirror image: the same equations in reverse order.
REL_MIRROR = 1e-7
#: Statics of a determinate stack: round-off of the load.
REL_STATICS = 1e-8
T_MIN, T_MAX = 0.5, 500.0


@st.composite
def joints(draw: Any, determinate: bool = False) -> dict[str, Any]:
    """A valid model (as parsed TOML, kN-mm) with its stack drawn at random.

    A determinate stack has one bolt; the others are a bolt row one time in two.
    """
    n = draw(st.integers(2, 30))
    lo = draw(st.floats(math.log10(T_MIN), math.log10(T_MAX) - 1.0))
    span = draw(st.floats(1.0, min(3.0, math.log10(T_MAX) - lo)))  # ratio ≤ 1000
    t = [_dyadic_mm(10 ** draw(st.floats(lo, lo + span))) for _ in range(n)]
    if determinate:
        n_members = n
        owner: list[int | None] = list(range(n))
        for j in range(n):
            if n_members > 2 and draw(st.floats(0, 1)) < 0.15:
                owner[j] = None  # a loose filler
        names = [j for j in owner if j is not None]
        if len(names) < 2:
            owner = list(range(n))
            names = list(range(n))
    else:
        n_members = draw(st.integers(2, min(4, n)))
        owner = [
            draw(
                st.one_of(st.none(), st.integers(0, n_members - 1))
                if n > n_members
                else st.integers(0, n_members - 1)
            )
            for _ in range(n)
        ]
        for m in range(n_members):  # every member owns a ply
            owner[m] = m
        names = list(range(n_members))
    support = draw(st.sampled_from(sorted(set(names))))
    plies = []
    for j in range(n):
        ply: dict[str, Any] = {"name": f"p{j}", "thickness": t[j], "fy": 355.0, "fu": 490.0}
        if owner[j] is not None:
            ply["member"] = f"m{owner[j]}"
        if j > 0 and draw(st.floats(0, 1)) < 0.2:
            ply["gap"] = _dyadic_mm(draw(st.floats(0.1, 20.0)))
        plies.append(ply)
    members: dict[str, Any] = {}
    for m in sorted(set(names)):
        if m == support:
            members[f"m{m}"] = {"support": True}
        else:
            fx = draw(st.floats(-500, 500).filter(lambda v: abs(v) > 1))
            fy = draw(st.floats(-500, 500))
            members[f"m{m}"] = {"load": [fx, fy]}
    out: dict[str, Any] = {
        "format": 1,
        "units": "kN-mm",
        "bolt": {
            "diameter": draw(st.sampled_from([0.625, 0.75, 0.875, 1.0, 1.125])) * MM_PER_IN,
            "grade": "8.8",
            "threads": "excluded",
            "ends": draw(st.sampled_from(["free", "clamped"])),
        },
        "ply": plies,
        "member": members,
        "analysis": {"elements_per_ply": draw(st.integers(2, 8))},
    }
    count = 1 if determinate else draw(st.sampled_from([1, 1, 1, 2, 3, 4]))
    if count > 1:
        out["pattern"] = {"count": count, "pitch": _dyadic_mm(draw(st.floats(40.0, 120.0)))}
        for ply in plies:
            ply["width"] = _dyadic_mm(draw(st.floats(50.0, 300.0)))
        for member in members.values():
            member["enters"] = draw(st.sampled_from(["before", "after"]))
    return out


def _dyadic_mm(mm: float) -> float:
    """The nearest multiple of 1/256 in, in mm, as the loader converts it (``in * 25.4``).

    Lengths on this grid are exact in inches, so the kN-mm and the kip-in model of
    a joint hold bit-identical lengths in mm: the same mesh (the element count of
    a ply is an integer function of its thickness).
    """
    return max(1, round(mm / MM_PER_IN * 256)) / 256 * MM_PER_IN


def in_kip_in(data: dict[str, Any]) -> dict[str, Any]:
    """The same model written in kip-in (exact conversions)."""
    out = {**data, "units": "kip-in", "bolt": {**data["bolt"]}}
    out["bolt"]["diameter"] = data["bolt"]["diameter"] / MM_PER_IN
    if "pattern" in data:
        out["pattern"] = {**data["pattern"], "pitch": data["pattern"]["pitch"] / MM_PER_IN}
    out["ply"] = []
    for p in data["ply"]:
        q = {
            **p,
            "thickness": p["thickness"] / MM_PER_IN,
            "fy": p["fy"] / MPA_PER_KSI,
            "fu": p["fu"] / MPA_PER_KSI,
        }
        for key in ("gap", "width"):
            if key in p:
                q[key] = p[key] / MM_PER_IN
        out["ply"].append(q)
    out["member"] = {
        k: ({**v, "load": [f / KN_PER_KIP for f in v["load"]]} if "load" in v else v)
        for k, v in data["member"].items()
    }
    return out


def shears(sol: Any) -> np.ndarray:
    """Plane shears of every bolt, shape (bolts, planes, 2)."""
    return np.array([[p.shear_xy for p in b.planes] for b in sol.bolts])


def max_moments(sol: Any) -> np.ndarray:
    return np.array([b.max_moment for b in sol.bolts])


def load_scale(joint: Any) -> float:
    return max(math.hypot(*m.load) for m in joint.members)


def assert_sound(sol: Any) -> None:
    for b in sol.bolts:
        for arr in (b.V, b.M, b.w):
            assert np.all(np.isfinite(arr))
    assert np.all(np.isfinite(shears(sol)))
    assert math.isfinite(sol.equilibrium_residual)
    ill = any("ill-conditioned" in w for w in sol.warnings)
    assert sol.equilibrium_residual < RESIDUAL_ROUNDOFF or ill, sol.equilibrium_residual


@SETTINGS
@given(joints())
def test_results_are_finite_and_in_equilibrium(data: dict[str, Any]) -> None:
    joint = modelfile.from_dict(data)
    sol = plyshear.solve(joint)
    assert_sound(sol)
    # statics: a loaded member's plies take, over all bolts, the member's load back
    scale = load_scale(joint)
    for m in joint.members:
        if m.support:
            continue
        taken = sum(
            np.array(pb.force_xy)
            for b in sol.bolts
            for pb in b.plies
            if joint.plies[pb.ply].member == m.name
        )
        assert taken == pytest.approx(
            -np.array(m.load), rel=RESIDUAL_ROUNDOFF, abs=RESIDUAL_ROUNDOFF * scale
        )


@SETTINGS
@given(joints(determinate=True))
def test_a_determinate_stack_gives_statics(data: dict[str, Any]) -> None:
    joint = modelfile.from_dict(data)
    sol = plyshear.solve(joint)
    assert_sound(sol)
    # bearing on each ply from the bolt: minus its member's load; zero on a filler;
    # the support's ply takes the rest
    bearing = np.zeros((len(joint.plies), 2))
    for j, ply in enumerate(joint.plies):
        if ply.member is not None:
            bearing[j] = -np.array(joint.member(ply.member).load)
    held = [
        j
        for j, p in enumerate(joint.plies)
        if p.member is not None and joint.member(p.member).support
    ]
    assert len(held) == 1
    bearing[held[0]] = -bearing.sum(axis=0)
    statics = np.cumsum(bearing, axis=0)[:-1]  # V at plane k: plies 0..k on the head side
    assert shears(sol)[0] == pytest.approx(
        statics, rel=REL_STATICS, abs=REL_STATICS * load_scale(joint)
    )


@SETTINGS
@given(joints())
def test_results_do_not_depend_on_the_unit_system(data: dict[str, Any]) -> None:
    metric = modelfile.from_dict(data)
    inch = modelfile.from_dict(in_kip_in(data))
    a, b = plyshear.solve(metric), plyshear.solve(inch)
    scale = load_scale(metric)
    assert shears(b) == pytest.approx(shears(a), rel=REL_UNITS, abs=REL_UNITS * scale)
    assert max_moments(b) == pytest.approx(
        max_moments(a), rel=REL_UNITS, abs=REL_UNITS * scale * T_MIN
    )
    # and the JSON in each system's own units converts back
    ja, jb = a.to_dict(), b.to_dict()
    va = np.array([p["shear_xy"] for b in ja["bolts"] for p in b["planes"]])
    vb = np.array([p["shear_xy"] for b in jb["bolts"] for p in b["planes"]]) * KN_PER_KIP
    assert vb == pytest.approx(va, rel=REL_UNITS, abs=REL_UNITS * scale / 1000.0)


@SETTINGS
@given(joints())
def test_mirroring_the_stack_reverses_the_planes(data: dict[str, Any]) -> None:
    joint = modelfile.from_dict(data)
    mirror = joint.mirrored()
    assert [p.name for p in mirror.plies] == [p.name for p in reversed(joint.plies)]
    assert mirror.grip == pytest.approx(joint.grip, rel=1e-12)
    a, b = plyshear.solve(joint), plyshear.solve(mirror)
    assert_sound(b)
    scale = load_scale(joint)
    assert shears(b) == pytest.approx(-shears(a)[:, ::-1], rel=REL_MIRROR, abs=REL_MIRROR * scale)
    assert max_moments(b) == pytest.approx(
        max_moments(a), rel=REL_MIRROR, abs=REL_MIRROR * scale * T_MIN
    )


def test_max_moment_is_continuous_in_the_thickness() -> None:
    data = {
        "format": 1,
        "units": "kN-mm",
        "bolt": {"diameter": 20.0, "grade": "8.8", "threads": "excluded"},
        "ply": [
            {"name": "a", "member": "a", "thickness": 1.0, "fy": 355.0, "fu": 490.0},
            {"name": "b", "member": "b", "thickness": 1.0, "fy": 355.0, "fu": 490.0},
        ],
        "member": {"a": {"support": True}, "b": {"load": 2.0}},
        "analysis": {"elements_per_ply": 2},
    }
    a = plyshear.solve(modelfile.from_dict(data))
    for ply in data["ply"]:
        ply["thickness"] = math.nextafter(1.0, 0.0)
    b = plyshear.solve(modelfile.from_dict(data))
    assert b.bolts[0].max_moment == pytest.approx(a.bolts[0].max_moment, rel=1e-3)
