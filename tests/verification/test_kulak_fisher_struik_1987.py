"""Plane strength and the max-flow plastic bound against closed forms and statics.

References:

* G. L. Kulak, J. W. Fisher and J. H. A. Struik, *Guide to Design Criteria for
  Bolted and Riveted Joints*, 2nd ed., Wiley (1987), §4.2: the shear strength of
  a bolt is 0.62 of its tensile strength, per shear plane, on the area the
  plane cuts (the stress area through threads, the gross area through the shank).
* AISC 360-22 J3.10(a): nominal bearing strength of a ply, 2.4 d t Fu.
* L. R. Ford and D. R. Fulkerson, "Maximal flow through a network", Canadian
  Journal of Mathematics 8 (1956) 399–404: max flow = min cut, so with ideal
  ductility the bound is the cheapest set of planes and plies whose failure
  separates the loaded member from the support, found here by statics.
"""

from __future__ import annotations

import itertools
import math

import pytest

import plyshear
from plyshear.mechanics import capacity, loadpath
from plyshear.model import modelfile
from tests.conftest import MODELS

# plastic_bound bisects the load scale to 1e-12 and accepts a flow 1e-12 short.
REL_MAXFLOW = 1e-9
REL_ROUNDOFF = 1e-12


def _alternating(n_plies: int, threads: str = "excluded") -> str:
    """A/B/A/B... plies of a 20 mm 8.8 pin (linear "component" law), a held, b pulled."""
    lines = [
        "format = 1",
        'units = "N-mm"',
        "[bolt]",
        "diameter = 20",
        'grade = "8.8"',
        f'threads = "{threads}"',
    ]
    for j in range(n_plies):
        m = "a" if j % 2 == 0 else "b"
        lines += [
            "[[ply]]",
            f'name = "{m}{j}"',
            f'member = "{m}"',
            "thickness = 10",
            "fy = 355",
            "fu = 490",
        ]
    lines += ["[member.a]", "support = true", "[member.b]", "load = 100000"]
    return "\n".join(lines) + "\n"


def _cheapest_cut(planes: list[float], plies: list[float], loaded: list[bool]) -> float:
    """The cheapest mechanism of a two-member stack, by trying every one.

    Each bolt segment (one per ply) goes with the loaded member or with the
    support; a loaded ply whose segment goes with the support fails in bearing,
    and so does a held ply whose segment goes with the load; a plane between
    segments on different sides shears. Ford & Fulkerson (1956): the cheapest
    such set is the max flow.
    """
    best = math.inf
    for sides in itertools.product((True, False), repeat=len(plies)):
        cost = sum(q for q, s, ld in zip(plies, sides, loaded, strict=True) if s != ld)
        cost += sum(r for r, a, b in zip(planes, sides, sides[1:], strict=False) if a != b)
        best = min(best, cost)
    return best


@pytest.mark.parametrize(("threads", "threaded"), [("excluded", False), ("included", True)])
def test_kulak_fisher_struik_4_2_plane_strength(threads, threaded) -> None:
    joint = modelfile.loads(_alternating(3, threads))
    b = joint.bolt
    area = b.stress_area if threaded else math.pi * b.diameter**2 / 4.0
    # Kulak, Fisher & Struik (1987) §4.2: 0.62 fub per plane on the area it cuts
    assert capacity.plane_strength(joint, threaded) == pytest.approx(
        0.62 * b.fub * area, rel=REL_ROUNDOFF
    )


@pytest.mark.parametrize("planes", [2, 3, 4, 5, 6])
def test_alternating_stack_bound_is_planes_times_plane_strength(planes) -> None:
    joint = modelfile.loads(_alternating(planes + 1))
    n = len(joint.plies)
    strength = capacity.plane_strength(joint, threaded=False)
    bound = loadpath.plastic_bound(joint, [strength] * planes, [math.inf] * n)
    # statics: every plane separates an a-ply from a b-ply, so all must shear
    assert bound.load == pytest.approx(planes * strength, rel=REL_MAXFLOW)
    assert bound.cut == tuple(f"plane {i}" for i in range(1, planes + 1))
    assert capacity.separating_planes(joint) == planes
    # the same through the summary, where every ply's bearing is bounded too:
    # AISC 360-22 J3.10(a), 2.4 d t Fu per ply (no edge given: bearing, not tear-out)
    summary = capacity.summarize(joint)
    q = [2.4 * joint.bolt.diameter * p.fu * p.thickness for p in joint.plies]
    loaded = [p.member == "b" for p in joint.plies]
    expected = _cheapest_cut([strength] * planes, q, loaded)
    assert summary.plastic.load == pytest.approx(expected, rel=REL_MAXFLOW)
    assert summary.efficiency(summary.plastic.load) == pytest.approx(
        expected / (planes * strength), rel=REL_MAXFLOW
    )


@pytest.mark.parametrize(
    ("q_leg1", "q_lug", "q_leg2", "r1", "r2"),
    [
        (50e3, 500e3, 60e3, 80e3, 80e3),  # both legs bear out
        (500e3, 90e3, 500e3, 80e3, 80e3),  # the lug bears out
        (500e3, 500e3, 30e3, 80e3, 70e3),  # plane 1 and leg-2
        (500e3, 500e3, 500e3, 80e3, 70e3),  # both planes
    ],
)
def test_fork_bound_is_the_cheapest_mechanism(q_leg1, q_lug, q_leg2, r1, r2) -> None:
    joint = modelfile.loads(_alternating(3))
    bound = loadpath.plastic_bound(joint, [r1, r2], [q_leg1, q_lug, q_leg2])
    # statics: the lug's load passes into leg-1 through plane 1 and into leg-2
    # through plane 2; each path carries the lesser of its plane and its leg
    expected = min(q_lug, min(r1, q_leg1) + min(r2, q_leg2))
    assert bound.load == pytest.approx(expected, rel=REL_MAXFLOW)


def test_summary_plastic_bound_of_the_fork_example() -> None:
    joint = plyshear.load_model(MODELS / "fork-four-planes.toml")
    summary = capacity.summarize(joint)
    sol = plyshear.solve(joint)
    # Kulak, Fisher & Struik (1987): 0.62 fub A, A by the thread at each plane
    r = [capacity.plane_strength(joint, p.threads) for p in sol.first_bolt_planes]
    # AISC 360-22 J3.10(a)(1): min(2.4 d t Fu, 1.2 lc t Fu), lc = edge - dh/2, with
    # dh = d + 2 mm for an M24 in a normal hole (EN 1090-2:2018 Table 11)
    d = joint.bolt.diameter
    q = [
        min(2.4 * d * p.fu, 1.2 * (p.edge - (d + 2.0) / 2.0) * p.fu) * p.thickness
        for p in joint.plies
    ]
    loaded = [not joint.members[joint.member_index()[p.member]].support for p in joint.plies]
    expected = _cheapest_cut(r, q, loaded)
    assert summary.plastic.load == pytest.approx(expected, rel=REL_MAXFLOW)
    assert summary.nonlinear.load <= summary.plastic.load


@pytest.mark.parametrize("weak", ["ply stiffener", "plane 3"])
def test_mixed_sign_pattern_bound_respects_the_opposed_member(weak) -> None:
    joint = plyshear.load_model(MODELS / "gusset-three-members.toml")
    axis = joint.load_axis()
    pattern = {m.name: float(abs(m.load[0] * axis[0] + m.load[1] * axis[1])) for m in joint.members}
    total = sum(pattern.values())
    cap = 1000.0
    planes = [math.inf, math.inf, cap if weak == "plane 3" else math.inf]
    plies = [math.inf, math.inf, math.inf, cap if weak == "ply stiffener" else math.inf]
    bound = loadpath.plastic_bound(joint, planes, plies)
    # statics: the stiffener (last ply, its own member) takes 20/95 of the pattern,
    # only through its bearing and plane 3
    assert bound.load == pytest.approx(cap * total / pattern["stiffener"], rel=REL_MAXFLOW)


def test_bound_feeds_opposed_members_when_they_outweigh_the_main_load() -> None:
    # one ply per member; a pushes 40 (the largest, the load axis), b and c pull
    # 30 each: the pulls outweigh the push, so the support supplies the rest
    plies = [("s", None), ("a", 40e3), ("b", -30e3), ("c", -30e3)]
    lines = ["format = 1", 'units = "N-mm"', "[bolt]", "diameter = 20", 'grade = "8.8"']
    for name, _ in plies:
        lines += ["[[ply]]", f'name = "{name}"', f'member = "{name}"', "thickness = 10"]
        lines += ["fy = 355", "fu = 490"]
    for name, load in plies:
        lines += [f"[member.{name}]", "support = true" if load is None else f"load = {load!r}"]
    joint = modelfile.loads("\n".join(lines) + "\n")
    cap = 1000.0
    bound = loadpath.plastic_bound(joint, [math.inf] * 3, [math.inf, math.inf, cap, math.inf])
    # statics: b takes 30/100 of the pattern, only through its own bearing
    assert bound.load == pytest.approx(cap * 100e3 / 30e3, rel=REL_MAXFLOW)
    assert bound.cut == ("ply b",)
