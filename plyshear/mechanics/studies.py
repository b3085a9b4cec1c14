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
from collections.abc import Callable, Sequence
from dataclasses import dataclass

import numpy as np

from plyshear.mechanics.capacity import (
    CapacityError,
    CapacitySummary,
    analyse,
    hole_clearance,
    summarize,
)
from plyshear.mechanics.strengths import Strengths, strengths
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
    template: dict[str | None, Ply] = {m: next(p for p in plies if p.member == m) for m in members}
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
                new.append(
                    dataclasses.replace(f, name=f"{f.name}-{fillers}", gap=0.0, hole_offset=0.0)
                )
        seen[m] += 1
        new.append(
            dataclasses.replace(
                template[m], name=f"{m}-{seen[m]}", thickness=thick[m], gap=0.0, hole_offset=0.0
            )
        )
    grip = sum(p.thickness for p in new)
    bolt = joint.bolt
    if bolt.length is not None:
        bolt = dataclasses.replace(bolt, length=bolt.length - joint.grip + grip)
    return dataclasses.replace(
        joint, plies=tuple(new), bolt=bolt, title=f"{joint.title} ({planes} planes)".strip()
    )


@dataclass(frozen=True)
class PlanesRow:
    """One variant of the planes study."""

    planes: int
    joint: Joint
    summary: CapacitySummary


def planes_study(
    joint: Joint,
    max_planes: int,
    keep: str = "total",
    bearing_of: Callable[[Joint], Sequence[tuple[float, str]]] | None = None,
) -> list[PlanesRow]:
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
        bearing = bearing_of(variant) if bearing_of is not None else None
        rows.append(PlanesRow(planes=n, joint=variant, summary=summarize(variant, bearing)))
    return rows


#: Status of a scatter sample (the ``status`` column of its rows).
OK = "ok"
BELOW_LOAD = "fails below the model's load"
NOT_CONVERGED = "did not converge"


@dataclass(frozen=True)
class Sample:
    """One sample of the hole-position Monte Carlo.

    Attributes:
        index: Its number, from 1 (the generator's draws in order: the same seed
            gives the same offsets for the same number).
        offsets: Each ply's hole offset, mm.
        service_shear: Worst plane shear at the model's load, N; ``inf`` when the
            sample fails below that load or did not converge (ranked worst).
        capacity: The sample's capacity, N; ``-inf`` when it did not converge.
        status: :data:`OK`, :data:`BELOW_LOAD` or :data:`NOT_CONVERGED` (with why).
    """

    index: int
    offsets: tuple[float, ...]
    service_shear: float
    capacity: float
    status: str


@dataclass(frozen=True)
class ScatterResult:
    """The Monte Carlo of hole positions.

    Every sample counts in the percentiles: one that fails below the model's
    load has an infinite worst-plane shear, one that did not converge an
    infinite shear and a capacity of ``-inf``, so both rank as the worst.

    Attributes:
        service_shear: Worst plane shear at the model's load for each sample, N.
        capacity: Capacity of each sample, N.
        service_load: The model's load, N.
        clearance: Diametral hole clearance used, mm.
        failed: Samples whose analysis did not converge.
        below_load: Samples that fail below the model's load.
        planes: Shear planes of the joint (for the equal split).
    """

    service_shear: np.ndarray
    capacity: np.ndarray
    service_load: float
    clearance: float
    failed: int
    below_load: int = 0
    planes: int = 1

    @classmethod
    def of(
        cls, samples: list[Sample], service_load: float, clearance: float, planes: int = 1
    ) -> ScatterResult:
        """Collect samples (in any order) into a result ordered by sample number."""
        ordered = sorted(samples, key=lambda s: s.index)
        return cls(
            service_shear=np.array([s.service_shear for s in ordered], dtype=float),
            capacity=np.array([s.capacity for s in ordered], dtype=float),
            service_load=service_load,
            clearance=clearance,
            failed=sum(s.status.startswith(NOT_CONVERGED) for s in ordered),
            below_load=sum(s.status == BELOW_LOAD for s in ordered),
            planes=planes,
        )

    def percentiles(self, values: np.ndarray, q: tuple[float, ...] = (5, 50, 95)) -> list[float]:
        """Percentiles of every sample (infinite values included, ranked as they are).

        The inverted empirical distribution (the smallest value with at least
        ``q`` % of the samples at or below it), which never interpolates towards
        an infinite value. NaN when there are no samples.
        """
        if values.size == 0:
            return [float("nan")] * len(q)
        return [float(v) for v in np.percentile(values, q, method="inverted_cdf")]


def scatter_offsets(joint: Joint, samples: int, seed: int) -> np.ndarray:
    """Every sample's hole offsets, mm, shape (samples, plies): uniform in the clearance."""
    c = hole_clearance(joint)
    rng = np.random.default_rng(seed)
    return rng.uniform(-0.5 * c, 0.5 * c, size=(samples, len(joint.plies)))


def scatter_sample(
    joint: Joint, index: int, offsets: np.ndarray, strength: Strengths | None = None
) -> Sample:
    """Analyse one sample: the joint with these hole offsets, holes placed by offset."""
    base = dataclasses.replace(
        joint, analysis=dataclasses.replace(joint.analysis, clearance="offset")
    )
    plies = tuple(
        dataclasses.replace(p, hole_offset=float(o))
        for p, o in zip(base.plies, offsets, strict=True)
    )
    service = service_load(joint)
    offs = tuple(float(o) for o in offsets)
    try:
        result = analyse(dataclasses.replace(base, plies=plies), strength=strength)
    except CapacityError as exc:
        return Sample(index, offs, np.inf, -np.inf, f"{NOT_CONVERGED}: {exc}")
    loads = np.array([st.load for st in result.history])
    if loads[-1] < service:
        return Sample(index, offs, np.inf, float(result.load), BELOW_LOAD)
    worst = np.array([st.plane_shear.max() for st in result.history])
    return Sample(index, offs, float(np.interp(service, loads, worst)), float(result.load), OK)


def service_load(joint: Joint) -> float:
    """The model's load: the sum of the loaded members' force magnitudes, N."""
    return float(sum(np.hypot(*m.load) for m in joint.members))


def hole_scatter(
    joint: Joint,
    samples: int,
    seed: int,
    *,
    skip: Callable[[int], bool] | None = None,
    on_sample: Callable[[Sample], None] | None = None,
    stop: Callable[[], bool] | None = None,
    bearing: Sequence[tuple[float, str]] | None = None,
) -> ScatterResult:
    """Scatter every ply's hole uniformly within the clearance and analyse each case.

    Args:
        joint: The joint.
        samples: Number of samples, ≥ 1.
        seed: Seed of the random generator (results repeat for the same seed).
        skip: Given a sample number, True to leave it out (done in an earlier run).
        on_sample: Called with each :class:`Sample` as it finishes.
        stop: Polled between samples; True ends the run early.
        bearing: Every ply's bearing strength and rule (see
            :func:`plyshear.mechanics.strengths.strengths`).

    Returns:
        The :class:`ScatterResult` of the samples analysed in this call.

    Raises:
        ValueError: If ``samples`` < 1.
    """
    if samples < 1:
        raise ValueError(f"--scatter must be at least 1 (got {samples})")
    offsets = scatter_offsets(joint, samples, seed)
    strength = strengths(joint, bearing)  # the holes' offsets do not change them
    done: list[Sample] = []
    for i in range(samples):
        if stop is not None and stop():
            break
        if skip is not None and skip(i + 1):
            continue
        sample = scatter_sample(joint, i + 1, offsets[i], strength)
        done.append(sample)
        if on_sample is not None:
            on_sample(sample)
    return ScatterResult.of(
        done, service_load(joint), hole_clearance(joint), max(1, len(joint.plies) - 1)
    )
