"""The rigid-plastic collapse LP: bounds, statics by hand, symmetry, convergence, input.

References:

* Static theorem of limit analysis (from memory: B. G. Neal, *The Plastic Methods
  of Structural Analysis*): a statically admissible field gives a load no higher
  than collapse; the max-flow bound relaxes the bolt's moment equilibrium, so
  it can only be higher.
* AISC 360-22 J3.10(a): nominal bearing strength 2.4·d·t·Fu, used here as the
  line strength 2.4·d·Fu along the bolt.
* Kulak, Fisher & Struik, *Guide to Design Criteria for Bolted and Riveted
  Joints*, 2nd ed. (1987), §4.2: bolt shear strength 0.62·fub·A per plane.
* Plastic moment of a solid circle, fyb·d³/6 (from memory: any plastic-design text).
* K. W. Johansen (1949), mode (c) of a dowel rotating in two equal members
  (derived in tests/verification/test_johansen_dowel.py):
  F = q·t·(√8 − 2)/2 for equal q and t.
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import plyshear
from plyshear.mechanics import capacity, loadpath
from plyshear.mechanics.collapse import MIN_SIDES, _solve, collapse
from plyshear.model import modelfile
from plyshear.model.joint import Bolt, Joint, Member, Ply
from tests.conftest import MODELS

BEARING_FACTOR = 2.4  # AISC 360-22 J3.10(a)
SHEAR_OVER_TENSION = 0.62  # Kulak, Fisher & Struik (1987) §4.2
REL_SOLVER = 1e-7  # HiGHS' feasibility/optimality tolerances on scaled variables
REL_BISECTION = 1e-9  # the max-flow bound is bisected to 1e-12
REL_CONVERGED = 5e-3  # the brief: doubling the mesh moves the load < 0.5 %
REL_JOHANSEN = 5e-3  # the LP converges to 0.5 %

BOLT = Bolt(diameter=20.0, grade="8.8", fyb=640.0, fub=800.0, stress_area=245.0, threads="excluded")


def strengths(joint: Joint):
    """Bearing line strengths, Mp(z) and Vu(z) of a joint's bolt and plies (sources above)."""
    b = joint.bolt

    def diameter(z: np.ndarray) -> np.ndarray:
        return np.where(b.threaded_along(z), np.sqrt(4 * b.stress_area / np.pi), b.diameter)

    bearing = [BEARING_FACTOR * b.diameter * p.fu for p in joint.plies]
    return (
        bearing,
        lambda z: b.fyb * diameter(z) ** 3 / 6,
        lambda z: SHEAR_OVER_TENSION * b.fub * np.pi * diameter(z) ** 2 / 4,
    )


def _constant(v: float):
    return lambda z: np.full_like(z, v)


def _plane_z(joint: Joint) -> np.ndarray:
    """Plane positions as the linear solver's mesh puts them (mid-gap where there is one)."""
    starts = joint.ply_starts()
    gaps = np.array([p.gap for p in joint.plies])
    return starts[1:] - 0.5 * gaps[1:]


def _bound(joint: Joint, bearing, shear, nets=None) -> float:
    planes = list(shear(_plane_z(joint)))
    plies = [q * p.thickness for q, p in zip(bearing, joint.plies, strict=True)]
    return loadpath.plastic_bound(joint, planes, plies, nets).load


def _ply(
    name: str, member: str | None, t: float, gap: float = 0.0, width: float | None = None
) -> Ply:
    return Ply(name=name, member=member, thickness=t, fy=355.0, fu=490.0, gap=gap, width=width)


# -- never above the shear-only bound -------------------------------------------------


@st.composite
def stacks(draw):
    """Random stacks: 2–5 plies of members a (held), b, c (loaded along x) or fillers."""
    n = draw(st.integers(2, 5))
    owners = draw(
        st.lists(st.sampled_from(["a", "b", "c", None]), min_size=n, max_size=n).filter(
            lambda o: "a" in o and "b" in o
        )
    )
    plies = tuple(
        _ply(
            f"p{j}",
            o,
            draw(st.floats(3.0, 30.0)),
            gap=draw(st.sampled_from([0.0, 0.0, 2.5])),
            width=80.0,
        )
        for j, o in enumerate(owners)
    )
    members = [
        Member("a", support=True, enters=draw(st.sampled_from(["before", "after"]))),
        Member(
            "b",
            load=(draw(st.floats(1e3, 1e5)), 0.0),
            enters=draw(st.sampled_from(["before", "after"])),
        ),
    ]
    if "c" in owners:
        members.append(Member("c", load=(draw(st.floats(-1e5, 1e5)), 0.0)))
    stations = tuple(60.0 * i for i in range(draw(st.integers(1, 3))))
    joint = Joint(bolt=BOLT, plies=plies, members=tuple(members), stations=stations)
    bearing = draw(st.lists(st.floats(200.0, 3000.0), min_size=n, max_size=n))
    nets = [draw(st.sampled_from([math.inf, 2e4, 1e5])) for _ in range(n)]
    mp, vu = draw(st.floats(2e4, 2e6)), draw(st.floats(1e4, 2e5))
    return joint, bearing, mp, vu, nets


@settings(max_examples=20, deadline=None)
@given(stacks())
def test_collapse_never_exceeds_the_shear_only_bound(case) -> None:
    joint, bearing, mp, vu, nets = case
    if not np.any(capacity.load_pattern(joint)):
        return
    result = collapse(joint, bearing, _constant(mp), _constant(vu), nets)
    bound = _bound(joint, bearing, _constant(vu), nets)
    # static theorem: the LP's field is a feasible flow of the max-flow graph as well
    assert result.load <= bound * (1 + REL_BISECTION) + REL_SOLVER * bound


def test_thin_lap_is_far_below_the_bound_that_ignores_bending() -> None:
    joint = modelfile.loads(LAP.format(gap=0))  # 10/10 mm, M20 8.8, S355
    bearing, mp, vu = strengths(joint)
    result = collapse(joint, bearing, mp, vu)
    q, t = bearing[0], 10.0
    # Johansen mode (c), equal members: q t (√8 − 2)/2; the planes' 0.62 fub A bound ignores it
    assert result.load == pytest.approx(q * t * (math.sqrt(8) - 2) / 2, rel=REL_JOHANSEN)
    bound = _bound(joint, bearing, vu)
    assert bound == pytest.approx(SHEAR_OVER_TENSION * 800.0 * math.pi * 100.0, rel=1e-9)
    assert result.load < 0.7 * bound


LAP = """\
format = 1
units = "N-mm"
[bolt]
diameter = 20
grade = "8.8"
threads = "excluded"
[[ply]]
name = "a"
member = "a"
thickness = 10
steel = "S355"
[[ply]]
name = "b"
member = "b"
thickness = 10
steel = "S355"
gap = {gap}
[member.a]
support = true
[member.b]
load = 1000
"""


# -- statics by hand ------------------------------------------------------------------


def _pin(t_out: float = 10.0, t_mid: float = 20.0) -> Joint:
    return Joint(
        bolt=BOLT,
        plies=(_ply("o1", "fork", t_out), _ply("mid", "lug", t_mid), _ply("o2", "fork", t_out)),
        members=(Member("fork", support=True), Member("lug", load=(5e4, 0.0))),
    )


def test_double_shear_pin_that_shears_carries_two_plane_strengths() -> None:
    vu = 1.0e5
    result = collapse(_pin(), [1e5, 1e5, 1e5], _constant(math.inf), _constant(vu))
    # statics: the lug's load crosses the two planes, each at most Vu; bearing is ample
    assert result.load == pytest.approx(2 * vu, rel=REL_SOLVER)
    assert result.factor == pytest.approx(2 * vu / 5e4, rel=REL_SOLVER)
    assert result.mechanism.planes == ((0, 1), (0, 2))
    assert result.mechanism.hinges == ()


@pytest.mark.parametrize(
    ("mp", "planes", "hinges"),
    [
        (1e6, ((0, 1),), []),  # V/Vu = 0.89 > M/Mp = 0.45: the plane shears
        (3e5, (), [10.0, 20.0]),  # V/Vu = 0.51 < M/Mp = 0.86: hinges at the gap's faces
    ],
)
def test_gap_puts_moment_beside_shear_on_the_ellipse(mp, planes, hinges) -> None:
    # statics: across a gap g the shear V is constant and M = ±V g/2 at its faces
    # (antisymmetric lap, strong plies), so (V/Vu)² + (V g/(2 Mp))² = 1 there
    g, vu = 10.0, 1e5
    joint = modelfile.loads(LAP.format(gap=g))
    exact = 1.0 / math.hypot(1.0 / vu, g / (2 * mp))
    results = [
        collapse(joint, [1e5, 1e5], _constant(mp), _constant(vu), sides=s)
        for s in (16, 32, 64, 128)
    ]
    loads = [r.load for r in results]
    # nested inscribed polygons: more sides never lower the answer ...
    assert all(b >= a * (1 - REL_SOLVER) for a, b in zip(loads, loads[1:], strict=False))
    # ... each below the ellipse by at most 1 − cos(π/sides) (the docstring's bound)
    for s, load in zip((16, 32, 64, 128), loads, strict=True):
        assert exact * math.cos(math.pi / s) * (1 - REL_SOLVER) <= load
        assert load <= exact * (1 + REL_SOLVER)
    assert loads[-1] == pytest.approx(exact, rel=1 - math.cos(math.pi / 128))
    assert loads[0] < loads[-1] * (1 - 1e-3)  # the interaction does govern here
    mech = results[1].mechanism
    assert mech.planes == planes
    assert [h.z for h in mech.hinges] == pytest.approx(hinges, abs=1e-9)


def test_clamped_ends_stop_the_rotation_mode() -> None:
    joint = _pin(10.0, 12.0).with_bolt(ends="clamped")
    lap = dataclasses.replace(joint, plies=joint.plies[:2])
    q = [1000.0, 1500.0]
    free = collapse(dataclasses.replace(lap, bolt=BOLT), q, _constant(1e9), _constant(math.inf))
    held = collapse(lap, q, _constant(1e9), _constant(math.inf))
    # statics: a stiff dowel held in rotation at both ends can only translate, so each
    # ply bears at its full strength and the weaker one limits: min(q_j t_j)
    assert held.load == pytest.approx(min(1000.0 * 10, 1500.0 * 12), rel=REL_SOLVER)
    # free ends let it rotate (Johansen mode c), well below that
    assert free.load < 0.7 * held.load


def test_two_bolt_row_adds_a_net_section_to_one_bolt() -> None:
    # statics of the row: ply a enters at bolt 1, so its net section carries what
    # bolt 2 takes; ply b leaves after bolt 2, its net section carries bolt 1's share.
    # With a stiff dowel each bolt is held by ply a's bearing, q t (Johansen mode a).
    q, t, net = 1000.0, 10.0, 4000.0
    plies = (_ply("a", "a", t, width=80.0), _ply("b", "b", 40.0, width=80.0))
    joint = Joint(
        bolt=BOLT,
        plies=plies,
        stations=(0.0, 60.0),
        members=(
            Member("a", load=(1e4, 0.0), enters="before"),
            Member("b", support=True, enters="after"),
        ),
    )
    result = collapse(joint, [q, q], _constant(1e9), _constant(math.inf), [net, math.inf])
    assert result.load == pytest.approx(q * t + net, rel=REL_SOLVER)
    assert result.mechanism.net_sections == (("a", 0),)
    assert result.mechanism.bearing == ((0, "a"),)


# -- signs against the linear solver --------------------------------------------------


@pytest.mark.parametrize("name", ["fork", "lap"])
def test_bearing_and_plane_signs_agree_with_the_linear_solution(name: str) -> None:
    joint = _pin() if name == "fork" else modelfile.loads(LAP.format(gap=0))
    joint = joint.with_analysis(bearing="component")
    bearing, mp, vu = strengths(joint)
    sol = plyshear.solve(joint)
    axis = joint.load_axis()
    field = _solve(
        joint,
        16,
        np.array(bearing),
        mp,
        vu,
        np.full(len(bearing), np.inf),
        capacity.load_pattern(joint),
        32,
    )
    linear_ply = np.sign([np.dot(p.force_xy, axis) for p in sol.bolts[0].plies])
    linear_plane = np.sign([np.dot(p.shear_xy, axis) for p in sol.bolts[0].planes])
    # both follow plyshear.mechanics.results: bearing is the bolt's force on the ply,
    # the plane shear is what the plies on the head side receive
    assert np.array_equal(np.sign(field.ply_force[0]), linear_ply)
    at_planes = [field.V[0, np.argmin(np.abs(field.mesh.z - p.z))] for p in sol.bolts[0].planes]
    assert np.array_equal(np.sign(at_planes), linear_plane)


def test_bar_force_signs_agree_with_the_linear_solution() -> None:
    plies = (_ply("a", "a", 10.0, width=80.0), _ply("b", "b", 12.0, width=80.0))
    joint = Joint(
        bolt=BOLT,
        plies=plies,
        stations=(0.0, 60.0),
        members=(
            Member("a", load=(-1e5, 0.0), enters="before"),
            Member("b", support=True, enters="after"),
        ),
    )
    bearing, mp, vu = strengths(joint)
    sol = plyshear.solve(joint)
    field = _solve(
        joint, 16, np.array(bearing), mp, vu, np.full(2, np.inf), capacity.load_pattern(joint), 32
    )
    # the ply segments' forces along the load: tension positive in both
    assert np.array_equal(np.sign(field.bar), np.sign(sol.segment_forces @ joint.load_axis()))


# -- symmetry and convergence ---------------------------------------------------------


def _symmetric_fork() -> Joint:
    joint = plyshear.load_model(MODELS / "fork-four-planes.toml")
    return joint.with_bolt(threads="excluded", length=None, thread_length=None)


def test_symmetric_stack_has_a_symmetric_mechanism() -> None:
    joint = _symmetric_fork()  # 12/15/20/15/12, fork held, hanger pulled
    result = collapse(joint, *strengths(joint))
    mirror = collapse(joint.mirrored(), *strengths(joint.mirrored()))
    names = [p.name for p in joint.plies]
    nplanes = len(joint.plies) - 1
    mech = result.mechanism
    # the stack is its own mirror image: the mechanism maps onto itself
    assert {n for _, n in mech.bearing} == {names[-1 - names.index(n)] for _, n in mech.bearing}
    assert {k for _, k in mech.planes} == {nplanes + 1 - k for _, k in mech.planes}
    assert sorted(h.z for h in mech.hinges) == pytest.approx(
        sorted(joint.grip - h.z for h in mech.hinges), abs=1e-9
    )
    assert mirror.load == pytest.approx(result.load, rel=REL_SOLVER)
    assert mech.planes  # something governs (the planes next to the middle leg)


def test_doubling_the_mesh_moves_the_load_less_than_half_a_percent() -> None:
    joint = modelfile.loads(LAP.format(gap=0))
    bearing, mp, vu = strengths(joint)
    result = collapse(joint, bearing, mp, vu)
    finer = _solve(
        joint,
        2 * result.elements,
        np.array(bearing),
        mp,
        vu,
        np.full(2, np.inf),
        capacity.load_pattern(joint),
        32,
    )
    assert result.change < REL_CONVERGED
    assert finer.factor == pytest.approx(result.factor, rel=REL_CONVERGED)
    # the discretised fields are nested: a finer mesh never carries less
    assert finer.factor >= result.factor * (1 - REL_SOLVER)


# -- bad input ------------------------------------------------------------------------


def test_unbounded_bearing_is_refused() -> None:
    joint = _pin()
    with pytest.raises(ValueError, match="bearing strength of ply mid"):
        collapse(joint, [1e3, math.inf, 1e3], _constant(1e6), _constant(1e5))
    with pytest.raises(ValueError, match="bearing strength of ply o1"):
        collapse(joint, [-1.0, 1e3, 1e3], _constant(1e6), _constant(1e5))


def test_loads_in_two_directions_are_refused() -> None:
    joint = _pin()
    joint = dataclasses.replace(
        joint,
        members=(Member("fork", support=True), Member("lug", load=(5e4, 0.0)))
        + (Member("other", load=(0.0, 1e4)),),
    )
    joint = joint.with_ply(0, member="other")
    with pytest.raises(ValueError, match="not collinear"):
        collapse(joint, [1e3] * 3, _constant(1e6), _constant(1e5))


def test_no_load_is_refused() -> None:
    joint = dataclasses.replace(_pin(), members=(Member("fork", support=True), Member("lug")))
    with pytest.raises(ValueError, match="no load"):
        collapse(joint, [1e3] * 3, _constant(1e6), _constant(1e5))


def test_polygon_needs_sixteen_sides_on_the_axes() -> None:
    for sides in (MIN_SIDES - 4, 18):
        with pytest.raises(ValueError, match="sides"):
            collapse(_pin(), [1e3] * 3, _constant(1e6), _constant(1e5), sides=sides)
