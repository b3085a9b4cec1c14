"""The load-path graph of a joint (networkx).

Nodes are the bolt, the plies and the members; edges are the ways force can
pass: a ply bears on the bolt (when its bearing stiffness is positive) and a
ply is tied to its member. A member that no path reaches from a support is a
mechanism: the joint is refused before any solve.
"""

from __future__ import annotations

import networkx as nx

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
