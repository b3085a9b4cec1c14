"""Studies built on the capacity analysis.

* :func:`planes_study`: does an extra shear plane pay? The model's two-member
  stack is rebuilt with 2, 3 … N planes and each variant's capacities and plane
  efficiencies are computed.
* :func:`hole_scatter`: Monte Carlo of the plies' hole positions within the
  clearance: the spread of the worst plane's shear at the model's load and of
  the capacity.
"""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass

import numpy as np

from plyshear.mechanics.capacity import (
    CapacityError,
    CapacitySummary,
    analyse,
    hole_clearance,
    summarize,
)
from plyshear.model.joint import Joint, Ply

KEEP_MODES = ("total", "ply")


def packs_between(joint: Joint) -> dict[tuple[str, str], tuple[Ply, ...]]:
    """The fillers and packs of the model's stack, by the pair of members they separate.

    For each ordered pair (X, Y) of members, the loose plies between the first
    ply of X that is followed (after loose plies only) by a ply of Y.
    """
    out: dict[tuple[str, str], tuple[Ply, ...]] = {}
    last: str | None = None
    pending: list[Ply] = []
    for p in joint.plies:
        if p.member is None:
            pending.append(p)
            continue
        if last is not None and last != p.member:
            out.setdefault((last, p.member), tuple(pending))
        last, pending = p.member, []
    return out


def rebuild(joint: Joint, planes: int, keep: str = "total") -> Joint:
    """Return the model's two-member stack rebuilt with ``planes`` shear planes.

    The plies alternate between the member of the first ply (A) and the other
    member (B): A B A B …, copying each member's first ply for steel, edge and
    width. Every plane from X to Y keeps the fillers and packs the model has
    between its first ply of X and the next of Y (so the model's own plane
    count rebuilds the model's stack). Gaps and hole offsets are dropped.

    Args:
        joint: A joint whose plies belong to exactly two members (and fillers).
        planes: Number of shear planes, ≥ 1.
        keep: ``"total"``: each member keeps its total thickness, shared
            equally among its plies; ``"ply"``: each ply keeps its member's
            mean ply thickness.

    Returns:
        The rebuilt joint.

    Raises:
        ValueError: If the stack does not have exactly two members, or for a
            bad ``planes`` or ``keep``.
    """
    if keep not in KEEP_MODES:
        raise ValueError(f"keep must be one of {', '.join(KEEP_MODES)} (got {keep!r})")
    if planes < 1:
        raise ValueError(f"planes must be >= 1 (got {planes})")
    plies = [p for p in joint.plies if not p.is_filler]
    members = list(dict.fromkeys(p.member for p in plies))
    if len(members) != 2:
        raise ValueError(f"the planes study needs a stack of two members (got {len(members)})")
    count = {m: 0 for m in members}
    order = [members[i % 2] for i in range(planes + 1)]
    for m in order:
        count[m] += 1
    template: dict[str | None, Ply] = {m: next(p for p in plies if p.member == m)
                                       for m in members}
    thick: dict[str | None, float] = {}
    for m in members:
        own = [p.thickness for p in plies if p.member == m]
        thick[m] = sum(own) / count[m] if keep == "total" else sum(own) / len(own)
    pack = packs_between(joint)
    new: list[Ply] = []
    seen = {m: 0 for m in members}
    fillers = 0
    for i, m in enumerate(order):
        if i:
            for f in pack.get((order[i - 1], m), ()):  # type: ignore[arg-type]
                fillers += 1
                new.append(dataclasses.replace(f, name=f"{f.name}-{fillers}", gap=0.0,
                                               hole_offset=0.0))
        seen[m] += 1
        new.append(dataclasses.replace(template[m], name=f"{m}-{seen[m]}", thickness=thick[m],
                                       gap=0.0, hole_offset=0.0))
    grip = sum(p.thickness for p in new)
    bolt = joint.bolt
    if bolt.length is not None:
        bolt = dataclasses.replace(bolt, length=bolt.length - joint.grip + grip)
    return dataclasses.replace(joint, plies=tuple(new), bolt=bolt,
                               title=f"{joint.title} ({planes} planes)".strip())


@dataclass(frozen=True)
class PlanesRow:
    """One variant of the planes study."""

    planes: int
    joint: Joint
    summary: CapacitySummary


def planes_study(joint: Joint, max_planes: int, keep: str = "total") -> list[PlanesRow]:
    """Capacities of the stack rebuilt with 2 … ``max_planes`` planes.

    Raises:
        ValueError: For a stack that is not two members or ``max_planes`` < 2.
        CapacityError: If a variant's analysis fails.
    """
    if max_planes < 2:
        raise ValueError(f"--max must be at least 2 (got {max_planes})")
    rows = []
    for n in range(2, max_planes + 1):
        variant = rebuild(joint, n, keep)
        rows.append(PlanesRow(planes=n, joint=variant, summary=summarize(variant)))
    return rows


@dataclass(frozen=True)
class ScatterResult:
    """The Monte Carlo of hole positions.

    Attributes:
        service_shear: Worst plane shear at the model's load for each sample,
            N (nan where the sample fails below that load).
        capacity: Capacity of each sample, N.
        service_load: The model's load, N.
        clearance: Diametral hole clearance used, mm.
        failed: Samples whose analysis did not converge.
    """

    service_shear: np.ndarray
    capacity: np.ndarray
    service_load: float
    clearance: float
    failed: int

    def percentiles(self, values: np.ndarray, q: tuple[float, ...] = (5, 50, 95)) -> list[float]:
        """Percentiles of the finite values."""
        finite = values[np.isfinite(values)]
        return [float(np.percentile(finite, p)) for p in q] if finite.size else [float("nan")] * 3


def hole_scatter(joint: Joint, samples: int, seed: int) -> ScatterResult:
    """Scatter every ply's hole uniformly within the clearance and analyse each case.

    Args:
        joint: The joint.
        samples: Number of samples, ≥ 1.
        seed: Seed of the random generator (results repeat for the same seed).

    Returns:
        The :class:`ScatterResult`.
    """
    if samples < 1:
        raise ValueError(f"--scatter must be at least 1 (got {samples})")
    rng = np.random.default_rng(seed)
    c = hole_clearance(joint)
    base = dataclasses.replace(joint, analysis=dataclasses.replace(joint.analysis,
                                                                   clearance="offset"))
    service = float(sum(np.hypot(*m.load) for m in joint.members))
    shear = np.full(samples, np.nan)
    cap = np.full(samples, np.nan)
    failed = 0
    for i in range(samples):
        offsets = rng.uniform(-0.5 * c, 0.5 * c, size=len(joint.plies))
        plies = tuple(dataclasses.replace(p, hole_offset=float(o))
                      for p, o in zip(base.plies, offsets, strict=True))
        case = dataclasses.replace(base, plies=plies)
        try:
            result = analyse(case)
        except CapacityError:
            failed += 1
            continue
        cap[i] = result.load
        loads = np.array([s.load for s in result.history])
        if loads[-1] >= service:
            worst = np.array([s.plane_shear.max() for s in result.history])
            shear[i] = float(np.interp(service, loads, worst))
    return ScatterResult(service_shear=shear, capacity=cap, service_load=service,
                         clearance=c, failed=failed)
