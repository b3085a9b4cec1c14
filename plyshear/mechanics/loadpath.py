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

from plyshear.errors import ModelError
from plyshear.mechanics import bearing
from plyshear.model.joint import Joint

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
    """Return the names of members that no load path connects to a support.

    The graph of :func:`load_path_graph` has one hub, the bolt, so its
    connectivity has a closed form (checked against networkx's components in
    the tests): a supported member reaches the bolt if one of its plies bears,
    and through the bolt every member with a bearing ply.
    """
    bears = {p.member for p in joint.plies
             if p.member is not None and bearing.modulus(joint.analysis.bearing, joint.bolt, p) > 0}
    held = {m.name for m in joint.members if m.support}
    reached = held | bears if held & bears else held
    return [m.name for m in joint.members if m.name not in reached]


def unreachable_members_by_graph(joint: Joint) -> list[str]:
    """:func:`unreachable_members` by the connected components of the networkx graph."""
    g = load_path_graph(joint)
    reached: set[tuple[str, object]] = set()
    for m in joint.members:
        if m.support:
            reached |= nx.node_connected_component(g, ("member", m.name))
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
                  segment_capacity: list[float] | None = None) -> PlasticBound:
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

    In a bolt row every bolt has its own plies and planes; a ply passes force
    from one bolt to the next along its segment (capacity: its net section),
    and a member's force enters its plies at the first or last bolt.

    Args:
        joint: The joint (its member loads give the pattern).
        plane_capacity: Rupture strength of each plane, N (head to nut), the
            same at every bolt.
        ply_capacity: Bearing strength of each ply at one bolt, N (inf for ample).
        segment_capacity: Axial strength of each ply between bolts, N (inf
            when omitted).

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

    ns = len(joint.stations)
    seg_cap = segment_capacity or [float("inf")] * len(joint.plies)

    def cap_or_big(c: float) -> float:
        return c if np.isfinite(c) else big

    def graph(lam: float) -> nx.DiGraph:
        g = nx.DiGraph()
        n = len(joint.plies)

        def both(a: object, b: object, c: float) -> None:
            g.add_edge(a, b, capacity=c)
            g.add_edge(b, a, capacity=c)

        for st in range(ns):
            for j in range(n):
                both(("ply", st, j), ("seg", st, j), cap_or_big(ply_capacity[j]))
                if st + 1 < ns:
                    both(("ply", st, j), ("ply", st + 1, j), cap_or_big(seg_cap[j]))
            for i in range(n - 1):
                both(("seg", st, i), ("seg", st, i + 1), cap_or_big(plane_capacity[i]))
        for j, ply in enumerate(joint.plies):
            if ply.member is not None:
                st = 0 if joint.member(ply.member).enters == "before" else ns - 1
                both(("member", ply.member), ("ply", st, j), big)
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
    for st in range(ns):
        tag = f"bolt {st + 1} " if ns > 1 else ""
        for i in range(len(joint.plies) - 1):
            if (("seg", st, i) in reach) != (("seg", st, i + 1) in reach):
                cut.append(f"{tag}plane {i + 1}")
        for j, ply in enumerate(joint.plies):
            if (("ply", st, j) in reach) != (("seg", st, j) in reach):
                cut.append(f"{tag}ply {ply.name}")
            if st + 1 < ns and (("ply", st, j) in reach) != (("ply", st + 1, j) in reach):
                cut.append(f"ply {ply.name} between bolts {st + 1} and {st + 2}")
    # lo scales the pattern; the reported load is the pattern's magnitude at that scale
    return PlasticBound(load=lo * total, cut=tuple(cut))
