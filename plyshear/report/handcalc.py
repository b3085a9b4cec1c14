"""The hand methods a checker sets beside the model, and the last plane's worth.

* equal split: the loaded members' total force over the planes between members
  (per bolt of a row);
* split in proportion to ply thickness: every member's force shared among its
  plies by thickness, a plane's shear the sum of the plies' shares above it;
* EN 1993-1-8 Table 3.10 pin moment M = F (b + 4c + 2a) / 8, for a stack that is
  one inner member between two outer plies of the other (a fork or clevis);

each against the model's worst plane shear or largest moment, with the ratio
model / hand. And the one-line answer whether the joint's last plane pays: its
nonlinear ultimate against the stack rebuilt with one plane fewer.
"""

from __future__ import annotations

from dataclasses import dataclass
from itertools import groupby

import numpy as np

from plyshear import units as _units
from plyshear.mechanics.capacity import CapacityError, CapacitySummary, summarize
from plyshear.mechanics.results import Solution
from plyshear.model.joint import Joint


@dataclass(frozen=True)
class HandRow:
    """One hand method against the model.

    Attributes:
        method: What the hand method is.
        dimension: ``"force"`` (a plane shear) or ``"moment"``.
        hand: The hand method's value, N or N·mm; None where it does not apply.
        model: The model's worst plane shear or largest moment, N or N·mm.
        note: Why it does not apply, or how it was taken.
    """

    method: str
    dimension: str
    hand: float | None
    model: float
    note: str = ""

    @property
    def ratio(self) -> float | None:
        """Model / hand (above 1: the hand method is unconservative)."""
        return None if not self.hand else self.model / self.hand


def member_planes(joint: Joint) -> int:
    """Planes between plies of different members (a filler pack counts as one plane)."""
    owners = [p.member for p in joint.plies if p.member is not None]
    return sum(1 for a, b in zip(owners, owners[1:], strict=False) if a != b)


def total_load(joint: Joint) -> float:
    """The loaded members' force, summed as magnitudes, N (as the equal split takes it)."""
    return float(sum(np.hypot(*m.load) for m in joint.members))


def equal_split(joint: Joint) -> float | None:
    """Total load / (planes × bolts), N; None without load or planes."""
    n = member_planes(joint)
    total = total_load(joint)
    if n == 0 or total == 0:
        return None
    return total / (n * len(joint.stations))


def thickness_split(sol: Solution) -> float | None:
    """The worst plane shear when every member's force is shared by its plies' thickness, N.

    A supported member's force is its reaction; a filler carries no share. Per bolt
    of a row: the forces divided by the number of bolts.
    """
    joint = sol.joint
    forces = {}
    for m, res in zip(joint.members, sol.members, strict=True):
        forces[m.name] = np.array(res.reaction_xy if m.support else m.load, dtype=float)
    if not any(np.hypot(*f) > 0 for f in forces.values()):
        return None
    thick = {
        m.name: sum(p.thickness for p in joint.plies if p.member == m.name) for m in joint.members
    }
    running, worst = np.zeros(2), 0.0
    for ply in joint.plies[:-1]:
        if ply.member is not None:
            running = running + forces[ply.member] * ply.thickness / thick[ply.member]
        worst = max(worst, float(np.hypot(*running)))
    return worst / len(joint.stations)


def fork_geometry(joint: Joint) -> tuple[float, float, float] | str:
    """(a, b, c) of Table 3.10 in mm, or why the stack is not one.

    a: the thicker outer ply; b: the inner member's plies (with the gaps between
    them); c: the larger gap between an outer ply and the inner member.
    """
    runs = [(m, list(g)) for m, g in groupby(joint.plies, key=lambda p: p.member)]
    if (
        len(runs) != 3
        or runs[0][0] != runs[2][0]
        or runs[0][0] is None
        or runs[1][0] is None
        or len(runs[0][1]) != 1
        or len(runs[2][1]) != 1
    ):
        return "the stack is not one inner member between two outer plies"
    inner = runs[1][1]
    a = max(runs[0][1][0].thickness, runs[2][1][0].thickness)
    b = sum(p.thickness for p in inner) + sum(p.gap for p in inner[1:])
    c = max(inner[0].gap, runs[2][1][0].gap)
    return a, b, c


def table_3_10_moment(joint: Joint) -> float | str:
    """EN 1993-1-8 Table 3.10: M_Ed = F_Ed (b + 4c + 2a) / 8, N·mm; or why it does not apply."""
    geometry = fork_geometry(joint)
    if isinstance(geometry, str):
        return geometry
    a, b, c = geometry
    return total_load(joint) / len(joint.stations) * (b + 4 * c + 2 * a) / 8


def hand_rows(sol: Solution) -> list[HandRow]:
    """The three hand methods against the model."""
    joint = sol.joint
    worst = max(p.shear for b in sol.bolts for p in b.planes)
    largest = max(b.max_moment for b in sol.bolts)
    n = member_planes(joint)
    rows = [
        HandRow(
            "equal split (total / planes)",
            "force",
            equal_split(joint),
            worst,
            f"{n} planes between members",
        ),
        HandRow(
            "split in proportion to ply thickness",
            "force",
            thickness_split(sol),
            worst,
            "each member's force shared by its plies' thickness",
        ),
    ]
    moment = table_3_10_moment(joint)
    if isinstance(moment, str):
        rows.append(
            HandRow(
                "EN 1993-1-8 Table 3.10 moment F(b + 4c + 2a)/8",
                "moment",
                None,
                largest,
                f"not applicable: {moment}",
            )
        )
    else:
        geometry = fork_geometry(joint)
        assert not isinstance(geometry, str)  # table_3_10_moment gave a moment: a fork
        a, b, c = geometry
        u = _units.system(joint.units)
        ln, ll = u.factor("length"), u.label("length")
        rows.append(
            HandRow(
                "EN 1993-1-8 Table 3.10 moment F(b + 4c + 2a)/8",
                "moment",
                moment,
                largest,
                f"a = {a / ln:.4g}, b = {b / ln:.4g}, c = {c / ln:.4g} {ll} (a: the thicker "
                "outer ply)",
            )
        )
    return rows


@dataclass(frozen=True)
class LastPlane:
    """What the joint's last plane adds to the nonlinear ultimate.

    Attributes:
        planes: The joint's planes between members.
        with_all: The joint's nonlinear ultimate, N.
        one_fewer: The ultimate of the stack rebuilt with one plane fewer, N; None
            if it could not be found.
        plane_strength: One plane's nominal rupture strength, N.
        why_not: Why there is no answer, or "".
    """

    planes: int
    with_all: float
    one_fewer: float | None
    plane_strength: float
    why_not: str = ""

    @property
    def gain(self) -> float | None:
        """N added by the last plane."""
        return None if self.one_fewer is None else self.with_all - self.one_fewer

    @property
    def pays(self) -> bool | None:
        """True when the last plane adds load."""
        return None if self.gain is None else self.gain > 0


def last_plane(summary: CapacitySummary) -> LastPlane:
    """The joint's nonlinear ultimate against its stack rebuilt with one plane fewer.

    The rebuilt stack keeps each member's total thickness (the planes study's
    rule, :func:`plyshear.mechanics.studies.rebuild`).
    """
    from plyshear.mechanics.studies import rebuild

    joint = summary.solution.joint
    n = member_planes(joint)  # per bolt (the summary counts every bolt's planes)
    base = LastPlane(n, summary.nonlinear.load, None, summary.plane_strength)
    if len(joint.stations) > 1:
        return _replace(base, "the planes study rebuilds single bolts, not bolt rows")
    if n < 3:
        return _replace(base, "two planes are the fewest the planes study rebuilds")
    try:
        fewer = summarize(rebuild(joint, n - 1))
    except (ValueError, CapacityError) as exc:
        return _replace(base, str(exc))
    return LastPlane(n, summary.nonlinear.load, fewer.nonlinear.load, summary.plane_strength)


def _replace(base: LastPlane, why: str) -> LastPlane:
    import dataclasses

    return dataclasses.replace(base, why_not=why)
