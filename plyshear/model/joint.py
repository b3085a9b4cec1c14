"""The joint model: frozen dataclasses in N, mm and MPa.

A model is never changed in place: an edit returns a copy
(:meth:`Joint.with_ply`, :meth:`Joint.with_bolt`). No result is stored on a
model object.

Geometry: z runs along the bolt axis from under the head. Ply ``j`` occupies
``[z_j, z_j + t_j]``, after a clear gap ``gap_j`` from the previous ply (or
from the head). Plies are numbered from the head side.
"""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass, field
from typing import Any

import numpy as np

BEAM_THEORIES = ("timoshenko", "euler-bernoulli")
THREAD_MODES = ("auto", "included", "excluded")
END_FIXITIES = ("free", "clamped")
#: The shared vocabularies, defined here only: the model file, the catalogue and the
#: clause functions all take these names.
HOLE_TYPES = ("standard", "oversized", "short-slot", "long-slot")
STANDARDS = ("aisc360-22", "en1993-1-8")
METHODS = ("lrfd", "asd")
#: Bearing-law names a model file may give; plyshear.mechanics.bearing implements each.
BEARING_LAWS = ("component", "elastic-plastic", "plate-bearing", "bolt-shear")
CLEARANCE_MODES = ("fitted", "concentric", "offset")
#: The bolt's bending in the capacity analysis (see :mod:`plyshear.mechanics.section`).
BOLT_MODELS = ("strain-hardening", "elastic-plastic", "elastic")


@dataclass(frozen=True)
class Bolt:
    """The bolt or pin (one shape for the whole joint).

    Attributes:
        diameter: Nominal (shank) diameter d, mm.
        grade: Fastener catalogue key ("8.8", "A325", ...).
        fyb: Yield strength, MPa.
        fub: Tensile strength, MPa.
        stress_area: Tensile stress area A_s, mm² (used where threaded).
        E: Elastic modulus, MPa.
        poisson: Poisson's ratio.
        length: Under-head length, mm, or None if unknown.
        thread_length: Threaded length from the end, mm, or None.
        threads: "auto" (from geometry), "included" or "excluded".
        ends: "free" or "clamped" (rotation tied to zero at head and nut).
        pretension: Preload, N.
        tension: External axial tension, N.
        hole: Hole type, one of :data:`HOLE_TYPES`.
    """

    diameter: float
    grade: str
    fyb: float
    fub: float
    stress_area: float
    E: float = 210000.0
    poisson: float = 0.3
    length: float | None = None
    thread_length: float | None = None
    threads: str = "auto"
    ends: str = "free"
    pretension: float = 0.0
    tension: float = 0.0
    hole: str = "standard"

    @property
    def gross_area(self) -> float:
        """Nominal body area πd²/4, mm²."""
        return float(np.pi * self.diameter**2 / 4.0)

    @property
    def thread_start(self) -> float | None:
        """The z at which the thread begins, or None when the geometry is unknown."""
        if self.length is None or self.thread_length is None:
            return None
        return self.length - self.thread_length

    def threaded_at(self, z: float) -> bool:
        """Say whether the bolt section at ``z`` is threaded.

        With ``threads = "auto"`` and unknown geometry the answer is True
        (threads in every plane: the conservative assumption).
        """
        if self.threads == "included":
            return True
        if self.threads == "excluded":
            return False
        start = self.thread_start
        return True if start is None else z >= start - 1e-9

    def threaded_along(self, z: np.ndarray) -> np.ndarray:
        """:meth:`threaded_at` for every entry of ``z`` at once (boolean array)."""
        z = np.asarray(z, dtype=float)
        start = self.thread_start
        if self.threads != "auto" or start is None:
            return np.full(z.shape, self.threaded_at(0.0))
        return z >= start - 1e-9

    @property
    def threads_assumed(self) -> bool:
        """True when threads are assumed in every plane for want of geometry."""
        return self.threads == "auto" and self.thread_start is None


@dataclass(frozen=True)
class Ply:
    """One plate of the stack.

    Attributes:
        name: Unique name.
        member: The member the ply belongs to, or None for a loose filler/pack.
        thickness: t, mm.
        fy: Yield strength, MPa.
        fu: Tensile strength, MPa.
        E: Elastic modulus, MPa.
        steel: Plate-steel catalogue key, or None when fy/fu were given.
        gap: Clear gap before this ply, mm.
        edge: Edge distance along the ply's force, mm, or None.
        width: Width across the force, mm, or None.
        foundation_modulus: Override of the bearing law: stiffness per unit
            thickness, MPa; None = use the analysis' bearing law.
        link_stiffness: Elastic link to the member, N/mm; None = rigid link.
        hole_offset: Offset of the ply's hole centre from the bolt axis along
            the load, mm (used with ``[analysis] clearance = "offset"``).
    """

    name: str
    member: str | None
    thickness: float
    fy: float
    fu: float
    E: float = 210000.0
    steel: str | None = None
    gap: float = 0.0
    edge: float | None = None
    width: float | None = None
    foundation_modulus: float | None = None
    link_stiffness: float | None = None
    hole_offset: float = 0.0

    @property
    def is_filler(self) -> bool:
        """True for a loose filler or pack (no member)."""
        return self.member is None


@dataclass(frozen=True)
class Member:
    """A member that owns one or more plies.

    Attributes:
        name: Member name.
        support: True if the member is held (its reaction is computed).
        load: In-plane force (Fx, Fy) on the member, N.
        enters: Where the member's force enters its plies in a bolt row:
            "before" the first station or "after" the last.
    """

    name: str
    support: bool = False
    load: tuple[float, float] = (0.0, 0.0)
    enters: str = "before"

    @property
    def is_loaded(self) -> bool:
        """True if the member carries a non-zero force."""
        return self.load != (0.0, 0.0)


@dataclass(frozen=True)
class Analysis:
    """Analysis settings.

    Attributes:
        bearing: Bearing-law name (see :mod:`plyshear.mechanics.bearing`).
        elements_per_ply: Bolt elements inside each ply and each gap.
        beam: "timoshenko" or "euler-bernoulli".
        clearance: Hole clearance in the capacity analysis: "fitted" (every ply
            bears from the start), "concentric" or "offset".
        hole_clearance: Diametral hole clearance, mm; None = from the hole
            table of the check standard for the bolt's hole type.
        bolt: The bolt's bending in the capacity analysis: "strain-hardening"
            (elastic to fyb, hardening to fub at the grade's minimum elongation),
            "elastic-plastic" (no hardening) or "elastic" (never yields).
        deformation_limits: End the incremental analysis at the ply's bearing
            deformation limit and at the bolt's elongation (False: run to the
            peak or to a slip of one bolt diameter).
    """

    bearing: str = "component"
    elements_per_ply: int = 10
    beam: str = "timoshenko"
    clearance: str = "fitted"
    hole_clearance: float | None = None
    bolt: str = "strain-hardening"
    deformation_limits: bool = True


@dataclass(frozen=True)
class CheckSettings:
    """Design-check settings.

    Attributes:
        standard: "aisc360-22" or "en1993-1-8".
        method: "lrfd" or "asd" (AISC only).
        connector: "bolt" or "pin" (pins use the standards' pin rules).
        deformation_considered: AISC J3.10: deformation at the bolt hole at
            service load is a design consideration (2.4dtFu) or not (3.0dtFu).
        fillers: "undeveloped" or "developed" (AISC J5.2; h_f of J3.8).
        slip_critical: Check slip resistance (also when the bolt is pretensioned).
        slip_class: Faying-surface class; None = the standard's lowest
            (AISC Class A, EN Class D).
        joint_length: Length of the bolt pattern along the force, mm, for the
            long-joint rules (0 for a single bolt).
        loads: What the model's loads are, "factored" or "service", as the file
            declares it; None = the level the check's method takes (factored for
            LRFD and EN, service for ASD).
        allow_unloaded: Accept a joint whose members carry no load.
        pin_interaction: EN 1993-1-8 Table 3.10 pin bending with shear:
            "max-max" (the largest moment with the largest shear, conservative)
            or "same-section" (moment and shear of one section).
        replaceable: The pin is to be replaced (EN 1993-1-8 3.13.2: the
            serviceability rules of Table 3.10 and the contact stress apply).
    """

    standard: str = "aisc360-22"
    method: str = "lrfd"
    connector: str = "bolt"
    deformation_considered: bool = True
    fillers: str = "undeveloped"
    slip_critical: bool = False
    slip_class: str | None = None
    joint_length: float = 0.0
    loads: str | None = None
    allow_unloaded: bool = False
    pin_interaction: str = "max-max"
    replaceable: bool = False


@dataclass(frozen=True)
class LoadCase:
    """One named load case: the force it puts on every member.

    Attributes:
        name: The case's name, as the model file gives it (``dead``, ``wind_north``).
        loads: Force (Fx, Fy) on every member in :attr:`Joint.members` order, N;
            (0, 0) on a member that does not name the case.
        category: What the case is, for the generated combinations (``dead``,
            ``live``, ``wind``, ...; see :mod:`plyshear.model.combinations`), or
            None when its name says nothing a generator knows.
    """

    name: str
    loads: tuple[tuple[float, float], ...]
    category: str | None = None


@dataclass(frozen=True)
class Combination:
    """A load combination: factors on the cases.

    Attributes:
        name: Unique name.
        factors: ``(case name, factor)`` pairs; cases not named carry factor 0.
        level: ``"factored"`` (strength: LRFD, EN 1993) or ``"service"`` (ASD).
        source: The equation it comes from (generated ones), or "".
    """

    name: str
    factors: tuple[tuple[str, float], ...]
    level: str = "factored"
    source: str = ""

    def factor(self, case: str) -> float:
        """The factor on ``case`` (0 when the combination does not name it)."""
        return dict(self.factors).get(case, 0.0)


@dataclass(frozen=True)
class TitleBlock:
    """The report's title block, from the model file's top-level keys (all free text).

    Attributes:
        job: Job number or name.
        subject: What this calculation is of.
        prepared_by: Who prepared it.
        checked_by: Who checked it.
        revision: Its revision.
        date: Its date (a TOML date is kept as YYYY-MM-DD).
    """

    job: str = ""
    subject: str = ""
    prepared_by: str = ""
    checked_by: str = ""
    revision: str = ""
    date: str = ""


#: The title block's keys, top level in the model file (``project`` is a field of Joint).
TITLE_BLOCK_KEYS = ("job", "subject", "prepared_by", "checked_by", "revision", "date")


@dataclass(frozen=True)
class Joint:
    """A bolt through a stack of plies, with its members and settings.

    Attributes:
        bolt: The bolt.
        plies: Plies from the head side.
        members: Members named by the plies.
        title: Free text shown in reports.
        project: Free text on the project (job, client, engineer), shown in reports.
        stations: Bolt positions along x, mm (one bolt: ``(0.0,)``).
        units: Name of the unit system results are written in.
        analysis: Analysis settings.
        check: Design-check settings.
        source: The model file it was read from, if any.
        cases: Named load cases (empty for a model with plain loads: one case,
            the members' :attr:`Member.load`).
        combinations: Load combinations of the cases; the members' loads are
            those of the first unless :meth:`for_combination` chose another.
        combination: The name of the combination the members' loads are, or "".
        title_block: The report's title block (job, subject, who, revision, date).
    """

    bolt: Bolt
    plies: tuple[Ply, ...]
    members: tuple[Member, ...]
    title: str = ""
    units: str = "N-mm"
    analysis: Analysis = field(default_factory=Analysis)
    project: str = ""
    stations: tuple[float, ...] = (0.0,)
    check: CheckSettings = field(default_factory=CheckSettings)
    source: str | None = None
    cases: tuple[LoadCase, ...] = ()
    combinations: tuple[Combination, ...] = ()
    combination: str = ""
    title_block: TitleBlock = field(default_factory=TitleBlock)

    def ply_starts(self) -> np.ndarray:
        """Return z of the head-side face of every ply, mm."""
        gaps = np.array([p.gap for p in self.plies])
        t = np.array([p.thickness for p in self.plies])
        return np.cumsum(gaps) + np.concatenate(([0.0], np.cumsum(t)[:-1]))

    @property
    def pattern_length(self) -> float:
        """Distance between the first and the last bolt, mm (0 for one bolt)."""
        return float(self.stations[-1] - self.stations[0])

    @property
    def grip(self) -> float:
        """Total length of the stack including gaps, mm."""
        return float(sum(p.gap + p.thickness for p in self.plies))

    def member(self, name: str) -> Member:
        """Return the member called ``name``."""
        for m in self.members:
            if m.name == name:
                return m
        raise KeyError(name)

    def member_index(self) -> dict[str, int]:
        """Map member names to their position in :attr:`members`."""
        return {m.name: i for i, m in enumerate(self.members)}

    def load_axis(self) -> np.ndarray:
        """Return the unit direction of the largest member load (x if unloaded)."""
        loads = np.array([m.load for m in self.members], dtype=float)
        norms = np.hypot(loads[:, 0], loads[:, 1])
        if norms.max() == 0.0:
            return np.array([1.0, 0.0])
        i = int(np.argmax(norms))
        return loads[i] / norms[i]

    @property
    def has_cases(self) -> bool:
        """True when the model declares load cases (and so combinations)."""
        return bool(self.cases)

    def combination_named(self, name: str) -> Combination:
        """Return the combination called ``name``.

        Raises:
            KeyError: With the known names, if there is none.
        """
        for c in self.combinations:
            if c.name == name:
                return c
        known = ", ".join(c.name for c in self.combinations) or "none"
        raise KeyError(f"no combination '{name}' (known: {known})")

    def combined_loads(self, factors: dict[str, float]) -> tuple[tuple[float, float], ...]:
        """The member loads ``Σ factor · case`` in :attr:`members` order, N."""
        out = np.zeros((len(self.members), 2))
        for case in self.cases:
            f = factors.get(case.name, 0.0)
            if f:
                out += f * np.asarray(case.loads, dtype=float)
        return tuple((float(fx), float(fy)) for fx, fy in out)

    def with_loads(self, loads: tuple[tuple[float, float], ...]) -> Joint:
        """Return a copy with every member's load replaced (in :attr:`members` order)."""
        members = tuple(
            dataclasses.replace(m, load=(0.0, 0.0) if m.support else (float(f[0]), float(f[1])))
            for m, f in zip(self.members, loads, strict=True)
        )
        return dataclasses.replace(self, members=members)

    def for_combination(self, name: str) -> Joint:
        """Return a copy whose member loads are the combination ``name``.

        Everything that takes a joint (solve, check, capacity, report) then runs
        on that combination unchanged. The check's load level is the
        combination's.

        Raises:
            KeyError: If there is no such combination.
        """
        combo = self.combination_named(name)
        joint = self.with_loads(self.combined_loads(dict(combo.factors)))
        check = dataclasses.replace(self.check, loads=combo.level)
        return dataclasses.replace(joint, check=check, combination=combo.name)

    def for_case(self, name: str) -> Joint:
        """Return a copy whose member loads are the case ``name`` alone (factor 1)."""
        if name not in {c.name for c in self.cases}:
            raise KeyError(f"no load case '{name}'")
        return dataclasses.replace(
            self.with_loads(self.combined_loads({name: 1.0})), combination=""
        )

    def with_ply(self, index: int, **changes: Any) -> Joint:
        """Return a copy with ply ``index`` (0-based) changed."""
        plies = list(self.plies)
        plies[index] = dataclasses.replace(plies[index], **changes)
        return dataclasses.replace(self, plies=tuple(plies))

    def with_bolt(self, **changes: Any) -> Joint:
        """Return a copy with the bolt changed."""
        return dataclasses.replace(self, bolt=dataclasses.replace(self.bolt, **changes))

    def with_analysis(self, **changes: Any) -> Joint:
        """Return a copy with the analysis settings changed."""
        return dataclasses.replace(self, analysis=dataclasses.replace(self.analysis, **changes))

    def mirrored(self) -> Joint:
        """Return the stack seen from the nut side (head ↔ nut).

        Gaps move with their plies so the geometry is the mirror image. The
        thread geometry is dropped (it belongs to one orientation).
        """
        plies = list(reversed(self.plies))
        gaps = [p.gap for p in self.plies[1:]][::-1]
        new = [
            dataclasses.replace(p, gap=(0.0 if i == 0 else gaps[i - 1]))
            for i, p in enumerate(plies)
        ]
        new[0] = dataclasses.replace(new[0], gap=self.plies[0].gap)
        bolt = dataclasses.replace(self.bolt, length=None, thread_length=None)
        return dataclasses.replace(self, plies=tuple(new), bolt=bolt)
