"""The capacity answers of a joint side by side: does another plane pay?

* **elastic**: the linear solution scaled to its first event: a section's
  rupture under shear and moment (M_p = f_yb·d³/6), or a ply's local bearing
  pressure reaching its bearing strength;
* **nonlinear**: the incremental analysis (:mod:`plyshear.mechanics.incremental`)
  with its recorded events and what ended it;
* **collapse**: the rigid-plastic collapse load by linear programming
  (:mod:`plyshear.mechanics.collapse`) and its mechanism;
* **shear-only bound**: the max-flow bound of :mod:`plyshear.mechanics.loadpath`,
  which ignores bending and the bolt's statics, so it is never below the
  collapse load.

All are nominal (no resistance factors), in N, bounded by the same strengths
(:mod:`plyshear.mechanics.strengths`).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from typing import TYPE_CHECKING

import numpy as np

from plyshear.errors import CapacityError
from plyshear.mechanics.assembly import build_mesh
from plyshear.mechanics.collapse import Collapse, collapse
from plyshear.mechanics.incremental import (
    CapacityResult,
    analyse,
    clearances,
    load_pattern,
    pattern_total,
    reference_pattern,
)
from plyshear.mechanics.strengths import (
    LUG_NET_TENSION,
    LUG_SHEAR_OUT,
    Strengths,
    hole_clearance,
    law_name,
    plane_strength,
    strengths,
)
from plyshear.model.joint import Joint

if TYPE_CHECKING:
    from plyshear.mechanics.results import Solution

__all__ = [
    "Answer",
    "CapacityError",
    "CapacityResult",
    "CapacitySummary",
    "analyse",
    "clearances",
    "elastic_capacity",
    "governing_lugs",
    "hole_clearance",
    "law_name",
    "load_pattern",
    "lug_end",
    "lug_rules",
    "pattern_total",
    "plane_strength",
    "separating_planes",
    "summarize",
]


@dataclass(frozen=True)
class Answer:
    """One capacity answer: the load, and the event and where (or the mechanism).

    ``z`` (mm) places an event on the bolt itself.
    """

    load: float
    event: str
    where: str
    z: float | None = None


@dataclass(frozen=True)
class CapacitySummary:
    """The elastic, nonlinear, collapse and shear-only capacities side by side.

    Attributes:
        planes: Number of shear planes between different members, all bolts together.
        plane_strength: One plane's nominal rupture strength (the strongest plane), N.
        strengths: The strengths that bound every answer.
        elastic: First event of the linear solution, scaled.
        nonlinear: The end of the incremental analysis.
        collapse: The rigid-plastic collapse load (its mechanism: ``mechanism``).
        plastic: The shear-only max-flow bound (``where`` lists the cut).
        cut: The planes and plies of the minimum cut.
        analysis: The incremental analysis itself (history, events).
        mechanism: The collapse analysis itself (mechanism, discretisation).
        solution: The linear solution at the model's loads.
        model_load: The magnitude of the model's load pattern, Σ|P|, N.
    """

    planes: int
    plane_strength: float
    strengths: Strengths
    elastic: Answer
    nonlinear: Answer
    collapse: Answer
    plastic: Answer
    cut: tuple[str, ...]
    analysis: CapacityResult
    mechanism: Collapse
    solution: Solution
    model_load: float

    def efficiency(self, load: float) -> float:
        """Plane efficiency: load / (planes × one plane's strength)."""
        return load / (self.planes * self.plane_strength) if self.planes else float("nan")

    @property
    def answers(self) -> dict[str, Answer]:
        """The four answers by their JSON names."""
        return {
            "elastic": self.elastic,
            "nonlinear": self.nonlinear,
            "collapse": self.collapse,
            "plastic": self.plastic,
        }


def separating_planes(joint: Joint) -> int:
    """Planes between different members, a filler pack counting as transparent."""
    owners = [p.member for p in joint.plies if p.member is not None]
    return sum(1 for a, b in zip(owners, owners[1:], strict=False) if a != b)


def elastic_capacity(joint: Joint, sol: Solution, strength: Strengths | None = None) -> Answer:
    """The linear solution scaled to its first event.

    Events: a bolt section's rupture under shear and moment,
    √((M/M_p)² + (V/V_u)²) = 1 ("plane shear rupture" at a plane), a ply's
    largest local bearing pressure reaching its bearing strength per unit length,
    and a pin plate's bearing force reaching its lug rupture strength.

    Args:
        joint: The joint.
        sol: Its linear solution at the model's loads.
        strength: Its strengths (default: :func:`strengths`).

    Returns:
        The load (magnitude of the scaled pattern, N), the event and where.

    Raises:
        CapacityError: If the solution carries no load, or loads in two directions.
    """
    s = strength or strengths(joint)
    scale = float(np.abs(load_pattern(joint)).sum())
    ply_of = build_mesh(joint).ply
    lugs = lug_rules(joint, s)
    many = len(sol.bolts) > 1
    cands: list[tuple[float, str, str, float | None]] = []
    for b, bolt in enumerate(sol.bolts):
        tag = f"bolt {b + 1} " if many else ""
        m = np.hypot(bolt.M[:, 0], bolt.M[:, 1])
        v = np.hypot(bolt.V[:, 0], bolt.V[:, 1])
        planes = {int(np.argmin(np.abs(bolt.z - p.z))): p.index for p in bolt.planes}
        vu = s.shear(bolt.z)
        for k, i in planes.items():
            vu[k] = s.plane[i - 1]
        inter = np.hypot(m / s.moment(bolt.z), v / vu)  # hypot: no underflow of tiny loads
        k = int(np.argmax(inter))
        if inter[k] > 0:
            if k in planes:
                cands.append(
                    (float(1.0 / inter[k]), "plane shear rupture", f"{tag}plane {planes[k]}", None)
                )
            else:
                cands.append(
                    (
                        float(1.0 / inter[k]),
                        "bolt bending and shear",
                        f"bolt {b + 1}" if many else "bolt",
                        float(bolt.z[k]),
                    )
                )
        pressure = np.hypot(bolt.q[..., 0], bolt.q[..., 1]).max(axis=1)
        force = {pb.ply: pb.force for pb in bolt.plies}
        for j, ply in enumerate(joint.plies):
            if ply.name in lugs and force.get(j, 0.0) > 0:  # a lug ruptures on its whole force
                cands.append(
                    (float(s.ply_force[j] / force[j]), lugs[ply.name], f"{tag}ply {ply.name}", None)
                )
                continue
            local = float(pressure[ply_of == j].max(initial=0.0))
            if local > 0:
                cands.append(
                    (
                        float(s.bearing[j] / local),
                        "ply bearing pressure",
                        f"{tag}ply {ply.name}",
                        None,
                    )
                )
    if not cands:
        raise CapacityError("no load: the capacity needs a loaded member")
    lam, event, where, z_ev = min(cands, key=lambda c: c[0])
    return Answer(float(lam * scale), event, where, z_ev)


def lug_rules(joint: Joint, s: Strengths) -> dict[str, str]:
    """The plies whose strength is their lug's rupture (pin plates), by name: the rule."""
    return {
        p.name: r
        for p, r in zip(joint.plies, s.bearing_rule, strict=True)
        if r in (LUG_NET_TENSION, LUG_SHEAR_OUT)
    }


def lug_end(answer: Answer, result: CapacityResult, joint: Joint, s: Strengths) -> Answer:
    """End the nonlinear answer where a pin plate reaches its lug rupture strength.

    A lug that ruptures (net tension, shear-out) does not keep its load as a
    plate in bearing would: the first such ply at full bearing ends the
    analysis, and the answer names the lug's rule.
    """
    rules = lug_rules(joint, s)
    for ev in result.events:
        name = ev.where.split("ply ", 1)[-1]
        if ev.event == "ply at full bearing" and name in rules and ev.load < answer.load:
            return Answer(ev.load, rules[name], ev.where)
    return answer


def governing_lugs(joint: Joint, s: Strengths, lp: Collapse) -> tuple[tuple[str, str], ...]:
    """The pin plates at their lug rupture strength in the collapse mechanism: (ply, rule)."""
    rules = lug_rules(joint, s)
    return tuple(
        dict.fromkeys((name, rules[name]) for _, name in lp.mechanism.bearing if name in rules)
    )


def summarize(
    joint_or_solution: Joint | Solution, bearing: Sequence[tuple[float, str]] | None = None
) -> CapacitySummary:
    """Return every capacity answer of a joint (or of a solved joint).

    Args:
        joint_or_solution: The joint, or its linear solution (which carries it).
        bearing: Every ply's bearing strength per unit bolt length and its rule
            (:func:`plyshear.mechanics.strengths.strengths`); the callers above
            mechanics pass the model's standard's.

    Returns:
        The :class:`CapacitySummary` (nominal, N, at the model's load pattern).

    Raises:
        CapacityError: If an analysis fails or the loads cannot be scaled.
    """
    from plyshear.mechanics.loadpath import plastic_bound
    from plyshear.mechanics.solve import solve

    if isinstance(joint_or_solution, Joint):
        original, sol = joint_or_solution, solve(joint_or_solution)
    else:
        original, sol = joint_or_solution.joint, joint_or_solution
    joint = reference_pattern(original)  # loads are magnitudes: the pattern's size drops out
    try:
        s = strengths(joint, bearing)
    except ValueError as exc:
        raise CapacityError(str(exc)) from None
    elastic = elastic_capacity(original, sol, s)
    result = analyse(joint, strength=s)
    nonlinear = lug_end(
        Answer(result.load, result.event.event, result.event.where, result.event.z),
        result,
        joint,
        s,
    )
    try:
        lp = collapse(joint, list(s.bearing), s.moment, s.shear, list(s.net_section))
    except ValueError as exc:
        raise CapacityError(f"collapse analysis: {exc}") from None
    lugs = governing_lugs(joint, s, lp)
    collapse_answer = Answer(
        lp.load,
        "rigid-plastic mechanism",
        "the mechanism"
        + ("; " + ", ".join(f"{rule} of ply {name}" for name, rule in lugs) if lugs else ""),
    )
    bound = plastic_bound(joint, list(s.plane), list(s.ply_force), list(s.net_section))
    plastic = Answer(bound.load, "shear-only cut", ", ".join(bound.cut))
    return CapacitySummary(
        planes=separating_planes(joint) * len(joint.stations),
        plane_strength=float(max(s.plane)),
        strengths=s,
        elastic=elastic,
        nonlinear=nonlinear,
        collapse=collapse_answer,
        plastic=plastic,
        cut=bound.cut,
        analysis=result,
        mechanism=lp,
        solution=sol,
        model_load=pattern_total(original),
    )
