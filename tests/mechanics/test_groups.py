"""Bolt rows: the load share between bolts against hand-derived compatibility solutions.

References:
    Compatibility of a lap joint with equal bolt springs k_b and elastic plates of
    axial stiffness k_A, k_B per pitch (derived here from statics and compatibility):
    two bolts, load entering plate A at bolt 1 and leaving plate B after bolt 2,
    F1/F2 = (1 + k_b/k_A)/(1 + k_b/k_B).
    Tate & Rosenfeld, NACA TN 1051 (1946) (from memory): three equal bolts, equal
    plates, r = k_b/k_plate: end bolts carry P(1 + r)/(3 + 2r), the middle bolt the rest.
"""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest

import plyshear
from plyshear.codes.common import bolt_loads
from plyshear.model import modelfile
from tests.conftest import MODELS

REL_ROUNDOFF = 1e-9  # the group is the same spring network as the hand solution
REL_RIGID = 1e-4  # plates 1e6 times stiffer than the bolts: the share is equal to ~1e-6

LAP = """\
format = 1
units = "N-mm"
[bolt]
diameter = 20
grade = "8.8"
threads = "excluded"
{pattern}
[[ply]]
name = "a"
member = "a"
thickness = {ta}
fy = 355
fu = 490
width = {wa}
E = {ea}
[[ply]]
name = "b"
member = "b"
thickness = {tb}
fy = 355
fu = 490
width = {wb}
E = {eb}
[member.a]
load = 100000
enters = "before"
[member.b]
support = true
enters = "after"
"""
PITCH = 60.0


def _lap(
    n: int,
    ta: float = 10.0,
    tb: float = 10.0,
    wa: float = 100.0,
    wb: float = 100.0,
    ea: float = 210000.0,
    eb: float = 210000.0,
) -> plyshear.Joint:
    pattern = f"[pattern]\ncount = {n}\npitch = {PITCH}" if n > 1 else ""
    return modelfile.loads(LAP.format(pattern=pattern, ta=ta, tb=tb, wa=wa, wb=wb, ea=ea, eb=eb))


def _bolt_spring(**kw: float) -> float:
    """k_b: one bolt of the same stack, load over slip (plate B held)."""
    sol = plyshear.solve(_lap(1, **kw))
    member_a = next(m for m in sol.members if sol.joint.members[m.member].name == "a")
    return 100000.0 / member_a.displacement_xy[0]


def _bearing_a(sol: plyshear.Solution) -> np.ndarray:
    return np.array([b.plies[0].force for b in sol.bolts])


@pytest.mark.parametrize(("ta", "tb"), [(10.0, 10.0), (20.0, 8.0), (6.0, 16.0)])
def test_two_bolt_lap_matches_the_compatibility_solution(ta: float, tb: float) -> None:
    kb = _bolt_spring(ta=ta, tb=tb)
    ka, kbb = 210000.0 * ta * 100.0 / PITCH, 210000.0 * tb * 100.0 / PITCH
    # compatibility (module docstring): F1/F2 = (1 + kb/kA)/(1 + kb/kB), F1 + F2 = P
    f1 = 100000.0 * (1 + kb / ka) / (2 + kb / ka + kb / kbb)
    forces = _bearing_a(plyshear.solve(_lap(2, ta=ta, tb=tb)))
    assert forces == pytest.approx([f1, 100000.0 - f1], rel=REL_ROUNDOFF)


def test_three_bolt_lap_matches_tate_and_rosenfeld() -> None:
    kb = _bolt_spring()
    r = kb / (210000.0 * 10.0 * 100.0 / PITCH)
    # from memory: Tate & Rosenfeld (1946), end bolts P(1 + r)/(3 + 2r)
    end = 100000.0 * (1 + r) / (3 + 2 * r)
    forces = _bearing_a(plyshear.solve(_lap(3)))
    assert forces == pytest.approx([end, 100000.0 - 2 * end, end], rel=REL_ROUNDOFF)
    assert forces[0] > forces[1]  # the end bolts carry more


def _chain(n: int, kb: float, ka: float, kbb: float) -> np.ndarray:
    """Bolt forces of n bolts as springs kb between two bars (segments ka, kbb).

    The compatibility solution of the discrete lap joint (the module docstring's
    model): P enters plate a at bolt 1, plate b is held past bolt n.
    """
    k = np.zeros((2 * n, 2 * n))  # a_0..a_{n-1}, b_0..b_{n-1}

    def spring(i: int, j: int, stiffness: float) -> None:
        k[np.ix_([i, j], [i, j])] += stiffness * np.array([[1.0, -1.0], [-1.0, 1.0]])

    for i in range(n - 1):
        spring(i, i + 1, ka)
        spring(n + i, n + i + 1, kbb)
    for i in range(n):
        spring(i, n + i, kb)
    f = np.zeros(2 * n)
    f[0] = 100000.0
    free = list(range(2 * n - 1))  # b_{n-1} held
    u = np.zeros(2 * n)
    u[free] = np.linalg.solve(k[np.ix_(free, free)], f[free])
    return kb * (u[:n] - u[n:])


def test_stiffer_plate_unloads_the_end_where_it_enters() -> None:
    # plate a (twice as stiff) enters at bolt 1: the compatibility solution of the
    # four-bolt chain, with the bolt's own spring from a one-bolt solve
    kb = _bolt_spring(ta=20.0, tb=10.0)
    ka, kbb = 210000.0 * 20.0 * 100.0 / PITCH, 210000.0 * 10.0 * 100.0 / PITCH
    forces = _bearing_a(plyshear.solve(_lap(4, ta=20.0, tb=10.0)))
    assert forces == pytest.approx(_chain(4, kb, ka, kbb), rel=REL_ROUNDOFF)
    assert forces[0] < forces[-1]  # and so bolt 1 carries less than bolt 4


def test_rigid_plates_share_equally() -> None:
    forces = _bearing_a(plyshear.solve(_lap(5, ea=2.1e11, eb=2.1e11)))
    # statics with rigid plates and equal bolts: P/n each
    assert forces == pytest.approx(np.full(5, 100000.0 / 5), rel=REL_RIGID)


def test_balanced_double_cover_splice_is_symmetric() -> None:
    text = LAP.format(
        pattern=f"[pattern]\ncount = 5\npitch = {PITCH}",
        ta=20,
        tb=10,
        wa=100,
        wb=100,
        ea=210000,
        eb=210000,
    )
    # a second cover of the same plate makes b's pair as stiff as a (2 x 10 = 20 mm)
    text = text.replace(
        "[member.a]",
        '[[ply]]\nname = "b2"\nmember = "b"\nthickness = 10\n'
        "fy = 355\nfu = 490\nwidth = 100\n[member.a]",
    )
    joint = modelfile.loads(text)
    # put a in the middle: b / a / b2
    joint = dataclasses.replace(joint, plies=(joint.plies[1], joint.plies[0], joint.plies[2]))
    loads = bolt_loads(plyshear.solve(joint))
    assert loads == pytest.approx(loads[::-1], rel=1e-9)  # symmetry of the row
    assert loads[0] > loads[2]


def test_example_row_statics_and_segments() -> None:
    joint = plyshear.load_model(MODELS / "splice-six-bolts.toml")
    sol = plyshear.solve(joint)
    assert len(sol.bolts) == 6
    assert sol.equilibrium_residual < 1e-9
    # statics: the chord's bearings over all bolts add up to its load
    chord = [j for j, p in enumerate(joint.plies) if p.member == "chord"][0]
    total = sum(b.plies[chord].force for b in sol.bolts)
    assert total == pytest.approx(900e3, rel=1e-9)
    # statics: the chord's segment force between bolts k and k+1 is what is left to
    # transfer beyond bolt k
    seg = sol.segment_forces[:, chord, 0]
    left = 900e3 - np.cumsum([b.plies[chord].force for b in sol.bolts])[:-1]
    assert np.abs(seg) == pytest.approx(left, rel=1e-9)


def test_row_cost_is_a_banded_system() -> None:
    from plyshear.mechanics.assembly import layout

    small = layout(_lap(4))
    large = layout(_lap(8))
    assert large.bw == small.bw  # bandwidth fixed by one station, not by the row
    assert large.na == pytest.approx(2 * small.na, rel=0.01)
