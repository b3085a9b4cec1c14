"""The load-path graph of a joint (networkx).

Nodes are the bolt, the plies and the members; edges are the ways force can
pass: a ply bears on the bolt (when its bearing stiffness is positive) and a
ply is tied to its member. A member that no path reaches from a support is a
mechanism: the joint is refused before any solve.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass
from typing import TYPE_CHECKING

import numpy as np

from plyshear.errors import ModelError
from plyshear.mechanics import bearing
from plyshear.model.joint import Joint

if TYPE_CHECKING:  # networkx costs 0.2 s to import: only the graph functions load it
    import networkx as nx

BOLT = ("bolt", 0)


def load_path_graph(joint: Joint) -> nx.Graph:
    """Return the undirected graph of bolt, plies and members.

    Nodes are tuples ``("bolt", 0)``, ``("ply", j)`` (0-based) and
    ``("member", name)``; ply nodes carry the ply name.
    """
    import networkx as nx

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
    bears = {
        p.member
        for p in joint.plies
        if p.member is not None and bearing.modulus(joint.analysis.bearing, joint.bolt, p) > 0
    }
    held = {m.name for m in joint.members if m.support}
    reached = held | bears if held & bears else held
    return [m.name for m in joint.members if m.name not in reached]


def unreachable_members_by_graph(joint: Joint) -> list[str]:
    """:func:`unreachable_members` by the connected components of the networkx graph."""
    import networkx as nx

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
        raise ModelError(
            joint.source or "<model>",
            "member",
            "no supported member; mark at least one with support = true",
        )
    lost = unreachable_members(joint)
    if lost:
        raise ModelError(
            joint.source or "<model>",
            f"member.{lost[0]}",
            "is a mechanism: no path of plies and bolt reaches it from a support",
        )


def flow_network(
    joint: Joint,
    plane_capacity: list[float],
    ply_capacity: list[float],
    segment_capacity: list[float] | None = None,
) -> tuple[Callable[[float], nx.DiGraph], float, float]:
    """The flow network of :func:`plastic_bound` as a function of the load scale λ.

    Returns:
        ``(graph, supply, total)``: ``graph(λ)`` builds the network (source
        ``"S"``, sink ``"T"``; every edge carries ``capacity`` and its λ
        coefficient ``per_lam``), ``supply`` is the demand per unit λ and
        ``total`` the pattern's magnitude Σ|P_m| per unit λ.
    """
    axis = joint.load_axis()
    pattern = {m.name: float(np.dot(m.load, axis)) for m in joint.members if not m.support}
    push = sum(v for v in pattern.values() if v > 0)
    pull = -sum(v for v in pattern.values() if v < 0)
    total = sum(abs(v) for v in pattern.values())  # the pattern's magnitude: Σ|P_m|
    scale = max(push, pull, 1e-300)
    big = 1e6 * (
        sum(c for c in plane_capacity if np.isfinite(c))
        + sum(c for c in ply_capacity if np.isfinite(c))
        + scale
    )

    ns = len(joint.stations)
    seg_cap = segment_capacity or [float("inf")] * len(joint.plies)

    def cap_or_big(c: float) -> float:
        return c if np.isfinite(c) else big

    def graph(lam: float) -> nx.DiGraph:
        """The flow network at load scale ``lam``; λ-scaled edges also carry ``per_lam``."""
        import networkx as nx

        g = nx.DiGraph()
        n = len(joint.plies)

        def both(a: object, b: object, c: float) -> None:
            g.add_edge(a, b, capacity=c, per_lam=0.0)
            g.add_edge(b, a, capacity=c, per_lam=0.0)

        def scaled(a: object, b: object, per_lam: float) -> None:
            g.add_edge(a, b, capacity=lam * per_lam, per_lam=per_lam)

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
                both(node, "R", big)
            elif pattern[m.name] > 0:
                scaled("S", node, pattern[m.name])
            elif pattern[m.name] < 0:
                scaled(node, "T", -pattern[m.name])
        if net > 0:
            scaled("R", "T", net)
        elif net < 0:
            scaled("S", "R", -net)
        return g

    supply = max(push, pull)  # every sink edge (members pulled, the supports) must fill
    return graph, supply, total


@dataclass(frozen=True)
class PlasticBound:
    """The ideal-ductility capacity of the load path.

    Attributes:
        load: Magnitude of the load pattern that the path can carry, N.
        cut: The planes and plies that fail together (the minimum cut).
    """

    load: float
    cut: tuple[str, ...]


def plastic_bound(
    joint: Joint,
    plane_capacity: list[float],
    ply_capacity: list[float],
    segment_capacity: list[float] | None = None,
) -> PlasticBound:
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
    graph, supply, total = flow_network(joint, plane_capacity, ply_capacity, segment_capacity)
    ns = len(joint.stations)
    found = largest_scale(graph, supply)
    if found is None:
        return PlasticBound(load=float("inf"), cut=())
    lam, reach = found
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
    # lam scales the pattern; the reported load is the pattern's magnitude at that scale
    return PlasticBound(load=lam * total, cut=tuple(cut))


#: Above this scale of the load pattern the shear-only bound is reported as unbounded.
LARGEST_SCALE = 2.0**39
#: A network is feasible at a scale when its maximum flow falls short of the
#: demand by no more than this fraction.
FLOW_SHORTFALL = 1e-12


def largest_scale(
    graph: Callable[[float], nx.DiGraph], supply: float
) -> tuple[float, set[object]] | None:
    """The largest load scale λ whose network delivers the demand λ·supply, and its cut.

    Each edge's capacity is ``a + λ·per_lam``; a cut X (source side) carries
    ``a(X) + λ·b(X)``, so the network is feasible while every cut has
    ``a(X) ≥ λ·(supply − b(X))``, and λ* = min over cuts of a(X)/(supply − b(X)).
    Dinkelbach's iteration finds it exactly (W. Dinkelbach, "On nonlinear
    fractional programming", Management Science 13 (1967) 492–498, from memory):
    from a scale that is too large, the minimum cut there gives the ratio of that
    cut, a smaller scale; repeat until the network is feasible. It ends in a few
    maximum flows (two when one cut governs at every scale), where a bisection
    of the scale takes fifty.

    Args:
        graph: The network at a given scale; its edges carry ``capacity`` and
            ``per_lam`` (the λ coefficient; 0 for fixed edges), source ``"S"``,
            sink ``"T"``.
        supply: The demand per unit scale (the λ coefficient of every cut
            separating the supply from the demand).

    Returns:
        ``(λ*, the source side of the governing minimum cut)``, or None when the
        network is feasible at :data:`LARGEST_SCALE`.
    """
    import networkx as nx

    lam = LARGEST_SCALE
    cut: set[object] | None = None
    for _ in range(100):
        g = graph(lam)
        value, (reach, _) = nx.minimum_cut(g, "S", "T")
        if value >= lam * supply * (1.0 - FLOW_SHORTFALL):
            return (lam, cut) if cut is not None else None
        fixed = per_lam = 0.0
        for u, v, data in g.edges(data=True):
            if u in reach and v not in reach:
                fixed += data["capacity"] - lam * data["per_lam"]
                per_lam += data["per_lam"]
        ratio = fixed / (supply - per_lam)
        cut = set(reach)
        if not ratio < lam * (1.0 - 1e-15):  # round-off: the cut's own ratio is the answer
            return ratio, cut
        lam = ratio
    raise RuntimeError("the load scale did not settle in 100 maximum flows")
