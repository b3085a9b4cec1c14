"""Load cases solved once, combinations by superposition, and their envelope.

The linear system does not depend on the loads: it is assembled and factorised
once, and every load case is one more right-hand side
(:func:`plyshear.mechanics.solve.solve_stacked` with the cases side by side on
its component axis). A combination's unknowns are the factored sum of the
cases' unknowns; its plane shears, moments, bearings and reactions are
recovered from them (:func:`plyshear.mechanics.recovery.recover`, linear in the
unknowns) as one batch, when first asked for, so each combination's
:class:`Solution` has exactly the shape of a single solve's and agrees with
solving the combined joint to round-off. The envelope is the factored sum of
the cases' recovered plane and ply results, which needs no combination's
solution.
"""

from __future__ import annotations

import dataclasses
import functools
from dataclasses import dataclass, field
from typing import Any

import numpy as np

from plyshear import units as _units
from plyshear.mechanics.assembly import FIXED, System, assemble
from plyshear.mechanics.loadpath import require_load_path
from plyshear.mechanics.recovery import Batch, recover
from plyshear.mechanics.results import Solution
from plyshear.mechanics.solve import SolveError, solve_stacked, system_unbalance
from plyshear.model.joint import Joint


@dataclass(frozen=True)
class EnvelopeValue:
    """The largest value of one quantity over the combinations.

    Attributes:
        value: The largest resultant (N or N·mm).
        combination: The combination that gives it.
    """

    value: float
    combination: str


@dataclass(frozen=True)
class PlaneEnvelope:
    """One plane's largest |V| and |M| over the combinations.

    Attributes:
        bolt: Bolt index (0-based) in the row.
        index: Plane number from the head side, from 1.
        shear: Largest resultant shear, N.
        moment: Largest resultant moment at the plane, N·mm.
    """

    bolt: int
    index: int
    shear: EnvelopeValue
    moment: EnvelopeValue


@dataclass(frozen=True)
class PlyEnvelope:
    """One ply's largest bearing over the combinations.

    Attributes:
        bolt: Bolt index (0-based).
        ply: Ply index (0-based).
        bearing: Largest resultant bearing force, N.
    """

    bolt: int
    ply: int
    bearing: EnvelopeValue


@dataclass(frozen=True)
class _Solved:
    """The solved unknowns of every case on the one system (kept for the combinations)."""

    sys: System
    x: np.ndarray  # (cases, na, 2)
    y: np.ndarray  # (cases, nm, 2)
    loads: np.ndarray  # (cases, nm, 2)
    kappa: float


@dataclass(frozen=True)
class Combined:
    """Every case and every combination of a joint, solved.

    The combinations' full solutions are recovered when first asked for
    (:attr:`combinations`); the envelope is the factored sum of the cases'
    plane and ply results, which needs none of them.

    Attributes:
        joint: The joint (with its cases and combinations).
        cases: Case name → the solution of that case alone.
        planes: The envelope of every plane of every bolt.
        plies: The envelope of every ply's bearing at every bolt.
    """

    joint: Joint
    cases: dict[str, Solution]
    planes: tuple[PlaneEnvelope, ...]
    plies: tuple[PlyEnvelope, ...]
    solved: _Solved = field(repr=False, compare=False)

    @functools.cached_property
    def combinations(self) -> dict[str, Solution]:
        """Combination name → its solution (the joint loaded by the combination)."""
        joint, s = self.joint, self.solved
        F = factor_matrix(joint)
        xs = np.einsum("ck,kat->cat", F, s.x)
        ys = np.einsum("ck,kat->cat", F, s.y)
        fs = np.einsum("ck,kat->cat", F, s.loads)
        joints = [joint.for_combination(c.name) for c in joint.combinations]
        with np.errstate(all="ignore"):
            sols = _recover(joints, s.sys, xs, ys, s.kappa, fs)
        return dict(zip([c.name for c in joint.combinations], sols, strict=True))

    def envelope_dict(self) -> dict[str, Any]:
        """The JSON ``envelope`` section, in the joint's units."""
        u = _units.system(self.joint.units)
        f, mo = u.factor("force"), u.factor("moment")
        plies = self.joint.plies
        bolts: list[dict[str, Any]] = [{"planes": [], "plies": []} for _ in self.joint.stations]
        for p in self.planes:
            bolts[p.bolt]["planes"].append(
                {
                    "index": p.index,
                    "shear": p.shear.value / f,
                    "shear_combination": p.shear.combination,
                    "moment": p.moment.value / mo,
                    "moment_combination": p.moment.combination,
                }
            )
        for b in self.plies:
            bolts[b.bolt]["plies"].append(
                {
                    "name": plies[b.ply].name,
                    "bearing": b.bearing.value / f,
                    "bearing_combination": b.bearing.combination,
                }
            )
        for i, x in enumerate(self.joint.stations):
            bolts[i] = {"x": x / u.factor("length"), **bolts[i]}
        return {"bolts": bolts}


def case_loads(joint: Joint, sys: System) -> np.ndarray:
    """The free members' loads of every case on the border, shape (nm, cases, 2), N."""
    lay = sys.layout
    out = np.zeros((lay.nm, len(joint.cases), 2))
    for c, case in enumerate(joint.cases):
        for m_i, load in enumerate(case.loads):
            if lay.member_dof[m_i] != FIXED:
                out[lay.member_dof[m_i], c] = load
    return out


def factor_matrix(joint: Joint) -> np.ndarray:
    """The factors of every combination on every case, shape (combinations, cases)."""
    names = [c.name for c in joint.cases]
    return np.array(
        [[combo.factor(n) for n in names] for combo in joint.combinations], dtype=float
    ).reshape(len(joint.combinations), len(names))


def require_load_paths(joint: Joint) -> None:
    """Refuse a combination whose loads make the joint a mechanism.

    The load path depends only on which members are loaded, so each distinct
    set is checked once.

    Raises:
        plyshear.ModelError: Naming the member no path reaches.
    """
    cases = np.array([c.loads for c in joint.cases], dtype=float)  # (k, members, 2)
    combined = np.einsum("ck,kmt->cmt", factor_matrix(joint), cases)
    for loaded in {tuple(bool(v) for v in row) for row in np.any(combined != 0.0, axis=2)}:
        members = tuple(
            dataclasses.replace(m, load=(1.0, 0.0) if on else (0.0, 0.0))
            for m, on in zip(joint.members, loaded, strict=True)
        )
        require_load_path(dataclasses.replace(joint, members=members))


def solve_combinations(joint: Joint) -> Combined:
    """Solve every load case once and every combination by superposition.

    Args:
        joint: A joint with load cases and combinations (:attr:`Joint.has_cases`).

    Returns:
        The :class:`Combined` results with their envelope.

    Raises:
        ValueError: If the joint has no load cases.
        plyshear.ModelError: If a combination's loads make the joint a mechanism.
        SolveError: If the stiffness matrix cannot be factorised.
    """
    if not joint.has_cases:
        raise ValueError("the joint has no load cases")
    require_load_paths(joint)
    with np.errstate(all="ignore"):
        sys = assemble(joint)
        loads = case_loads(joint, sys)  # (nm, k, 2)
        k = loads.shape[1]
        x, y, kappa = solve_stacked(
            sys.ab[None], sys.B[None], sys.C[None], loads.reshape(loads.shape[0], 2 * k)[None]
        )
        xs = np.moveaxis(x[0].reshape(-1, k, 2), 1, 0)  # (cases, na, 2)
        ys = np.moveaxis(y[0].reshape(-1, k, 2), 1, 0)
        fs = np.moveaxis(loads, 1, 0)
        if not (np.all(np.isfinite(xs)) and np.all(np.isfinite(ys))):
            raise SolveError("the solution is not finite: check the magnitudes of the inputs")
        solved = _Solved(sys=sys, x=xs, y=ys, loads=fs, kappa=float(kappa[0]))
        case_joints = [joint.for_case(c.name) for c in joint.cases]
        sols = _recover(case_joints, sys, xs, ys, solved.kappa, fs)
    cases = dict(zip([c.name for c in joint.cases], sols, strict=True))
    planes, plies = envelope(joint, sols)
    return Combined(joint=joint, cases=cases, planes=planes, plies=plies, solved=solved)


def _recover(
    joints: list[Joint], sys: System, xs: np.ndarray, ys: np.ndarray, kappa: float, fs: np.ndarray
) -> list[Solution]:
    """The solutions of several load vectors on one system, as one recovery batch."""
    lay = sys.layout
    n = len(joints)

    def rep(a: np.ndarray) -> np.ndarray:
        return np.broadcast_to(a, (n, *a.shape))

    ab, B, C = rep(sys.ab), rep(sys.B), rep(sys.C)
    batch = Batch(
        joints=joints,
        layout=lay,
        z=rep(lay.mesh.z),
        stations=rep(lay.stations),
        kel=rep(lay.kel),
        kbb=rep(sys.kbb),
        kbu=rep(sys.kbu),
        kply=rep(sys.k),
        kspring=rep(np.array([sp.k for sp in lay.springs], dtype=float).reshape(-1)),
        x=xs,
        y=ys,
        kappa=np.full(n, kappa),
        unbalance=system_unbalance(ab, B, C, xs, ys, fs),
    )
    return recover(batch)


def envelope(
    joint: Joint, case_solutions: list[Solution]
) -> tuple[tuple[PlaneEnvelope, ...], tuple[PlyEnvelope, ...]]:
    """The largest |V|, |M| of every plane and bearing of every ply, with its combination.

    Each combination's plane shears, moments and bearings are the factored sums
    of the cases' (superposition of the linear results). Ties go to the first
    combination in the model's order.

    Args:
        joint: The joint with its combinations.
        case_solutions: The solution of every case, in the joint's order.
    """
    names = [c.name for c in joint.combinations]
    F = factor_matrix(joint)

    def combine(values: np.ndarray) -> np.ndarray:
        """Case values (cases, items, 2) → resultants per combination (combinations, items)."""
        v = np.einsum("ck,kit->cit", F, values)
        return np.hypot(v[..., 0], v[..., 1])

    planes, plies = [], []
    for b_i, bolt in enumerate(case_solutions[0].bolts):
        per_case = [s.bolts[b_i] for s in case_solutions]
        V = combine(np.array([[p.shear_xy for p in b.planes] for b in per_case]))
        M = combine(np.array([[p.moment_xy for p in b.planes] for b in per_case]))
        R = combine(np.array([[p.force_xy for p in b.plies] for b in per_case]))
        for p_i, plane in enumerate(bolt.planes):
            planes.append(
                PlaneEnvelope(
                    bolt=b_i,
                    index=plane.index,
                    shear=_largest(V[:, p_i], names),
                    moment=_largest(M[:, p_i], names),
                )
            )
        for j in range(len(bolt.plies)):
            plies.append(PlyEnvelope(bolt=b_i, ply=j, bearing=_largest(R[:, j], names)))
    return tuple(planes), tuple(plies)


#: Values within this relative difference are a tie (round-off of equal results): the
#: first combination in the model's order is named.
TIE = 1e-9


def _largest(values: np.ndarray, names: list[str]) -> EnvelopeValue:
    top = float(np.max(values))
    i = int(np.flatnonzero(values >= top * (1 - TIE))[0])
    return EnvelopeValue(value=float(values[i]), combination=names[i])


def combined_dict(combined: Combined, combination: str, diagram: bool = True) -> dict[str, Any]:
    """The JSON result of a joint with load cases.

    The top level is the single result of ``combination`` (the shape of today's
    result, plus ``combination``), beside ``cases`` and ``combinations`` (each a
    single result without diagrams, with its name, factors and level) and the
    ``envelope``.

    Args:
        combined: The solved cases and combinations.
        combination: The combination shown at the top level.
        diagram: Include the top level's diagram arrays.
    """
    joint = combined.joint
    u = _units.system(joint.units)
    f = u.factor("force")
    data = combined.combinations[combination].to_dict(diagram)
    data["combination"] = combination
    data["cases"] = [
        {
            "name": c.name,
            "category": c.category,
            "loads": [
                {"member": m.name, "load_xy": [fx / f, fy / f]}
                for m, (fx, fy) in zip(joint.members, c.loads, strict=True)
                if (fx, fy) != (0.0, 0.0)
            ],
            **combined.cases[c.name].to_dict(diagram=False),
        }
        for c in joint.cases
    ]
    data["combinations"] = [
        {
            "name": c.name,
            "level": c.level,
            "factors": dict(c.factors),
            "source": c.source,
            **combined.combinations[c.name].to_dict(diagram=False),
        }
        for c in joint.combinations
        if c.name in combined.combinations
    ]
    data["envelope"] = combined.envelope_dict()
    return data
