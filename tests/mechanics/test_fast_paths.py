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
import pytest

import plyshear
from plyshear.mechanics import loadpath
from plyshear.mechanics.strengths import strengths
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
    members = tuple(m if m.support else dataclasses.replace(m, load=(next(it), 0.0))
                    for m in joint.members)
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
