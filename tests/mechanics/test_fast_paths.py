"""The fast paths of the capacity analysis against the slow paths they replace.

Each optimisation is pinned against the straightforward computation it
replaced, kept here as the reference: one parametric max-flow against a
bisection of the load scale, the banded Cholesky tangent against a banded LU,
the secant search of the end event against a bisection, the vectorised
residual against a loop over plies.
"""

from __future__ import annotations

import dataclasses

import networkx as nx
import numpy as np
import pytest

import plyshear
from plyshear.mechanics import assembly, incremental, loadpath, section
from plyshear.mechanics.strengths import strengths
from plyshear.model.joint import BEARING_LAWS
from tests.conftest import MODELS

EXAMPLES = sorted(MODELS.glob("*.toml"))
# The bisection stops at 1e-12 of the scale and accepts a flow 1e-12 short.
REL_MAXFLOW = 1e-9


def _bisected_bound(graph, supply: float, total: float) -> float:
    """The shear-only bound by bisection of the load scale (the slow reference)."""

    def feasible(lam: float) -> bool:
        return nx.maximum_flow_value(graph(lam), "S", "T") >= lam * supply * (1 - 1e-12)

    lo, hi = 0.0, 1.0
    while feasible(hi):
        lo, hi = hi, hi * 2.0
    for _ in range(200):
        mid = 0.5 * (lo + hi)
        lo, hi = (mid, hi) if feasible(mid) else (lo, mid)
        if hi - lo <= 1e-12 * hi:
            break
    return lo * total


def _with_pattern(joint: plyshear.Joint, loads: list[float]) -> plyshear.Joint:
    """The joint with its free members loaded along x by ``loads`` (N, in member order)."""
    it = iter(loads)
    members = tuple(
        m if m.support else dataclasses.replace(m, load=(next(it), 0.0)) for m in joint.members
    )
    return dataclasses.replace(joint, members=members)


def _cases() -> list[tuple[str, plyshear.Joint]]:
    out = []
    for path in EXAMPLES:
        joint = plyshear.load_model(path)
        out.append((path.stem, joint))
        free = sum(not m.support for m in joint.members)
        if free > 1:  # opposed and unequal members: more than one cut can govern
            out.append((f"{path.stem}-opposed", _with_pattern(joint, [1e5, -3e4] * free)))
            out.append((f"{path.stem}-unequal", _with_pattern(joint, [2e4, 7e4] * free)))
    return out


@pytest.mark.parametrize(("name", "joint"), _cases(), ids=[c[0] for c in _cases()])
def test_one_parametric_max_flow_equals_the_bisection(name, joint) -> None:
    s = strengths(joint)
    args = (joint, list(s.plane), list(s.ply_force), list(s.net_section))
    fast = loadpath.plastic_bound(*args)
    ref = _bisected_bound(*loadpath.flow_network(*args))  # independent search of the scale
    assert fast.load == pytest.approx(ref, rel=REL_MAXFLOW)
    assert fast.cut  # the governing cut is named


# Both searches stop when the bracket of the generalised displacement is narrower
# than BISECT_TOL = 1e-7 of it, each at the bracket's upper end; the load moves
# with the displacement at most proportionally, plus Newton's 1e-9 residual.
REL_END_SEARCH = 2e-7
# Cholesky and LU of the same well-conditioned tangent: round-off only.
REL_FACTOR = 1e-10


def _analyses(path, monkeypatch):
    joint = plyshear.load_model(path)
    fast = incremental.analyse(joint)
    monkeypatch.setattr(incremental, "locate_end", incremental.bisect_end)
    slow = incremental.analyse(joint)
    return fast, slow


@pytest.mark.parametrize("path", [p for p in EXAMPLES if "six" not in p.stem], ids=lambda p: p.stem)
def test_secant_search_of_the_end_equals_the_bisection(path, monkeypatch) -> None:
    fast, slow = _analyses(path, monkeypatch)
    assert fast.load == pytest.approx(slow.load, rel=REL_END_SEARCH)
    assert (fast.event.event, fast.event.where) == (slow.event.event, slow.event.where)
    assert [(e.event, e.where) for e in fast.events] == [(e.event, e.where) for e in slow.events]
    assert len(fast.history) == len(slow.history)  # the same steps up to the end


def _tangent(joint: plyshear.Joint, slip: float):
    """The tangent (ab, B, C) of the joint's analysis model at a generalised displacement."""
    model = incremental._Model(incremental.reference_pattern(joint))
    x, y, lam, _ = incremental._newton(
        model, np.zeros(model.lay.na), np.zeros(model.lay.nm), 0.0, slip
    )
    return model.evaluate(x, y)["K"]


@pytest.mark.parametrize("slip", [1e-4, 0.3])  # elastic; bearing and bolt yielded
def test_cholesky_tangent_equals_the_banded_lu(slip) -> None:
    joint = plyshear.load_model(MODELS / "fork-four-planes.toml")
    ab, B, _ = _tangent(joint, slip)
    rhs = np.column_stack([np.random.default_rng(1).standard_normal(ab.shape[1]), B])
    fast = incremental.tangent_solve(ab, rhs)
    slow = incremental.tangent_solve_lu(ab, rhs)
    assert np.abs(fast - slow).max() <= REL_FACTOR * np.abs(slow).max()


def test_indefinite_tangent_falls_back_to_lu() -> None:
    # [[1, 2, 0], [2, 1, 1], [0, 1, 3]]: eigenvalues of both signs, so no Cholesky
    dense = np.array([[1.0, 2.0, 0.0], [2.0, 1.0, 1.0], [0.0, 1.0, 3.0]])
    ab = np.array([[0.0, 2.0, 1.0], [1.0, 1.0, 3.0]])  # upper banded storage, bandwidth 1
    rhs = np.array([[1.0], [-2.0], [0.5]])
    x = incremental.tangent_solve(ab, rhs)
    assert np.allclose(dense @ x, rhs, rtol=0.0, atol=1e-14)  # numpy's own product


def _contact_one_ply_at_a_time(model, s: np.ndarray):
    """The bearing at every Gauss point, each ply's own curve in turn (the slow reference)."""
    j = np.broadcast_to(model.ply[:, None], model.n.shape[:2]).ravel()
    p, dp, delta = np.zeros_like(s), np.zeros_like(s), np.zeros_like(s)
    for jj in np.unique(j[j >= 0]):
        sel = j == jj
        cv, g_up, g_dn = model.curves[jj], model.gap_plus[jj], model.gap_minus[jj]
        ss = s[sel]
        up, dn = ss > g_up, ss < -g_dn
        dl = np.where(up, ss - g_up, np.where(dn, ss + g_dn, 0.0))
        reg = incremental.GAP_STIFFNESS * cv.k0
        p[sel] = cv.q(dl) + reg * ss
        dp[sel] = np.where(up | dn, cv.dq(dl), 0.0) + reg
        delta[sel] = np.abs(dl)
    return p, dp, delta


@pytest.mark.parametrize("law", BEARING_LAWS)
@pytest.mark.parametrize("path", EXAMPLES, ids=lambda p: p.stem)
def test_stacked_curves_equal_one_ply_at_a_time(path, law) -> None:
    joint = plyshear.load_model(path)
    joint = dataclasses.replace(
        joint, analysis=dataclasses.replace(joint.analysis, bearing=law, clearance="concentric")
    )
    model = incremental._Model(incremental.reference_pattern(joint))
    # deformations from inside the gap to far along both curves
    s = np.random.default_rng(7).uniform(-8.0, 8.0, model.n.shape[0] * model.n.shape[1])
    for fast, slow in zip(model.contact(s), _contact_one_ply_at_a_time(model, s), strict=True):
        assert np.array_equal(fast, slow)  # the same arithmetic, point by point


def _epp_everywhere(kappa, r, E, e0):
    """The EPP circle's closed form on every section, elastic or not (the slow reference)."""
    ak = np.abs(kappa)
    inertia = np.pi * r**4 / 4.0
    with np.errstate(divide="ignore", invalid="ignore"):
        c = np.where(ak > 0.0, e0 / ak, np.inf)
    elastic = c >= r
    cc = np.where(elastic, r, c)
    root = np.sqrt(np.maximum(r * r - cc * cc, 0.0))
    J = cc / 8.0 * (2.0 * cc * cc - r * r) * root + r**4 / 8.0 * np.arcsin(np.minimum(cc / r, 1.0))
    sy = E * e0
    m_pl = 4.0 * sy * J / cc + 4.0 / 3.0 * sy * root**3
    return (
        np.where(elastic, E * inertia * kappa, np.sign(kappa) * m_pl),
        np.where(elastic, E * inertia, 4.0 * E * J),
    )


def test_plastic_sections_only_equal_the_closed_form_everywhere() -> None:
    rng = np.random.default_rng(3)
    r = np.broadcast_to(rng.uniform(8.0, 12.0, (50, 1)), (50, 3))
    e0 = 640.0 / 210000.0  # 8.8 bolt: f_yb / E
    # curvatures from zero through first yield (2 e0 / d) to deep in the plastic range
    kappa = rng.choice([-1.0, 1.0], (50, 3)) * rng.uniform(0.0, 20.0, (50, 3)) * e0 / r
    kappa[0, 0] = 0.0
    for fast, slow in zip(
        section._epp_circle(kappa, r, 210000.0, e0),
        _epp_everywhere(kappa, r, 210000.0, e0),
        strict=True,
    ):
        assert np.array_equal(fast, slow)  # the same arithmetic on each section


def test_a_cached_numbering_solves_like_a_fresh_one() -> None:
    # the same shape with other numbers: the second solve reuses the first's numbering
    joint = plyshear.load_model(MODELS / "fork-four-planes.toml")
    other = dataclasses.replace(
        joint, plies=tuple(dataclasses.replace(p, thickness=p.thickness * 1.3) for p in joint.plies)
    )
    plyshear.solve(joint)
    cached = plyshear.solve(other)
    assembly._NUMBERINGS.clear()
    fresh = plyshear.solve(other)
    assert np.array_equal(cached.first_bolt_shears(), fresh.first_bolt_shears())
    assert np.array_equal(cached.bolts[0].M, fresh.bolts[0].M)
