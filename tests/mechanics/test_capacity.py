"""The incremental analysis (``plyshear.mechanics.incremental``) against its limits.

With an elastic bolt (``[analysis] bolt = "elastic"``) the nonlinear solver must
reduce to the linear solve when the bearing law is linear and unbounded, reach
the max-flow plastic bound when every ply is ductile and the bolt ample, never
exceed that bound, trace a monotone load–slip curve with
quadratically converging Newton steps, and model the hole clearance as a gap
(kinematics: a ply carries nothing until its gap is closed).
"""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import plyshear
from plyshear.mechanics import capacity, incremental, laws, loadpath
from plyshear.mechanics.assembly import ply_moduli
from plyshear.mechanics.strengths import Strengths, strengths
from plyshear.model import modelfile
from tests.conftest import FORK, MODELS

EXAMPLES = sorted(MODELS.glob("*.toml"))
HUGE = 1e15  # N and N·mm: a strength no state of these joints comes near

# The capacity analysis solves to TOL_FORCE = 1e-9 of the load and adds
# GAP_STIFFNESS = 1e-8 of k0 to every bearing spring (also in contact), so a
# linear law reproduces the linear solve to about 1e-8, not to round-off.
REL_LINEAR = 1e-8
# The end event is bracketed by bisection down to BISECT_TOL = 1e-7 of the
# generalised displacement (the load is proportional to it under a linear law),
# with Newton's 1e-9 residual on top.
REL_BISECTION = 2e-7
# At the first ply's deformation limit (1/4 in) the other plies may still have
# portions below their yield deformation q_y/k, which carry less than q_y; in
# these stiff-bolt, symmetric stacks that shortfall is far below 1 %.
REL_PLASTIC = 1e-2
# Quadratic convergence: residuals are normalised by the load, so Newton's bound
# r_{k+1} <= (beta/2) r_k^2 has a dimensionless beta ~ (deformation at the load)
# / (deformation scale of the curve's nonlinearity) = O(1) here. A merely linearly
# converging iteration (rate >= 0.1) from r_1 ~ 1e-3 would give r_2/r_1^2 >= 100.
C_QUADRATIC = 1.0
# Below this a residual is round-off (the converged states sit at 1e-15..1e-13).
RESIDUAL_ROUNDOFF = 1e-12
# A loaded state, as opposed to one carried by the tiny gap regularisation.
REL_LOADED = 1e-6


def _stack(
    members: list[str],
    thick: list[float],
    law: str,
    *,
    clearance: str = "fitted",
    hole_clearance: float | None = None,
    ends: str = "free",
    elements: int = 4,
    bolt: str = "elastic",
) -> str:
    """Model text: M20 8.8 pin (no threads), member a held, member b pulled by 100 kN."""
    lines = [
        "format = 1",
        'units = "N-mm"',
        "[bolt]",
        "diameter = 20",
        'grade = "8.8"',
        'threads = "excluded"',
        f'ends = "{ends}"',
        "[analysis]",
        f'bearing = "{law}"',
        f"elements_per_ply = {elements}",
        f'clearance = "{clearance}"',
        f'bolt = "{bolt}"',
    ]
    if hole_clearance is not None:
        lines.append(f"hole_clearance = {hole_clearance!r}")
    for j, (m, t) in enumerate(zip(members, thick, strict=True)):
        lines += [
            "[[ply]]",
            f'name = "{m}{j}"',
            f'member = "{m}"',
            f"thickness = {t!r}",
            "fy = 355",
            "fu = 490",
        ]
    lines += ["[member.a]", "support = true", "[member.b]", "load = 100000"]
    return "\n".join(lines) + "\n"


def _fork(law: str, extra: str = "", bolt: str = "elastic") -> plyshear.Joint:
    return modelfile.loads(FORK + f'[analysis]\nbearing = "{law}"\nbolt = "{bolt}"\n{extra}')


def _with_law(joint: plyshear.Joint, law: str, bolt: str = "elastic") -> plyshear.Joint:
    analysis = dataclasses.replace(joint.analysis, bearing=law, bolt=bolt)
    return dataclasses.replace(joint, analysis=analysis)


def _scaled(joint: plyshear.Joint, load: float) -> plyshear.Joint:
    """The joint with its load pattern scaled to magnitude ``load`` (Σ|P_m| along the axis)."""
    axis = joint.load_axis()
    total = sum(abs(float(np.dot(m.load, axis))) for m in joint.members)
    f = load / total
    return dataclasses.replace(
        joint,
        members=tuple(
            dataclasses.replace(m, load=(m.load[0] * f, m.load[1] * f)) for m in joint.members
        ),
    )


def _ample(joint: plyshear.Joint) -> Strengths:
    """Strengths no plane or bolt section reaches: only the plies can fail."""
    s = strengths(joint)
    return dataclasses.replace(s, plane=np.full(s.plane.size, HUGE), fyb=HUGE, fub=HUGE)


def _uncapped(joint: plyshear.Joint) -> Strengths:
    """The joint's strengths with its bearing laws as published, not capped at a strength."""
    return dataclasses.replace(strengths(joint), curves=tuple(_curves(joint)))


def _curves(joint: plyshear.Joint) -> list[laws.BearingCurve]:
    name = capacity.law_name(joint)
    return [
        laws.curve(name, joint.bolt, p, float(k))
        for p, k in zip(joint.plies, ply_moduli(joint), strict=True)
    ]


def _regularisation(joint: plyshear.Joint) -> float:
    """Relative force the gap regularisation can add above a ply's bearing strength.

    The solver adds GAP_STIFFNESS·k0·s to the contact force q(δ), s ≤ δ_limit + gap.
    """
    gap = max(np.max(g) for g in capacity.clearances(joint))
    return max(
        incremental.GAP_STIFFNESS * cv.k0 * (cv.delta_limit + gap) / cv.q_max
        for cv in _curves(joint)
    )


def _q_y(joint: plyshear.Joint) -> list[float]:
    # AISC 360-22 J3.10(a), the elastic-plastic law's yield: 2.4 d t Fu per ply
    return [laws.C_BEARING * joint.bolt.diameter * p.fu * p.thickness for p in joint.plies]


# -- a linear law is the linear solve ---------------------------------------------------


@pytest.mark.parametrize("path", EXAMPLES, ids=lambda p: p.stem)
def test_linear_law_reproduces_the_linear_solution(path) -> None:
    joint = _with_law(plyshear.load_model(path), "component")
    result = capacity.analyse(joint, strength=_uncapped(joint))
    loaded = [s for s in result.history if s.load > 0.0]
    assert len(loaded) >= 5
    # the first step, one midway and the event (a solve each)
    for state in (loaded[0], loaded[len(loaded) // 2], loaded[-1]):
        # a linear solution is proportional: solve the joint scaled to this load
        bolt = plyshear.solve(_scaled(joint, state.load)).bolts[0]
        shear = np.array([p.shear for p in bolt.planes])
        bearing = np.array([p.force for p in bolt.plies])
        assert state.plane_shear[0] == pytest.approx(
            shear, rel=REL_LINEAR, abs=REL_LINEAR * shear.max()
        )
        assert state.ply_bearing[0] == pytest.approx(
            bearing, rel=REL_LINEAR, abs=REL_LINEAR * bearing.max()
        )


def test_linear_law_summary_elastic_is_nonlinear() -> None:
    summary = capacity.summarize(_fork("component"))
    assert summary.elastic.event != "ply bearing pressure"  # the pin governs this fork
    assert summary.nonlinear.load == pytest.approx(summary.elastic.load, rel=REL_BISECTION)
    assert (summary.nonlinear.event, summary.nonlinear.where) == (
        summary.elastic.event,
        summary.elastic.where,
    )


@pytest.mark.parametrize("path", EXAMPLES, ids=lambda p: p.stem)
def test_brittle_capacity_is_the_elastic_first_failure(path) -> None:
    # a linear law and an elastic bolt cannot redistribute before the bearing's cap:
    # the end of the incremental analysis is the first event of the scaled linear
    # solution, unless that event is a ply's local pressure reaching its strength,
    # past which the capped bearing yields and the analysis goes on
    summary = capacity.summarize(_with_law(plyshear.load_model(path), "component"))
    if summary.elastic.event == "ply bearing pressure":
        assert summary.nonlinear.load >= summary.elastic.load * (1.0 - REL_BISECTION)
        return
    assert summary.nonlinear.load == pytest.approx(summary.elastic.load, rel=REL_BISECTION)
    assert summary.nonlinear.event == summary.elastic.event
    assert summary.nonlinear.where == summary.elastic.where


def test_brittle_plane_rupture_scales_the_linear_plane_shear() -> None:
    joint = _fork("component")
    sol = plyshear.solve(joint)
    strength = 0.5 * max(p.shear for p in sol.first_bolt_planes)  # a plane rupture at half the load
    lim = dataclasses.replace(
        _ample(joint),
        plane=np.full(len(sol.first_bolt_planes), strength),
        curves=_uncapped(joint).curves,
    )
    result = capacity.analyse(joint, strength=lim)
    # statics of the linear solution: the load pattern scaled until the most
    # loaded plane reaches its strength
    pattern = sum(abs(float(np.dot(m.load, joint.load_axis()))) for m in joint.members)
    expected = pattern * strength / max(p.shear for p in sol.first_bolt_planes)
    assert result.load == pytest.approx(expected, rel=REL_BISECTION)
    assert result.event.event == "plane shear rupture"


# -- ductile plies reach the plastic bound -------------------------------------------


@pytest.mark.parametrize(
    "members", [["a", "b", "a"], ["a", "b", "a", "b", "a"]], ids=["fork", "five-plies"]
)
def test_elastic_plastic_capacity_is_the_plastic_bound(members) -> None:
    thick = [10.0, 20.0, 10.0] if len(members) == 3 else [8.0, 12.0, 16.0, 12.0, 8.0]
    joint = modelfile.loads(_stack(members, thick, "elastic-plastic"))
    result = capacity.analyse(joint, strength=_ample(joint))
    bound = loadpath.plastic_bound(joint, [HUGE] * (len(members) - 1), _q_y(joint))
    assert result.load == pytest.approx(bound.load, rel=REL_PLASTIC)
    assert result.load <= bound.load * (1.0 + _regularisation(joint))
    assert result.event.event == "ply bearing deformation"
    # statics: the pulled plies (b) carry the whole load at 2.4 d t fu each
    pulled = sum(q for q, m in zip(_q_y(joint), members, strict=True) if m == "b")
    assert bound.load == pytest.approx(pulled, rel=REL_BISECTION)


@st.composite
def two_member_stacks(draw):
    n = draw(st.integers(3, 7))
    alternating = draw(st.booleans())
    if alternating:
        members = ["a" if j % 2 == 0 else "b" for j in range(n)]
    else:
        members = draw(
            st.lists(st.sampled_from("ab"), min_size=n, max_size=n).filter(
                lambda ms: "a" in ms and "b" in ms
            )
        )
    thick = draw(st.lists(st.floats(5.0, 40.0), min_size=n, max_size=n))
    law = draw(st.sampled_from(["elastic-plastic", "plate-bearing"]))
    return members, thick, law


@settings(max_examples=15, deadline=None)
@given(two_member_stacks())
def test_nonlinear_capacity_never_exceeds_the_plastic_bound(case) -> None:
    members, thick, law = case
    joint = modelfile.loads(_stack(members, thick, law))
    summary = capacity.summarize(joint)
    # the max-flow bound relaxes compatibility (and the bolt's moment balance): an
    # upper bound, up to the regularisation force the solver adds to contacts
    assert summary.nonlinear.load <= summary.plastic.load * (1.0 + _regularisation(joint))


# -- the load–slip curve and Newton ---------------------------------------------------


@pytest.mark.parametrize("law", ["elastic-plastic", "plate-bearing"])
def test_load_slip_is_monotone_up_to_the_first_event(law) -> None:
    result = capacity.analyse(_fork(law))
    load = np.array([s.load for s in result.history])
    slip = np.array([s.slip for s in result.history])
    assert len(load) >= 10
    assert np.all(np.diff(slip) > 0.0)
    assert np.all(np.diff(load) > 0.0)
    assert result.peak == load[-1] == result.load


def test_newton_converges_quadratically() -> None:
    result = capacity.analyse(_fork("plate-bearing"))  # nonlinear from the first contact
    pairs = []
    for norms in result.iterations:
        # norms[0] is the previous converged state's residual, before the increment
        r = norms[1:]
        if len(norms) < 3:
            continue
        pairs += [(a, b) for a, b in zip(r, r[1:], strict=False) if b > RESIDUAL_ROUNDOFF]
    assert len(pairs) >= 10
    ratios = [b / a**2 for a, b in pairs]
    assert max(ratios) <= C_QUADRATIC


# -- hole clearance -------------------------------------------------------------------


def test_concentric_clearance_shifts_the_curve_by_the_clearance() -> None:
    clearance = 2.0
    fitted = capacity.analyse(_fork("elastic-plastic"))
    joint = _fork("elastic-plastic", f'clearance = "concentric"\nhole_clearance = {clearance}\n')
    result = capacity.analyse(joint)
    floor = REL_LOADED * result.load
    onset = next(s for s in result.history if s.load > floor)
    # kinematics: the pulled ply closes its own half clearance at least ...
    assert onset.slip >= 0.5 * clearance
    # ... and in this symmetric stack both half gaps, in series, before any load
    assert all(s.load <= floor for s in result.history if s.slip < clearance)
    # a uniform gap is a rigid shift of the fitted curve: same capacity, slip + c
    assert result.load == pytest.approx(fitted.load, rel=REL_BISECTION)
    assert result.history[-1].slip == pytest.approx(
        fitted.history[-1].slip + clearance, rel=REL_BISECTION
    )
    # symmetry: the two legs bear alike
    assert onset.ply_bearing[0][0] == pytest.approx(onset.ply_bearing[0][2], rel=REL_LINEAR)


def test_offset_hole_picks_up_load_later() -> None:
    offset, clearance = 0.5, 2.0
    text = FORK.replace('grade = "8.8"', 'grade = "8.8"\nends = "clamped"').replace(
        'name = "leg-1"', f'name = "leg-1"\nhole_offset = {offset}'
    )
    joint = modelfile.loads(
        text + '[analysis]\nbearing = "elastic-plastic"\nbolt = "elastic"\n'
        f'clearance = "offset"\nhole_clearance = {clearance}\n'
    )
    gap_plus, _ = capacity.clearances(joint)
    assert gap_plus == pytest.approx(
        [0.5 * clearance + offset, 0.5 * clearance, 0.5 * clearance], rel=REL_LINEAR
    )
    result = capacity.analyse(joint, strength=_ample(joint))
    floor = REL_LOADED * result.load
    loaded = [s for s in result.history if s.load > floor]
    first = loaded[0]
    # leg-1's hole sits 0.5 mm further along the load: nothing on it at small loads,
    # and statics put the lug's whole load on leg-2
    assert first.ply_bearing[0][0] <= floor
    assert first.ply_bearing[0][2] == pytest.approx(first.load, rel=REL_LOADED)
    assert first.deformation[0][0] == 0.0
    # it picks up load later, and ductility lets it reach its strength: the
    # offset does not lower the plastic capacity (2 legs at 2.4 d t fu)
    last = result.history[-1]
    q_y = _q_y(joint)
    assert last.ply_bearing[0][0] == pytest.approx(q_y[0], rel=REL_PLASTIC)
    bound = loadpath.plastic_bound(joint, [HUGE, HUGE], q_y)
    assert result.load == pytest.approx(bound.load, rel=REL_PLASTIC)
    # kinematics: once every ply is plastic the bolt translates, so leg-1 lags
    # leg-2's deformation limit by its offset
    limit = _curves(joint)[2].delta_limit
    assert last.deformation[0][2] == pytest.approx(limit, rel=REL_BISECTION)
    assert last.deformation[0][0] == pytest.approx(limit - offset, rel=REL_BISECTION)
