"""The load-path graph of a joint (networkx).

Nodes are the bolt, the plies and the members; edges are the ways force can
pass: a ply bears on the bolt (when its bearing stiffness is positive) and a
ply is tied to its member. A member that no path reaches from a support is a
mechanism: the joint is refused before any solve.
"""

from __future__ import annotations

from dataclasses import dataclass

import networkx as nx
import numpy as np

from plyshear.mechanics import bearing
from plyshear.model.joint import Joint
from plyshear.model.modelfile import ModelError

BOLT = ("bolt", 0)


def load_path_graph(joint: Joint) -> nx.Graph:
    """Return the undirected graph of bolt, plies and members.

    Nodes are tuples ``("bolt", 0)``, ``("ply", j)`` (0-based) and
    ``("member", name)``; ply nodes carry the ply name.
    """
    g = nx.Graph()
    g.add_node(BOLT)
    for m in joint.members:
        g.add_node(("member", m.name), support=m.support)
    for j, ply in enumerate(joint.plies):
        node = ("ply", j)
        g.add_node(node, name=ply.name)
        if bearing.modulus(joint.analysis.bearing, joint.bolt, ply) > 0.0:
            g.add_edge(node, BOLT)
        if ply.member is not None:
            g.add_edge(node, ("member", ply.member))
    return g


def unreachable_members(joint: Joint) -> list[str]:
    """Return the names of members that no load path connects to a support."""
    g = load_path_graph(joint)
    held = [("member", m.name) for m in joint.members if m.support]
    reached: set[tuple[str, object]] = set()
    for node in held:
        reached |= nx.node_connected_component(g, node)
    return [m.name for m in joint.members if ("member", m.name) not in reached]


def require_load_path(joint: Joint) -> None:
    """Refuse a joint that is a mechanism.

    Raises:
        ModelError: Naming the first member no path reaches from a support.
    """
    if not any(m.support for m in joint.members):
        raise ModelError(joint.source or "<model>", "member",
                         "no supported member; mark at least one with support = true")
    lost = unreachable_members(joint)
    if lost:
        raise ModelError(joint.source or "<model>", f"member.{lost[0]}",
                         "is a mechanism: no path of plies and bolt reaches it from a support")


@dataclass(frozen=True)
class PlasticBound:
    """The ideal-ductility capacity of the load path.

    Attributes:
        load: Magnitude of the load pattern that the path can carry, N.
        cut: The planes and plies that fail together (the minimum cut).
    """

    load: float
    cut: tuple[str, ...]


def plastic_bound(joint: Joint, plane_capacity: list[float], ply_capacity: list[float],
                  bolt: int = 0) -> PlasticBound:
    """Return the max-flow bound of the joint along its load pattern.

    The force travels from the loaded members into their plies, from a ply
    into the bolt segment inside it (capacity: the ply's bearing strength),
    along the bolt across planes (capacity: the plane's rupture strength, in
    either direction) and out through the supported members' plies. Loads of
    opposite sign along the load direction enter as sinks that must be fed.
    With unlimited ductility every cut edge reaches its capacity together, so
    the largest scale of the load pattern for which every member's force and
    the supports' reaction can all be delivered is the plastic bound, and the
    minimum cut names the mechanism.

    Args:
        joint: The joint (its member loads give the pattern).
        plane_capacity: Rupture strength of each plane, N (head to nut).
        ply_capacity: Bearing strength of each ply, N (inf for ample).
        bolt: The bolt station (one bolt here).

    Returns:
        The :class:`PlasticBound`.
    """
    axis = joint.load_axis()
    pattern = {m.name: float(np.dot(m.load, axis)) for m in joint.members if not m.support}
    push = sum(v for v in pattern.values() if v > 0)
    pull = -sum(v for v in pattern.values() if v < 0)
    total = sum(abs(v) for v in pattern.values())  # the pattern's magnitude: Σ|P_m|
    scale = max(push, pull, 1e-300)
    big = 1e6 * (sum(c for c in plane_capacity if np.isfinite(c))
                 + sum(c for c in ply_capacity if np.isfinite(c)) + scale)

    def graph(lam: float) -> nx.DiGraph:
        g = nx.DiGraph()
        n = len(joint.plies)
        for j, ply in enumerate(joint.plies):
            cap = ply_capacity[j] if np.isfinite(ply_capacity[j]) else big
            g.add_edge(("ply", j), ("seg", j), capacity=cap)
            g.add_edge(("seg", j), ("ply", j), capacity=cap)
            if ply.member is not None:
                g.add_edge(("member", ply.member), ("ply", j), capacity=big)
                g.add_edge(("ply", j), ("member", ply.member), capacity=big)
        for i in range(n - 1):
            cap = plane_capacity[i] if np.isfinite(plane_capacity[i]) else big
            g.add_edge(("seg", i), ("seg", i + 1), capacity=cap)
            g.add_edge(("seg", i + 1), ("seg", i), capacity=cap)
        net = sum(pattern.values())  # the supports take -net: a sink when net > 0
        for m in joint.members:
            node = ("member", m.name)
            if m.support:
                g.add_edge(node, "R", capacity=big)
                g.add_edge("R", node, capacity=big)
            elif pattern[m.name] > 0:
                g.add_edge("S", node, capacity=lam * pattern[m.name])
            elif pattern[m.name] < 0:
                g.add_edge(node, "T", capacity=-lam * pattern[m.name])
        if net > 0:
            g.add_edge("R", "T", capacity=lam * net)
        elif net < 0:
            g.add_edge("S", "R", capacity=-lam * net)
        return g

    supply = max(push, pull)  # every sink edge (members pulled, the supports) must fill

    def feasible(lam: float) -> bool:
        flow = nx.maximum_flow_value(graph(lam), "S", "T")
        return flow >= lam * supply * (1 - 1e-12)

    lo, hi = 0.0, 1.0
    while feasible(hi):
        lo, hi = hi, hi * 2.0
        if hi > 1e12:
            return PlasticBound(load=float("inf"), cut=())
    for _ in range(200):
        mid = 0.5 * (lo + hi)
        if feasible(mid):
            lo = mid
        else:
            hi = mid
        if hi - lo <= 1e-12 * hi:
            break
    g = graph(hi)
    _, (reach, _) = nx.minimum_cut(g, "S", "T")
    cut = []
    for i in range(len(joint.plies) - 1):
        a, b = ("seg", i) in reach, ("seg", i + 1) in reach
        if a != b:
            cut.append(f"plane {i + 1}")
    for j, ply in enumerate(joint.plies):
        if (("ply", j) in reach) != (("seg", j) in reach):
            cut.append(f"ply {ply.name}")
    # lo scales the pattern; the reported load is the pattern's magnitude at that scale
    return PlasticBound(load=lo * total, cut=tuple(cut))
