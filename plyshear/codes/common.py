"""What the two standards' item builders share: places, packs, slip planes, notes.

A standard's module (``aisc360_check``, ``en1993_1_8_check``) gives the driver in
:mod:`plyshear.codes.check` a :class:`StandardItems`: the items it asks of one
bolt, its notes and its long-joint factor. The per-bolt loop, the bolt row's note
and the result are the driver's, once for both.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass
from typing import Any

import numpy as np

from plyshear.codes.result import CheckItem
from plyshear.mechanics.results import BoltResult, PlaneShear, PlyBearing, Solution
from plyshear.model import catalog
from plyshear.model.joint import Joint, Ply
from plyshear.units import length_str

#: Planes whose shear is below this fraction of the load transfer nothing (slip).
SLIP_PLANE_MIN_SHARE = 1e-6

BoltItems = Callable[[Joint, BoltResult, str, list[str]], list[CheckItem]]


@dataclass(frozen=True)
class StandardItems:
    """What one standard asks of a solved joint, for the per-bolt driver.

    Attributes:
        standard: The model-file name of the standard, e.g. ``"aisc360-22"``.
        edition: The standard with its edition, as printed.
        notes: The standard's notes on the joint as a whole (``joint -> notes``).
        bolt: The items of one bolt: ``(joint, bolt, method, notes) -> items``; it may
            append notes.
        long_joint: The long-joint factor of the row and the rule's name.
        method: The method the standard always uses (EN: ``"partial-factors"``), or
            None to take the caller's.
    """

    standard: str
    edition: str
    notes: Callable[[Joint], list[str]]
    bolt: BoltItems
    long_joint: Callable[[Joint], tuple[float, str]]
    method: str | None = None


def at_plane(p: PlaneShear) -> dict[str, Any]:
    """The place keywords of an item at plane ``p``."""
    return {"part": "plane", "plane": p.index}


def at_ply(joint: Joint, j: int) -> dict[str, Any]:
    """The place keywords of an item at ply ``j``."""
    return {"part": "ply", "ply": j, "ply_name": joint.plies[j].name}


def bearing_plies(joint: Joint, bolt: BoltResult) -> list[tuple[PlyBearing, Ply, dict[str, Any]]]:
    """The plies a bolt bears on that are checked (not fillers), each with its place."""
    return [
        (pb, joint.plies[pb.ply], at_ply(joint, pb.ply))
        for pb in bolt.plies
        if not joint.plies[pb.ply].is_filler
    ]


def noun(joint: Joint) -> str:
    """``"pin"`` or ``"bolt"``: what the connector is called in the items."""
    return "pin" if joint.check.connector == "pin" else "bolt"


def hole_diameter(joint: Joint, standard: str, fallback: float) -> float:
    """The hole diameter of the standard's table, or ``d + fallback`` off the table, mm."""
    d = joint.bolt.diameter
    try:
        return catalog.hole_diameter(d, joint.bolt.hole, standard)
    except catalog.CatalogError:
        return d + fallback


def packs(joint: Joint) -> list[tuple[list[int], float]]:
    """Return the filler packs: runs of consecutive filler plies and their thickness, mm."""
    out: list[tuple[list[int], float]] = []
    run: list[int] = []
    for j, ply in enumerate([*joint.plies, None]):
        if ply is not None and ply.is_filler:
            run.append(j)
        elif run:
            out.append((run, sum(joint.plies[i].thickness for i in run)))
            run = []
    return out


def pack_at_plane(joint: Joint, above: int, below: int) -> float:
    """Return the thickness of the filler pack that a plane bounds (0 if none), mm."""
    for members, t in packs(joint):
        if above in members or below in members:
            return t
    return 0.0


def separates_members(joint: Joint, above: int, below: int) -> bool:
    """True if a plane lies between plies that can move relative to each other."""
    a, b = joint.plies[above].member, joint.plies[below].member
    return a is None or b is None or a != b


def slip_planes(joint: Joint, bolt: BoltResult) -> int:
    """Count the slip planes that transfer load.

    A slip plane lies between consecutive plies of different members; a filler
    pack between them is transparent (its two faces act in series: slip on
    either lets the joint slip), so it adds no plane. A plane counts when the
    bolt shear across it is not negligible.
    """
    load = max((float(np.hypot(*m.load)) for m in joint.members), default=0.0)
    shear = {(p.above, p.below): p.shear for p in bolt.planes}
    real = [j for j, p in enumerate(joint.plies) if not p.is_filler]
    count = 0
    for a, b in zip(real, real[1:], strict=False):
        if joint.plies[a].member == joint.plies[b].member:
            continue
        across = min(shear[(j, j + 1)] for j in range(a, b))
        if across > SLIP_PLANE_MIN_SHARE * load:
            count += 1
    return count


def transferred_force(joint: Joint, bolt: BoltResult) -> float:
    """The largest force one member passes through the bolt, N (slip demand)."""
    totals: dict[str, np.ndarray] = {}
    for pb in bolt.plies:
        m = joint.plies[pb.ply].member
        if m is not None:
            totals[m] = totals.get(m, np.zeros(2)) + np.array(pb.force_xy)
    return max((float(np.hypot(*v)) for v in totals.values()), default=0.0)


def bolt_loads(solution: Solution) -> np.ndarray:
    """The force each bolt of a row transfers (the largest member force through it), N."""
    return np.array([transferred_force(solution.joint, b) for b in solution.bolts])


def bolt_section_diameter(joint: Joint, threaded: bool) -> float:
    """Diameter of the bolt section: the shank, or the stress-area equivalent, mm."""
    if threaded:
        return float(np.sqrt(4.0 * joint.bolt.stress_area / np.pi))
    return joint.bolt.diameter


def node_threads(joint: Joint, bolt: BoltResult) -> np.ndarray:
    """Whether the bolt is threaded at each node."""
    return joint.bolt.threaded_along(bolt.z)


def resultants(values: np.ndarray) -> np.ndarray:
    """Resultant magnitudes of (n, 2) vectors."""
    return np.hypot(values[:, 0], values[:, 1])


def geometry_notes(joint: Joint) -> list[str]:
    """Notes on what the model file leaves to assumption."""
    notes = []
    if joint.bolt.threads_assumed:
        notes.append(
            "thread position unknown (no bolt.length): threads assumed in every "
            "plane, which is conservative"
        )
    for ply in joint.plies:
        if ply.edge is None and not ply.is_filler:
            notes.append(
                f"ply {ply.name}: no edge distance given; tear-out and edge effects not checked"
            )
    return notes


def joint_length(joint: Joint) -> float:
    """Length of the bolt pattern along the force for the long-joint rules, mm.

    The row's own length, or the model's ``[check] joint_length`` if longer
    (a single bolt standing for a longer row).
    """
    return max(joint.check.joint_length, joint.pattern_length)


def row_note(solution: Solution, factor: float, rule: str) -> str | None:
    """Contrast the standard's long-joint factor with the model's own end-bolt share."""
    if len(solution.bolts) < 2:
        return None
    joint = solution.joint
    loads = bolt_loads(solution)
    mean = float(loads.mean())
    end = float(max(loads[0], loads[-1]))
    if mean <= 0.0 or end <= 0.0:
        return None  # nothing to share: no load reaches the row
    return (
        f"bolt row of {len(loads)}, length {length_str(joint.units, joint.pattern_length)}: "
        f"{rule} factor {factor:.3f} (the standard's allowance for uneven sharing); the "
        f"model's end bolt carries {end / mean:.3f} x the mean bolt load "
        f"(an equal share would need a factor of {mean / end:.3f})"
    )


def strength_level(standard: str, method: str) -> str:
    """The load level a strength check takes: service for ASD, factored otherwise."""
    return "service" if standard == "aisc360-22" and method == "asd" else "factored"


def load_level(joint: Joint, standard: str, method: str) -> str:
    """The level of the model's loads: as declared, else what the method takes."""
    return joint.check.loads or strength_level(standard, method)
