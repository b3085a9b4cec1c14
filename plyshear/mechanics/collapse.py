r"""Rigid-plastic collapse of a joint by linear programming (the static theorem).

The method
----------
The bolt of every station is cut into elements: nodes on every ply face, ``n``
equal elements inside each ply and one across each gap. On each element inside
a ply the bearing is a uniform line load :math:`q_e` (the force per unit bolt
length that the bolt applies to the ply, along the load axis), bounded by the
ply's bearing strength, :math:`|q_e| \le b_j`; gaps carry no bearing. The shear
and the moment at every node follow from equilibrium of the bolt under these
loads, exactly for a uniform load on each element,

.. math::

    V_{k+1} = V_k + q_e L_e, \qquad M_{k+1} = M_k + V_k L_e + q_e L_e^2/2,

with :math:`V = 0` at both ends, and :math:`M = 0` at both ends when they are
free (``[bolt] ends = "clamped"`` holds the rotation at head and nut: the end
moments are then free, bounded by the section like every other node). The
signs are those of :mod:`plyshear.mechanics.results`: V at z is the force the
plies on the head side of z receive from the bolt, and dM/dz = V.

Each free member's plies together receive :math:`-\lambda P_m` from the bolts
(:math:`P_m` its load along the load axis), a loose filler receives no net
force, and supported members react with whatever equilibrium needs. In a bolt
row every ply is a bar between stations; a member's force enters its plies at
the first station (``enters = "before"``) or the last, so the bar force of ply
j between stations i and i + 1 is the bearing the ply receives on the side
away from the entry, bounded by the ply's net-section strength.

Every section satisfies :math:`|M| \le M_p`, :math:`|V| \le V_u` and
:math:`(M/M_p)^2 + (V/V_u)^2 \le 1`, the ellipse replaced by the regular
polygon of ``sides`` sides inscribed in it (vertices on the ellipse, four of
them on the axes, so pure bending and pure shear are exact). The polygon lies
inside the ellipse: it lowers the answer by at most the fraction
:math:`1 - \cos(\pi/\text{sides})` (0.48 % at 32 sides, 1.9 % at 16). The
criterion holds at every section, not only at the nodes: under a uniform load
an element's (M, V) runs along a quadratic Bézier curve, inside the triangle
of its end states and the control point :math:`(M_a + V_a L_e/2,\; V_a + q_e
L_e/2)`, so the criterion (convex) is imposed at the nodes and at every
element's control point, with the least strength of the element there (a
strength that steps inside an element, at a thread start, is resolved to the
element's length).

The load factor :math:`\lambda` is maximised with ``scipy.optimize.linprog``
(HiGHS) on sparse matrices. The polygon's faces enter as cutting planes: the
LP is solved with the box :math:`|M| \le M_p`, :math:`|V| \le V_u`, the faces
that its solution crosses are added, and so on until none is crossed (that
optimum satisfies every face, so it is the optimum of the full LP); a finer
mesh starts from the faces the coarser one needed. The mesh is doubled, from
:data:`START_ELEMENTS` elements per ply, until the collapse load moves by less
than ``tol``; the meshes are nested, so the load does not fall on doubling
(where the strengths are steady along each element).

The theorem and what the answer means
-------------------------------------
Static (lower-bound) theorem of limit analysis (Neal, *The Plastic Methods of
Structural Analysis*, from memory): a load carried by a statically admissible
field — in equilibrium and nowhere above the strength — does not exceed the
collapse load of a perfectly plastic structure; the largest such load is the
collapse load. The field here is exactly in equilibrium and inside the
polygon at every section, so the answer is a true lower bound of the
rigid-plastic collapse load with those strengths; the restriction to uniform
bearing per element (a jump of sign only at a node) costs a little, which the
mesh doubling drives below ``tol``.
The answer assumes unlimited ductility of bearing, bending and shear (no
deformation limit, no fracture in bending, no rope effect of the bolt's
tension): it is the rigid-plastic collapse of the joint, the generalisation of
Johansen's yield theory of dowels (K. W. Johansen, "Theory of timber
connections", IABSE Publications 9 (1949), from memory) to any stack and to
bolt rows.

The mechanism
-------------
By LP duality the multipliers of the optimum are a collapse mechanism (the
kinematic theorem): plastic bearing displacements, hinge rotations, shear
slips and net-section extensions whose work balances the load's. A constraint
is read as part of the mechanism when it is active (slack below
:data:`ACTIVE_SLACK` of its bound) and does work in it (its share of the
dissipation is above :data:`ACTIVE_WORK`), so that a bound reached by chance in
a rigid part of the joint (where the static field is not unique) is not
reported. A ply is at full bearing when every one of its elements is, save an
isolated element where the bearing changes sign (the pivot of a rotating bolt
part, smeared over one element). Shear reaching its strength inside a ply,
away from every plane, is not listed.
"""

from __future__ import annotations

import math
from collections.abc import Callable, Sequence
from dataclasses import dataclass

import numpy as np
import scipy.sparse as sp

from plyshear.errors import CapacityError
from plyshear.mechanics.incremental import load_pattern
from plyshear.model.joint import Joint

START_ELEMENTS = 8  # elements per ply of the first discretisation
MAX_ELEMENTS = 256  # the finest discretisation tried before giving up
MIN_SIDES = 16  # fewest sides of the M–V polygon (1.9 % below the ellipse at worst)
#: A constraint is at its bound when its slack is below this fraction of the bound.
ACTIVE_SLACK = 1e-6
#: ... and it works in the mechanism when its share of the dissipation (its LP
#: multiplier times its bound, over the load factor: the shares sum to one) is above this.
ACTIVE_WORK = 1e-8
#: A section point is outside the polygon when it passes a face by more than this
#: fraction (above HiGHS' feasibility tolerance, so that a face already there is not re-cut).
FACE_TOL = 1e-6
MAX_CUTS = 50  # rounds of adding polygon faces before giving up


@dataclass(frozen=True)
class Hinge:
    """A plastic hinge of the collapse mechanism.

    Attributes:
        bolt: Station index of the bolt (0-based).
        z: Position along the bolt from the head side, mm.
    """

    bolt: int
    z: float


@dataclass(frozen=True)
class Mechanism:
    """The collapse mechanism read from the active constraints.

    Attributes:
        hinges: Sections where the moment governs (consecutive active nodes
            merged into one hinge at the node of largest moment).
        bearing: (bolt, ply name) of the plies at full bearing over their thickness.
        planes: (bolt, plane number from 1, head to nut) of the planes whose
            section is at its strength with the shear governing.
        net_sections: (ply name, i) of the net sections between bolt i and i + 1
            (0-based) at their strength.
    """

    hinges: tuple[Hinge, ...]
    bearing: tuple[tuple[int, str], ...]
    planes: tuple[tuple[int, int], ...]
    net_sections: tuple[tuple[str, int], ...]


@dataclass(frozen=True)
class Collapse:
    """The rigid-plastic collapse load of a joint.

    Attributes:
        load: Magnitude of the scaled load pattern at collapse, N:
            λ·Σ|P_m·axis| over the free members.
        factor: λ, the multiplier on the model's member loads.
        mechanism: The collapse mechanism.
        elements: Elements per ply of the accepted discretisation.
        change: Relative change of the load on the last doubling of the mesh.
    """

    load: float
    factor: float
    mechanism: Mechanism
    elements: int
    change: float


@dataclass(frozen=True)
class _Mesh:
    """One bolt's mesh: node positions and the ply of every element (−1 in gaps)."""

    z: np.ndarray
    ply: np.ndarray

    @property
    def lengths(self) -> np.ndarray:
        """Element lengths, mm."""
        return np.diff(self.z)


@dataclass(frozen=True)
class _Field:
    """The optimal static field at one discretisation (arrays: station first).

    Attributes:
        factor: λ.
        mesh: The mesh of every bolt.
        q: Bearing line load the bolt applies to the ply, N/mm, (S, ne), 0 in gaps.
        V: Shear at the nodes, N, (S, nn).
        M: Moment at the nodes, N·mm, (S, nn).
        ply_force: Force every ply receives from every bolt, N, (S, plies).
        bar: Force of every ply between stations i and i + 1, N, (S − 1, plies).
        mechanism: The mechanism read from the active constraints.
        cuts: (station, z, face) of the polygon faces the LP needed.
    """

    factor: float
    mesh: _Mesh
    q: np.ndarray
    V: np.ndarray
    M: np.ndarray
    ply_force: np.ndarray
    bar: np.ndarray
    mechanism: Mechanism
    cuts: tuple[np.ndarray, np.ndarray, np.ndarray]


def collapse(
    joint: Joint,
    bearing: Sequence[float],
    moment: Callable[[np.ndarray], np.ndarray],
    shear: Callable[[np.ndarray], np.ndarray],
    net_sections: Sequence[float] | None = None,
    sides: int = 32,
    tol: float = 0.005,
) -> Collapse:
    """Return the rigid-plastic collapse load of ``joint`` and its mechanism.

    Args:
        joint: The joint; its free members' loads are the pattern that is scaled.
        bearing: Bearing strength of every ply as a line load along the bolt,
            N per mm of bolt length (the ply's total is ``bearing[j]·t_j``).
        moment: Plastic moment of the bolt section at positions z (mm, array),
            N·mm; inf where there is no limit.
        shear: Shear strength of the bolt section at positions z, N; inf where
            there is no limit.
        net_sections: Tensile strength of every ply's net section between two
            bolts of a row, N (None or inf: no limit).
        sides: Sides of the polygon inscribed in the M–V ellipse, a multiple of
            four, at least :data:`MIN_SIDES`.
        tol: Accept the mesh when doubling it moves the load by less than this
            fraction.

    Returns:
        The :class:`Collapse`.

    Raises:
        ValueError: For a bearing strength that is negative or not finite, a
            strength callable that returns a wrong shape or a value ≤ 0, loads
            that are not collinear or absent, or bad ``sides`` or ``tol``.
        CapacityError: If the load does not converge by :data:`MAX_ELEMENTS`
            elements per ply, or HiGHS fails.
    """
    b, caps, pattern = _inputs(joint, bearing, net_sections, sides, tol)
    total = float(np.abs(pattern).sum())
    n = START_ELEMENTS
    prev = _solve(joint, n, b, moment, shear, caps, pattern, sides, None)
    while True:
        if n >= MAX_ELEMENTS:
            raise CapacityError(
                f"collapse load did not converge to {tol:g} by {MAX_ELEMENTS} elements per ply"
            )
        n *= 2
        field = _solve(joint, n, b, moment, shear, caps, pattern, sides, prev.cuts)
        change = _relative_change(prev.factor, field.factor)
        if change < tol:
            return Collapse(
                load=field.factor * total,
                factor=field.factor,
                mechanism=field.mechanism,
                elements=n,
                change=change,
            )
        prev = field


def _relative_change(old: float, new: float) -> float:
    """|new − old| over the larger of the two, zero when they are equal."""
    if new == old:
        return 0.0
    return abs(new - old) / max(abs(new), abs(old))


def _inputs(
    joint: Joint,
    bearing: Sequence[float],
    net_sections: Sequence[float] | None,
    sides: int,
    tol: float,
) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Validate the arguments; return bearing, net-section strengths and the load pattern."""
    nplies = len(joint.plies)
    b = np.asarray(bearing, dtype=float)
    if b.shape != (nplies,):
        raise ValueError(f"bearing: one strength per ply expected ({nplies}), got {b.size}")
    bad = [p.name for p, v in zip(joint.plies, b, strict=True) if not (np.isfinite(v) and v >= 0)]
    if bad:
        raise ValueError(
            f"bearing strength of ply {bad[0]} must be finite and >= 0 "
            "(an unbounded bearing has no collapse)"
        )
    caps = (
        np.full(nplies, np.inf)
        if net_sections is None
        else np.array([np.inf if c is None else float(c) for c in net_sections])
    )
    if caps.shape != (nplies,) or np.any(np.isnan(caps)) or np.any(caps < 0):
        raise ValueError("net_sections: one strength >= 0 (or inf) per ply expected")
    if sides < MIN_SIDES or sides % 4:
        raise ValueError(f"sides must be a multiple of 4 and at least {MIN_SIDES} (got {sides})")
    if not 0 < tol < 1:
        raise ValueError(f"tol must be between 0 and 1 (got {tol})")
    try:
        pattern = load_pattern(joint)
    except CapacityError as err:
        raise ValueError(str(err)) from None
    return b, caps, pattern


def _mesh(joint: Joint, n: int) -> _Mesh:
    """Nodes on every ply face, n elements in each ply, one across each gap."""
    z = [0.0]
    ply: list[int] = []
    end = 0.0
    for j, p in enumerate(joint.plies):
        if p.gap > 0:
            end += p.gap
            z.append(end)
            ply.append(-1)
        z.extend(end + p.thickness * np.arange(1, n + 1) / n)
        ply.extend([j] * n)
        end += p.thickness
    return _Mesh(z=np.array(z), ply=np.array(ply))


def _strength(f: Callable[[np.ndarray], np.ndarray], z: np.ndarray, what: str) -> np.ndarray:
    """Evaluate a strength callable on the nodes and check it."""
    try:
        v = np.broadcast_to(np.asarray(f(z.copy()), dtype=float), z.shape).copy()
    except ValueError:
        raise ValueError(f"{what}: the strength function must return one value per z") from None
    if np.any(np.isnan(v)) or np.any(v <= 0):
        raise ValueError(f"{what}: strengths must be > 0 (inf for no limit)")
    return v


def _coo(
    rows: list[np.ndarray], cols: list[np.ndarray], vals: list[np.ndarray], shape: tuple[int, int]
) -> sp.csr_matrix:
    """A CSR matrix from lists of COO pieces (duplicates summed)."""
    if not rows:
        return sp.csr_matrix(shape)
    return sp.csr_matrix(
        (np.concatenate(vals), (np.concatenate(rows), np.concatenate(cols))), shape=shape
    )


class _Program:
    """The sparse LP of one discretisation, in scaled units.

    Forces are scaled by ``F = qref·L`` (qref the largest bearing strength, L
    the grip), lengths by L and moments by F·L. Variables, station by station:
    q of every element, V and M of every node; λ̂ = λ·Σ|P|/F last.

    The section is checked at *points*: every node (even point index 2k) and
    the middle control point of every element (odd index 2e + 1). On an element
    under uniform load, (M, V) runs along a quadratic Bézier curve whose control
    points are the two end states and (M_a + V_a·L/2, V_a + q·L/2); the curve
    lies in their convex hull, so the three inside the (convex) criterion put
    every section of the element inside it.
    """

    def __init__(
        self,
        joint: Joint,
        mesh: _Mesh,
        b: np.ndarray,
        moment: Callable,
        shear: Callable,
        caps: np.ndarray,
        pattern: np.ndarray,
        sides: int,
    ) -> None:
        self.joint, self.mesh, self.sides = joint, mesh, sides
        self.ns, self.ne, self.nn = len(joint.stations), mesh.ply.size, mesh.z.size
        self.np = 2 * self.nn - 1  # section points of one bolt
        self.nplies = len(joint.plies)
        self.per = self.ne + 2 * self.nn
        self.nvar = self.ns * self.per + 1
        self.length = max(float(mesh.z[-1]), 1e-300)
        self.qref = float(b.max()) if b.max() > 0 else 1.0
        self.force = self.qref * self.length
        self.total = float(np.abs(pattern).sum())
        self.h = mesh.lengths / self.length
        self.b_hat = np.where(mesh.ply >= 0, b[np.maximum(mesh.ply, 0)], 0.0) / self.qref
        zp = np.empty(self.np)
        zp[0::2], zp[1::2] = mesh.z, 0.5 * (mesh.z[:-1] + mesh.z[1:])
        self.z_point = zp
        self.m_hat = _point_strength(moment, zp, "moment") / (self.force * self.length)
        self.v_hat = _point_strength(shear, zp, "shear") / self.force
        self.caps_hat = caps / self.force
        self.pattern = pattern
        self.entry_after = np.array(
            [p.member is not None and joint.member(p.member).enters == "after" for p in joint.plies]
        )
        self.em, self.ev = self._point_expressions()

    def q(self, s: int) -> np.ndarray:
        """Variable indices of the element loads of station s."""
        return s * self.per + np.arange(self.ne)

    def v(self, s: int) -> np.ndarray:
        """Variable indices of the node shears of station s."""
        return s * self.per + self.ne + np.arange(self.nn)

    def m(self, s: int) -> np.ndarray:
        """Variable indices of the node moments of station s."""
        return s * self.per + self.ne + self.nn + np.arange(self.nn)

    @property
    def lam(self) -> int:
        """Variable index of λ̂."""
        return self.nvar - 1

    def bounds(self) -> np.ndarray:
        """Variable bounds: bearing, |M| ≤ Mp and |V| ≤ Vu at the nodes, ends, λ ≥ 0."""
        lo = np.full(self.nvar, -np.inf)
        hi = np.full(self.nvar, np.inf)
        mp, vu = self.m_hat[0::2], self.v_hat[0::2]
        for s in range(self.ns):
            q, v, m = self.q(s), self.v(s), self.m(s)
            lo[q], hi[q] = -self.b_hat, self.b_hat
            lo[m], hi[m] = -mp, mp
            lo[v], hi[v] = -vu, vu
            lo[v[[0, -1]]] = hi[v[[0, -1]]] = 0.0
            if self.joint.bolt.ends != "clamped":
                lo[m[[0, -1]]] = hi[m[[0, -1]]] = 0.0
        lo[self.lam], hi[self.lam] = 0.0, np.inf
        return np.column_stack([lo, hi])

    def _ply_sum(
        self,
        j: int,
        row: int,
        rows: list,
        cols: list,
        vals: list,
        stations: Sequence[int] | None = None,
        sign: float = 1.0,
    ) -> None:
        """Add ply j's scaled force, summed over ``stations`` (all by default), to one row."""
        e = np.flatnonzero(self.mesh.ply == j)
        for s in range(self.ns) if stations is None else stations:
            rows.append(np.full(e.size, row))
            cols.append(self.q(s)[e])
            vals.append(sign * self.h[e])

    def equalities(self) -> sp.csr_matrix:
        """Bolt equilibrium element by element, then members and fillers (right side 0)."""
        rows: list[np.ndarray] = []
        cols: list[np.ndarray] = []
        vals: list[np.ndarray] = []
        e = np.arange(self.ne)
        one = np.ones(self.ne)
        for s in range(self.ns):
            q, v, m = self.q(s), self.v(s), self.m(s)
            rv, rm = 2 * s * self.ne + e, (2 * s + 1) * self.ne + e
            rows += [rv, rv, rv, rm, rm, rm, rm]
            cols += [v[e + 1], v[e], q, m[e + 1], m[e], v[e], q]
            vals += [one, -one, -self.h, one, -one, -self.h, -0.5 * self.h**2]
        r0 = 2 * self.ns * self.ne
        free = [mb for mb in self.joint.members if not mb.support]
        for mb, p in zip(free, self.pattern, strict=True):
            for j, ply in enumerate(self.joint.plies):
                if ply.member == mb.name:
                    self._ply_sum(j, r0, rows, cols, vals)
            rows.append(np.array([r0]))
            cols.append(np.array([self.lam]))
            vals.append(np.array([p / self.total]))
            r0 += 1
        for j, ply in enumerate(self.joint.plies):
            if ply.member is None:
                self._ply_sum(j, r0, rows, cols, vals)
                r0 += 1
        return _coo(rows, cols, vals, (r0, self.nvar))

    def net_rows(self) -> tuple[sp.csr_matrix, np.ndarray, list[tuple[int, int]]]:
        """|bar force| ≤ net section: two rows per finite strength; (ply, i) of each pair."""
        rows: list[np.ndarray] = []
        cols: list[np.ndarray] = []
        vals: list[np.ndarray] = []
        rhs: list[float] = []
        where: list[tuple[int, int]] = []
        for j in np.flatnonzero(np.isfinite(self.caps_hat)).tolist():
            for i in range(self.ns - 1):
                # the bar force: what the ply receives on the side away from the entry
                far = range(i + 1) if self.entry_after[j] else range(i + 1, self.ns)
                for sign in (1.0, -1.0):
                    self._ply_sum(j, len(rhs), rows, cols, vals, far, sign)
                    rhs.append(float(self.caps_hat[j]))
                where.append((j, i))
        return _coo(rows, cols, vals, (len(rhs), self.nvar)), np.array(rhs), where

    def _point_expressions(self) -> tuple[sp.csr_matrix, sp.csr_matrix]:
        """Scaled M and V at every section point of every bolt, as rows over the variables."""
        e = np.arange(self.ne)
        half = 0.5 * self.h
        rows: list[np.ndarray] = []
        mc: list[np.ndarray] = []
        vc: list[np.ndarray] = []
        for s in range(self.ns):
            q, v, m = self.q(s), self.v(s), self.m(s)
            node, ctrl = s * self.np + 2 * np.arange(self.nn), s * self.np + 2 * e + 1
            rows += [node, ctrl, ctrl]
            mc += [m, m[e], v[e]]
            vc += [v, v[e], q]
        vals = [np.ones(self.nn), np.ones(self.ne), half] * self.ns
        shape = (self.ns * self.np, self.nvar)
        return _coo(rows, mc, vals, shape), _coo(rows, vc, vals, shape)

    def point_limits(self) -> tuple[np.ndarray, np.ndarray]:
        """Scaled Mp and Vu at every point of every bolt."""
        return np.tile(self.m_hat, self.ns), np.tile(self.v_hat, self.ns)

    def box_rows(self) -> tuple[sp.csr_matrix, np.ndarray]:
        """|M| ≤ Mp and |V| ≤ Vu at the control points (right side 1); the point of each row."""
        mp, vu = self.point_limits()
        ctrl = np.tile(np.arange(self.np) % 2 == 1, self.ns)
        blocks, point = [], []
        for ex, lim in ((self.em, mp), (self.ev, vu)):
            idx = np.flatnonzero(ctrl & np.isfinite(lim))
            one = sp.diags(1.0 / lim[idx]) @ ex[idx]
            blocks += [one, -one]
            point += [idx, idx]
        return sp.vstack(blocks, format="csr"), np.concatenate(point)

    def face_rows(self, point: np.ndarray, face: np.ndarray) -> sp.csr_matrix:
        """Polygon face ``face`` at every ``point``, as rows with right side 1."""
        mp, vu = self.point_limits()
        phi = (2 * face + 1) * np.pi / self.sides  # normals between vertices at 2πk/sides
        scale = 1.0 / math.cos(math.pi / self.sides)  # faces at distance cos(π/sides)
        return (
            sp.diags(scale * np.cos(phi) / mp[point]) @ self.em[point]
            + sp.diags(scale * np.sin(phi) / vu[point]) @ self.ev[point]
        ).tocsr()

    def seed_cuts(
        self, seed: tuple[np.ndarray, np.ndarray, np.ndarray] | None
    ) -> tuple[np.ndarray, np.ndarray]:
        """Faces (point, face) at the points nearest to ``seed``'s, and at their neighbours."""
        if seed is None or seed[0].size == 0:
            return np.zeros(0, dtype=int), np.zeros(0, dtype=int)
        station, z, face = seed
        near = np.clip(np.searchsorted(self.z_point, z), 0, self.np - 1)
        local = np.clip(np.concatenate([near - 1, near, near + 1]), 0, self.np - 1)
        point = np.tile(station, 3) * self.np + local
        mp, vu = self.point_limits()
        keep = np.isfinite(mp[point]) & np.isfinite(vu[point])
        key = np.unique(point[keep] * self.sides + np.tile(face, 3)[keep])
        return key // self.sides, key % self.sides

    def violated_faces(self, x: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        """Points outside the polygon, each with the face it crosses and both neighbours."""
        mp, vu = self.point_limits()
        both = np.flatnonzero(np.isfinite(mp) & np.isfinite(vu))
        a, b = (self.em[both] @ x) / mp[both], (self.ev[both] @ x) / vu[both]
        phi = np.arctan2(b, a) % (2 * np.pi)
        face = np.floor(phi / (2 * np.pi / self.sides)).astype(int) % self.sides
        reach = np.cos(phi - (2 * face + 1) * np.pi / self.sides) * np.hypot(a, b)
        out = reach > math.cos(math.pi / self.sides) * (1 + FACE_TOL)
        pts = both[out]
        faces = face[out]
        return (
            np.concatenate([pts, pts, pts]),
            np.concatenate([faces, (faces + 1) % self.sides, (faces - 1) % self.sides]),
        )


def _point_strength(f: Callable[[np.ndarray], np.ndarray], zp: np.ndarray, what: str) -> np.ndarray:
    """A strength at every section point.

    At the nodes the callable's value; at an element's control point the least
    of its ends and middle, so that a step inside the element is safe.
    """
    v = _strength(f, zp, what)
    v[1::2] = np.minimum(np.minimum(v[0:-1:2], v[1::2]), v[2::2])
    return v


def _solve(
    joint: Joint,
    n: int,
    b: np.ndarray,
    moment: Callable,
    shear: Callable,
    caps: np.ndarray,
    pattern: np.ndarray,
    sides: int,
    seed: tuple[np.ndarray, np.ndarray, np.ndarray] | None = None,
) -> _Field:
    """Solve the LP of ``n`` elements per ply; return its field and mechanism.

    The polygon's faces enter by cutting planes: solve with |M| ≤ Mp and
    |V| ≤ Vu only, add the faces that the solution crosses (with their
    neighbours), solve again, until no point is outside. The last LP's optimum
    satisfies every face, so it is the optimum of the LP with all of them,
    at a fraction of its size. ``seed`` (station, z, face) starts from the faces
    a coarser mesh needed, at the points nearest to them.
    """
    from scipy.optimize import linprog  # 0.3 s to import: not on the path of a plain solve

    lp = _Program(joint, _mesh(joint, n), b, moment, shear, caps, pattern, sides)
    a_eq = lp.equalities()
    a_box, box_point = lp.box_rows()
    a_net, b_net, net_where = lp.net_rows()
    bounds = lp.bounds()
    c = np.zeros(lp.nvar)
    c[lp.lam] = -1.0
    cut_point, cut_face = lp.seed_cuts(seed)
    for _ in range(MAX_CUTS):
        a_ub = sp.vstack([a_box, lp.face_rows(cut_point, cut_face), a_net], format="csr")
        b_ub = np.concatenate([np.ones(a_box.shape[0] + cut_point.size), b_net])
        res = linprog(
            c,
            A_ub=a_ub,
            b_ub=b_ub,
            A_eq=a_eq,
            b_eq=np.zeros(a_eq.shape[0]),
            bounds=bounds,
            method="highs",
        )
        if res.status != 0:
            raise CapacityError(f"collapse LP failed ({n} elements per ply): {res.message}")
        new_point, new_face = lp.violated_faces(res.x)
        if new_point.size == 0:
            break
        key = np.unique(
            np.concatenate([cut_point, new_point]) * sides + np.concatenate([cut_face, new_face])
        )
        if key.size == cut_point.size:
            break  # crossed only within the solver's tolerance of faces already there
        cut_point, cut_face = key // sides, key % sides
    else:
        raise CapacityError(f"collapse LP: the M–V polygon still cut after {MAX_CUTS} rounds")
    work = _Work(res, bounds, b_ub, max(float(res.x[lp.lam]), 1e-300))
    sec_point = np.concatenate([box_point, cut_point])
    cuts = (cut_point // lp.np, lp.z_point[cut_point % lp.np], cut_face)
    return _field(lp, res.x, _mechanism(lp, work, res.x, sec_point, net_where), cuts)


def _field(
    lp: _Program,
    x: np.ndarray,
    mechanism: Mechanism,
    cuts: tuple[np.ndarray, np.ndarray, np.ndarray],
) -> _Field:
    """The LP's solution in N and mm."""
    mesh = lp.mesh
    q = np.stack([x[lp.q(s)] for s in range(lp.ns)]) * lp.qref
    V = np.stack([x[lp.v(s)] for s in range(lp.ns)]) * lp.force
    M = np.stack([x[lp.m(s)] for s in range(lp.ns)]) * lp.force * lp.length
    force = np.stack(
        [(q[:, mesh.ply == j] * mesh.lengths[mesh.ply == j]).sum(axis=1) for j in range(lp.nplies)],
        axis=1,
    )
    bar = np.zeros((max(lp.ns - 1, 0), lp.nplies))
    for i in range(lp.ns - 1):
        bar[i] = np.where(lp.entry_after, -force[: i + 1].sum(axis=0), force[i + 1 :].sum(axis=0))
    return _Field(
        factor=float(x[lp.lam]) * lp.force / lp.total,
        mesh=mesh,
        q=q,
        V=V,
        M=M,
        ply_force=force,
        bar=bar,
        mechanism=mechanism,
        cuts=cuts,
    )


class _Work:
    """Which bounds and rows of the solved LP are active and do work in the mechanism.

    A constraint's share of the work is its multiplier times its bound over the
    load factor (the shares sum to one).
    """

    def __init__(self, res, bounds: np.ndarray, b_ub: np.ndarray, lam: float) -> None:
        x = res.x
        var = np.zeros(x.size, dtype=int)
        for sign, bound, marg in (
            (1, bounds[:, 1], res.upper.marginals),
            (-1, bounds[:, 0], res.lower.marginals),
        ):
            b = np.where(np.isfinite(bound), bound, 0.0)
            at = np.isfinite(bound) & (np.abs(b - x) <= ACTIVE_SLACK * np.abs(b))
            works = np.abs(marg * b) / lam > ACTIVE_WORK
            var = np.where((var == 0) & at & works, sign, var)
        #: +1 at the upper bound, −1 at the lower, 0 otherwise (working bounds only)
        self.var = var
        w = np.abs(res.ineqlin.marginals * b_ub) / lam
        self.row = (res.ineqlin.residual <= ACTIVE_SLACK * np.abs(b_ub)) & (w > ACTIVE_WORK)


def _mechanism(
    lp: _Program,
    work: _Work,
    x: np.ndarray,
    sec_point: np.ndarray,
    net_where: list[tuple[int, int]],
) -> Mechanism:
    """Read hinges, plies at full bearing, planes and net sections from the active set."""
    nsec = sec_point.size
    active: np.ndarray = np.zeros(lp.ns * lp.np, dtype=bool)
    active[sec_point[work.row[:nsec]]] = True
    active = active.reshape(lp.ns, lp.np)
    mp, vu = lp.point_limits()
    m_share = (np.abs(lp.em @ x) / mp).reshape(lp.ns, lp.np)
    v_share = (np.abs(lp.ev @ x) / vu).reshape(lp.ns, lp.np)
    shear_rules = v_share > m_share
    plane_nodes = _plane_nodes(lp.joint, lp.mesh)
    hinges: list[Hinge] = []
    planes: list[tuple[int, int]] = []
    bearing: list[tuple[int, str]] = []
    for s in range(lp.ns):
        at_node = np.zeros(lp.np, dtype=bool)
        at_node[0::2] = (work.var[lp.m(s)] != 0) | (work.var[lp.v(s)] != 0)
        at = active[s] | at_node
        for run in _runs(np.flatnonzero(at & ~shear_rules[s])):
            k = run[int(np.argmax(m_share[s, run]))]
            hinges.append(Hinge(bolt=s, z=float(lp.z_point[k])))
        planes += [
            (s, i + 1)
            for i, nodes in enumerate(plane_nodes)
            if (at & shear_rules[s])[2 * nodes].any()
        ]
        state = work.var[lp.q(s)]
        bearing += [
            (s, p.name) for j, p in enumerate(lp.joint.plies) if _full(state[lp.mesh.ply == j])
        ]
    rows = work.row[nsec:]
    net = [
        (lp.joint.plies[j].name, i)
        for k, (j, i) in enumerate(net_where)
        if rows[2 * k] or rows[2 * k + 1]
    ]
    return Mechanism(
        hinges=tuple(hinges), bearing=tuple(bearing), planes=tuple(planes), net_sections=tuple(net)
    )


def _plane_nodes(joint: Joint, mesh: _Mesh) -> list[np.ndarray]:
    """The nodes of every plane: the shared face, or both faces of the gap between."""
    nodes = []
    for j in range(1, len(joint.plies)):
        last = int(np.flatnonzero(mesh.ply == j - 1)[-1]) + 1  # node at the end of ply j − 1
        first = int(np.flatnonzero(mesh.ply == j)[0])  # node at the start of ply j
        nodes.append(np.arange(last, first + 1))
    return nodes


def _runs(idx: np.ndarray) -> list[np.ndarray]:
    """Split sorted indices into runs of consecutive ones."""
    if idx.size == 0:
        return []
    return np.split(idx, np.flatnonzero(np.diff(idx) > 1) + 1)


def _full(state: np.ndarray) -> bool:
    """Every element at its bearing bound, save isolated elements where the sign flips."""
    if state.size == 0 or state[0] == 0 or state[-1] == 0:
        return False
    for k in np.flatnonzero(state == 0):
        if state[k - 1] == 0 or state[k + 1] == 0 or state[k - 1] == state[k + 1]:
            return False
    return True
