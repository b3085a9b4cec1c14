"""Properties the linear solver must have, checked against statics and symmetry.

Statics: in a stack with one ply per member, each loaded ply's bearing equals
its member's load whatever the stiffness, so every plane shear is the running
sum of the loads on one side of it (static equilibrium of the plies above the
plane). Symmetric stacks give mirror-image shears.
"""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import plyshear
from plyshear.mechanics.assembly import assemble
from plyshear.mechanics.solve import banded_matvec
from plyshear.model import modelfile
from tests.conftest import FORK, MODELS

REL_ROUNDOFF = 1e-9  # statics hold exactly; this allows round-off only
# A nearly rigid bolt on soft bearing (1 mm plies, 10 MPa springs) leaves bolt-row
# residuals of eps * |K| * |u|, far above eps * load; the solver must then warn.
RESIDUAL_WARN = 1e-6
# Statics in random stacks (0.5 mm plies beside 311 902 MPa springs, clamped ends):
# round-off times the condition number leaves ~1e-9 of the load.
REL_STATICS = 1e-8
ABS_ROUNDOFF_N = 1e-6  # N, for components that statics makes zero
REL_MESH = 1e-3  # DESIGN.md: doubling the mesh changes plane shears by < 0.1 %
RESIDUAL_MAX = 1e-10


def _determinate_text(thick, loads, support, moduli, gaps, beam, ends) -> str:
    lines = [
        "format = 1",
        'units = "N-mm"',
        "[bolt]",
        "diameter = 20",
        'grade = "8.8"',
        f'ends = "{ends}"',
        "[analysis]",
        f'beam = "{beam}"',
        "elements_per_ply = 4",
    ]
    for j, t in enumerate(thick):
        lines += [
            "[[ply]]",
            f'name = "p{j}"',
            f'member = "m{j}"',
            f"thickness = {t!r}",
            "fy = 355",
            "fu = 490",
            f"gap = {gaps[j]!r}",
        ]
        if moduli[j] is not None:
            lines.append(f"foundation_modulus = {moduli[j]!r}")
    for j, load in enumerate(loads):
        lines.append(f"[member.m{j}]")
        lines.append("support = true" if j == support else f"load = [{load[0]!r}, {load[1]!r}]")
    return "\n".join(lines) + "\n"


@st.composite
def determinate_stacks(draw):
    n = draw(st.integers(3, 8))
    thick = draw(st.lists(st.floats(0.5, 60.0), min_size=n, max_size=n))
    force = st.floats(-2e5, 2e5).filter(lambda v: abs(v) > 1.0)
    loads = draw(st.lists(st.tuples(force, force), min_size=n, max_size=n))
    support = draw(st.integers(0, n - 1))
    moduli = draw(st.lists(st.one_of(st.none(), st.floats(10.0, 1e6)), min_size=n, max_size=n))
    gaps = draw(st.lists(st.sampled_from([0.0, 0.0, 1.5, 4.0]), min_size=n, max_size=n))
    beam = draw(st.sampled_from(["timoshenko", "euler-bernoulli"]))
    ends = draw(st.sampled_from(["free", "clamped"]))
    return thick, loads, support, moduli, gaps, beam, ends


@settings(max_examples=40, deadline=None)
@given(determinate_stacks())
def test_determinate_stack_gives_statics_for_any_stiffness(case) -> None:
    thick, loads, support, *_ = case
    joint = modelfile.loads(_determinate_text(*case))
    sol = plyshear.solve(joint)
    applied = np.array([(0.0, 0.0) if j == support else loads[j] for j in range(len(thick))])
    # statics: the bolt pushes each loaded ply with minus its load, the support ply
    # with the sum of all loads; V at a plane is the sum over the plies above it.
    on_ply = -applied
    on_ply[support] = applied.sum(axis=0)
    expected = np.cumsum(on_ply, axis=0)[:-1]
    scale = np.abs(applied).max()
    for plane, ref in zip(sol.first_bolt_planes, expected, strict=True):
        assert plane.shear_xy == pytest.approx(ref, rel=REL_STATICS, abs=REL_STATICS * scale)
    assert sol.equilibrium_residual < RESIDUAL_WARN or any(
        "ill-conditioned" in w for w in sol.warnings
    )


def test_gusset_example_is_determinate() -> None:
    joint = plyshear.load_model(MODELS / "gusset-three-members.toml")
    sol = plyshear.solve(joint)
    # statics: angle-a pulls 40 kN along x, so plane 1 (below it) carries -40 kN
    assert sol.first_bolt_planes[0].shear_xy == pytest.approx(
        (-40e3, 0.0), rel=REL_ROUNDOFF, abs=ABS_ROUNDOFF_N
    )
    # statics: plane 3 is above the stiffener alone, loaded (-20, 0) kN
    assert sol.first_bolt_planes[2].shear_xy == pytest.approx(
        (-20e3, 0.0), rel=REL_ROUNDOFF, abs=ABS_ROUNDOFF_N
    )


SYMMETRIC = """\
format = 1
units = "kN-mm"
[bolt]
diameter = 30
grade = "10.9"
ends = "{ends}"
threads = "excluded"
[[ply]]
name = "a1"
member = "a"
thickness = 12
steel = "S355"
[[ply]]
name = "b1"
member = "b"
thickness = 18
steel = "S355"
gap = 2
[[ply]]
name = "a2"
member = "a"
thickness = 25
steel = "S355"
[[ply]]
name = "b2"
member = "b"
thickness = 18
steel = "S355"
[[ply]]
name = "a3"
member = "a"
thickness = 12
steel = "S355"
gap = 2
[member.a]
support = true
[member.b]
load = [300, 40]
"""


@pytest.mark.parametrize("ends", ["free", "clamped"])
def test_symmetric_stack_gives_symmetric_shears(ends: str) -> None:
    sol = plyshear.solve(modelfile.loads(SYMMETRIC.format(ends=ends)))
    v = sol.first_bolt_shears()
    m = np.array([p.moment for p in sol.first_bolt_planes])
    assert v == pytest.approx(v[::-1], rel=REL_ROUNDOFF)
    assert m == pytest.approx(m[::-1], rel=REL_ROUNDOFF)
    # symmetry and statics: the two b plies share the load equally
    b = [pb.force for pb in sol.bolts[0].plies if pb.ply in (1, 3)]
    assert b[0] == pytest.approx(b[1], rel=REL_ROUNDOFF)
    assert sum(b) == pytest.approx(np.hypot(300e3, 40e3), rel=REL_ROUNDOFF)
    assert sol.equilibrium_residual < RESIDUAL_MAX


def test_mirrored_stack_gives_mirrored_shears() -> None:
    joint = plyshear.load_model(MODELS / "lug-cheek-plates.toml")
    a = plyshear.solve(joint).first_bolt_shears()
    b = plyshear.solve(joint.mirrored()).first_bolt_shears()
    assert b == pytest.approx(a[::-1], rel=REL_ROUNDOFF)


def test_direction_of_load_does_not_change_resultants() -> None:
    joint = modelfile.loads(FORK)
    rotated = dataclasses.replace(
        joint,
        members=tuple(
            dataclasses.replace(m, load=(0.6 * m.load[0], -0.8 * m.load[0])) for m in joint.members
        ),
    )
    a, b = plyshear.solve(joint), plyshear.solve(rotated)
    assert b.first_bolt_shears() == pytest.approx(a.first_bolt_shears(), rel=REL_ROUNDOFF)
    assert b.bolts[0].max_moment == pytest.approx(a.bolts[0].max_moment, rel=REL_ROUNDOFF)


@pytest.mark.parametrize(
    "name", ["fork-four-planes.toml", "lug-cheek-plates.toml", "splice-with-filler.toml"]
)
def test_mesh_convergence(name: str) -> None:
    joint = plyshear.load_model(MODELS / name)
    coarse = plyshear.solve(joint.with_analysis(elements_per_ply=10)).first_bolt_shears()
    fine = plyshear.solve(joint.with_analysis(elements_per_ply=20)).first_bolt_shears()
    assert fine == pytest.approx(coarse, rel=REL_MESH)


def test_banded_schur_solve_equals_dense_solve() -> None:
    joint = plyshear.load_model(MODELS / "lug-cheek-plates.toml")
    sys = assemble(joint)
    na, nm = sys.B.shape
    dense_a = np.column_stack([banded_matvec(sys.ab, e) for e in np.eye(na)])
    k = np.block([[dense_a, sys.B], [sys.B.T, sys.C]])
    f = np.vstack([np.zeros((na, 2)), sys.loads])
    u = np.linalg.solve(k, f)
    sol = plyshear.solve(joint)
    member = next(i for i, m in enumerate(joint.members) if not m.support)
    assert sol.members[member].displacement_xy == pytest.approx(u[na], rel=1e-10)


def test_loose_filler_carries_no_net_force() -> None:
    sol = plyshear.solve(plyshear.load_model(MODELS / "splice-with-filler.toml"))
    filler = next(pb for pb in sol.bolts[0].plies if sol.joint.plies[pb.ply].is_filler)
    load = 30 * 4448.2216152605  # 30 kip in N
    # statics: a ply with no member is in equilibrium under the bolt alone
    assert filler.force == pytest.approx(0.0, abs=REL_ROUNDOFF * load)
    # and the bolt shear on both faces of the filler is the same
    planes = sol.first_bolt_planes
    assert planes[1].shear == pytest.approx(planes[2].shear, rel=REL_ROUNDOFF)


def test_results_scale_linearly_with_load() -> None:
    joint = modelfile.loads(FORK)
    double = dataclasses.replace(
        joint,
        members=tuple(
            dataclasses.replace(m, load=(2 * m.load[0], 2 * m.load[1])) for m in joint.members
        ),
    )
    assert plyshear.solve(double).first_bolt_shears() == pytest.approx(
        2 * plyshear.solve(joint).first_bolt_shears(), rel=REL_ROUNDOFF
    )


def test_free_end_has_zero_shear_and_moment() -> None:
    b = plyshear.solve(modelfile.loads(FORK)).bolts[0]
    load = 100e3
    # statics: nothing acts beyond the head and the nut of a free bolt
    for node in (0, -1):
        assert b.V[node] == pytest.approx((0.0, 0.0), abs=REL_ROUNDOFF * load)
        assert b.M[node] == pytest.approx((0.0, 0.0), abs=REL_ROUNDOFF * load * 40)


@settings(max_examples=60, deadline=None)
@given(
    st.lists(
        st.tuples(st.sampled_from(["a", "b", "c", None]), st.booleans()), min_size=2, max_size=8
    ),
    st.sets(st.sampled_from(["a", "b", "c"]), max_size=3),
)
def test_load_path_closed_form_agrees_with_the_networkx_graph(plies, held) -> None:
    import dataclasses

    from plyshear.mechanics import bearing, loadpath
    from plyshear.model.joint import Member

    base = modelfile.loads(FORK)
    used = sorted({m for m, _ in plies if m is not None})
    joint = dataclasses.replace(
        base,
        plies=tuple(
            dataclasses.replace(
                base.plies[0], name=f"p{i}", member=m, foundation_modulus=1e4 if bears else None
            )
            for i, (m, bears) in enumerate(plies)
        ),
        members=tuple(Member(name=m, support=m in held) for m in used),
    )
    zero_unless_set = {"component": lambda bolt, ply: ply.foundation_modulus or 0.0}
    original = dict(bearing.LAWS)
    bearing.LAWS.update(zero_unless_set)
    try:
        # networkx connected components of the bolt–ply–member graph
        assert loadpath.unreachable_members(joint) == loadpath.unreachable_members_by_graph(joint)
    finally:
        bearing.LAWS.clear()
        bearing.LAWS.update(original)
