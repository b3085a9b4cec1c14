"""Incremental analysis of a joint past first yield, to the end of its load–slip curve.

The bearing of every ply follows its curve (:mod:`plyshear.mechanics.laws`,
capped at the ply's bearing strength by :mod:`plyshear.mechanics.strengths`)
with the hole clearance as a gap. The bolt bends by the moment–curvature of its
section (:mod:`plyshear.mechanics.section`, ``[analysis] bolt``). The joint is
loaded along one direction: the load pattern of the model, scaled by λ.
Newton–Raphson with the consistent tangent, under control of the generalised
displacement along the load pattern (so the analysis passes a peak of the
load), with adaptive steps.

The bolt element: the exact two-node Timoshenko element's strain fields (a
linear curvature and a constant shear strain, both linear in the nodal
displacements) with the section's nonlinear moment integrated by Gauss
quadrature; while the bolt is elastic it is the exact element.

On the way the analysis records, with the load at which they happen, the
bolt's first yield, each plastic hinge (curvature :data:`HINGE_CURVATURE`
times the first-yield curvature: M ≈ 0.96 M_p for an elastic–perfectly
plastic circle) and each ply reaching :data:`FULL_BEARING` of its bearing
strength. It ends at the first of (nominal strengths, no resistance factors):

* a section's rupture under shear and moment: √((M/M_u)² + (V/V_u)²) = 1 with
  V_u = 0.62·f_ub·A and M_u = σ_max·d³/6 (σ_max: f_yb for the elastic and
  elastic–plastic bolt, f_ub with strain hardening) — "plane shear rupture" at
  a plane, "bolt bending and shear" elsewhere;
* the bolt's outer fibre strain reaching the grade's elongation, and a ply's
  bearing deformation limit (the deformation limits; ``[analysis]
  deformation_limits = false`` drops both);
* the peak of the load–slip curve, or (without deformation limits) a slip of
  one bolt diameter.

The capacity is the load at the end, located by bisection between steps.
"""

from __future__ import annotations

import dataclasses
import math
from collections.abc import Callable
from dataclasses import dataclass
from typing import Any

import numpy as np
from scipy.linalg import lapack, solve_banded

from plyshear.errors import CapacityError
from plyshear.mechanics import beam, laws
from plyshear.mechanics.assembly import (
    Layout,
    element_displacements,
    layout,
    scatter,
)
from plyshear.mechanics.section import BoltSteel, elongation, moment_curvature, plastic_moment
from plyshear.mechanics.strengths import Strengths, hole_clearance, strengths
from plyshear.model.joint import Joint

#: A tiny stiffness added to every bearing law, as a fraction of the ply's initial
#: bearing stiffness: it keeps the tangent regular before contact and on a plastic
#: plateau (where the bolt's position between yielded plies is otherwise free), and
#: lifts forces by about this fraction of k0 times the deformation.
GAP_STIFFNESS = 1e-8
TOL_FORCE = 1e-9  # Newton: residual over the load, at convergence
MAX_ITER = 30
MAX_HALVINGS = 12
BISECT_TOL = 1e-7  #: relative width of the slip interval at which the end search stops
MAX_STATES = 5000
#: A plastic hinge: curvature this many times the section's first-yield curvature.
HINGE_CURVATURE = 4.0
#: A ply at full bearing: its bearing force at this fraction of its strength.
FULL_BEARING = 0.99
#: Longest bolt element of a yielding bolt, in bolt diameters.
HINGE_ELEMENT = 1.0 / 16.0
#: Without deformation limits the analysis stops at a slip of this many diameters.
SLIP_LIMIT_DIAMETERS = 1.0
#: The load pattern is scaled to this total (N) before a capacity analysis: the
#: capacity depends only on the pattern's direction and proportions, and a pattern
#: of 1e-300 kN or 1e9 kN would otherwise leave the range of the tolerances.
REFERENCE_PATTERN_N = 1e3


@dataclass(frozen=True)
class State:
    """One converged state of the incremental analysis.

    Arrays have a leading bolt (station) axis.

    Attributes:
        load: Magnitude of the applied load pattern, N (λ·Σ|P_m|).
        slip: Generalised displacement along the load pattern, mm.
        plane_shear: Resultant shear of every plane, N, shape (S, planes).
        ply_bearing: Bearing force of every ply, N, shape (S, plies).
        deformation: Largest contact deformation of every ply, mm, (S, plies).
        V: Bolt shear at the nodes, N, shape (S, nn).
        M: Bolt moment at the nodes, N·mm, shape (S, nn).
        curvature: Largest |κ| in every bolt element, 1/mm, shape (S, ne).
    """

    load: float
    slip: float
    plane_shear: np.ndarray
    ply_bearing: np.ndarray
    deformation: np.ndarray
    V: np.ndarray
    M: np.ndarray
    curvature: np.ndarray


@dataclass(frozen=True)
class Event:
    """An event: what and where, and its measure (≥ 1 means reached).

    ``z`` (mm) places an event on the bolt itself ("bolt" in ``where``);
    ``load`` is the load at which a recorded event happened (N).
    """

    event: str
    where: str
    measure: float
    z: float | None = None
    load: float = math.nan


@dataclass(frozen=True)
class CapacityResult:
    """The nonlinear capacity of a joint.

    Attributes:
        load: The load at the end of the analysis, N.
        event: What ended it.
        history: Converged states from zero load to the end.
        iterations: Residual norms of the Newton iterations of every step.
        peak: The largest load reached in the history, N.
        events: The recorded events in order (first yield, hinges, plies at
            full bearing), each with its load, then the end.
        elongation_known: Whether the bolt grade's elongation is tabulated (if
            not, the smallest tabulated one was used).
    """

    load: float
    event: Event
    history: tuple[State, ...]
    iterations: tuple[tuple[float, ...], ...]
    peak: float
    events: tuple[Event, ...] = ()
    elongation_known: bool = True


def clearances(joint: Joint) -> tuple[np.ndarray, np.ndarray]:
    """Return the gaps (mm) before contact in the + and − load directions, per ply.

    ``[analysis] clearance``: "fitted" (every ply in contact from the start),
    "concentric" (holes centred on the bolt) or "offset" (each ply's
    ``hole_offset`` along the load, within the clearance).
    """
    mode = joint.analysis.clearance
    n = len(joint.plies)
    if mode == "fitted":
        return np.zeros(n), np.zeros(n)
    half = 0.5 * hole_clearance(joint)
    offset = np.array([p.hole_offset for p in joint.plies]) if mode == "offset" else np.zeros(n)
    for p, o in zip(joint.plies, offset, strict=True):
        if abs(o) > half * (1 + 1e-12):
            raise CapacityError(
                f"ply {p.name}: hole_offset {o:g} mm is more than half the clearance ({half:g} mm)"
            )
    return half + offset, half - offset


def load_pattern(joint: Joint) -> np.ndarray:
    """The free members' loads along the load axis, N, in member order (the pattern scaled).

    Raises:
        CapacityError: If the loads are not collinear (the capacity scales one
            direction) or there is no load.
    """
    axis = joint.load_axis()
    loads = np.array([m.load for m in joint.members if not m.support], dtype=float).reshape(-1, 2)
    along = loads @ axis
    across = loads @ np.array([-axis[1], axis[0]])
    if np.abs(across).max(initial=0.0) > 1e-9 * np.abs(along).max(initial=1.0):
        raise CapacityError(
            "the member loads are not collinear; the capacity analysis scales one load direction"
        )
    if not np.any(along != 0.0):
        raise CapacityError("no load: the capacity needs a loaded member")
    return along


def pattern_total(joint: Joint) -> float:
    """The magnitude of the model's load pattern, Σ|P| over the members, N."""
    return sum(math.hypot(*m.load) for m in joint.members)


def reference_pattern(joint: Joint) -> Joint:
    """Return ``joint`` with its member loads scaled to a total of :data:`REFERENCE_PATTERN_N`."""
    total = pattern_total(joint)
    if not (total > 0.0 and math.isfinite(total)):
        return joint
    f = REFERENCE_PATTERN_N / total
    members = tuple(
        dataclasses.replace(m, load=(m.load[0] * f, m.load[1] * f)) for m in joint.members
    )
    return dataclasses.replace(joint, members=members)


def _curve_kind(cv: laws.BearingCurve) -> tuple[object, ...]:
    """The structure of a curve: its type, and its inner curve's kind."""
    inner = tuple(
        _curve_kind(getattr(cv, f.name))
        for f in dataclasses.fields(cv)
        if isinstance(getattr(cv, f.name), laws.BearingCurve)
    )
    return (type(cv), *inner)


def stacked_curve(curves: list[laws.BearingCurve], index: np.ndarray) -> laws.BearingCurve:
    """One curve of the kind of ``curves`` whose numeric parameters are arrays.

    Point k gets the parameters of ``curves[index[k]]``, so that one evaluation
    of the curve on the points' deformations is the evaluation of each point's
    own curve. The curves must be of one kind (:func:`_curve_kind`).
    """
    first = curves[0]
    values: dict[str, Any] = {}
    for f in dataclasses.fields(first):
        v = getattr(first, f.name)
        if isinstance(v, laws.BearingCurve):
            values[f.name] = stacked_curve([getattr(c, f.name) for c in curves], index)
        elif isinstance(v, (int, float)) and not isinstance(v, bool):
            values[f.name] = np.array([getattr(c, f.name) for c in curves], dtype=float)[index]
    return dataclasses.replace(first, **values)


def _element_strains(lay: Layout) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """The exact Timoshenko element's curvature and shear-strain operators.

    Under end forces only, the exact element's moment is linear and its shear
    constant: M(ξ) = −f₂(1 − ξ) + f₄ξ, V = (f₂ + f₄)/L with f = K·d. So
    κ(ξ) = B_κ(ξ)·d with B_κ = (−K₂(1 − ξ) + K₄ξ)/EI, and the shear energy is
    dᵀ K_s d with K_s = Φ L (K₂ + K₄)ᵀ(K₂ + K₄)/(12 EI); then
    ∫ B_κᵀ EI B_κ dz + K_s = K exactly.

    Returns:
        (B_κ at the Gauss points, shape (e, g, 4); K_s, shape (e, 4, 4); EI, shape (e,)).
    """
    k = lay.kel
    L = np.diff(lay.mesh.z)
    L = np.tile(L, len(lay.stations))
    EI = k[:, 0, 0] * (1.0 + lay.phi) * L**3 / 12.0
    xi = beam.GAUSS_XI[None, :, None]
    b_k = (-k[:, None, 1, :] * (1.0 - xi) + k[:, None, 3, :] * xi) / EI[:, None, None]
    s = k[:, 1, :] + k[:, 3, :]
    k_s = (lay.phi * L / (12.0 * EI))[:, None, None] * s[:, :, None] * s[:, None, :]
    return b_k, k_s, EI


def yielding_mesh(joint: Joint) -> Joint:
    """The joint meshed fine enough for a yielding bolt's hinges.

    A displacement-based element with a linear curvature overstates a hinge's
    moment on a coarse mesh (by about 1.4 % at ten elements in a ply 1.5 d
    thick, 0.2 % at twenty, against the rigid-plastic closed form), so a
    yielding bolt gets elements no longer than :data:`HINGE_ELEMENT` diameters.
    """
    if joint.analysis.bolt == "elastic":
        return joint
    h = HINGE_ELEMENT * joint.bolt.diameter
    n = max([joint.analysis.elements_per_ply] + [math.ceil(p.thickness / h) for p in joint.plies])
    if n == joint.analysis.elements_per_ply:
        return joint
    return dataclasses.replace(
        joint, analysis=dataclasses.replace(joint.analysis, elements_per_ply=n)
    )


class _Model:
    """The discretised joint along the load direction, for repeated evaluation."""

    def __init__(self, joint: Joint, strength: Strengths | None = None) -> None:
        joint = yielding_mesh(joint)
        self.joint = joint
        self.strength = strength or strengths(joint)
        self.lay: Layout = layout(joint)
        self.ns = len(self.lay.stations)
        self.L = np.tile(self.lay.mesh.lengths, self.ns)
        self.ply = self.lay.el_ply
        self.n = beam.shape_w(beam.GAUSS_XI, self.lay.phi, self.L)  # (e, g, 4)
        self.wl = beam.GAUSS_W[None, :] * self.L[:, None] * (self.ply >= 0)[:, None]
        self.wb = beam.GAUSS_W[None, :] * self.L[:, None]  # bending: every element
        self.curves = self.strength.curves
        self.gap_plus, self.gap_minus = clearances(joint)
        self.pattern = load_pattern(joint)  # free members' loads along the axis, N
        self.scale = float(np.abs(self.pattern).sum())  # the pattern's magnitude: Σ|P_m|
        unit = self.pattern / self.scale  # first to O(1): a tiny load's square underflows
        self.c = unit / float(np.linalg.norm(unit))
        self.steel = BoltSteel.of(joint.bolt, joint.analysis.bolt)
        self.b_k, self.k_s, self.EI = _element_strains(self.lay)
        mid = 0.5 * (self.lay.mesh.z[:-1] + self.lay.mesh.z[1:])
        self.d_el = np.tile(self.strength.diameter(joint.bolt.threaded_along(mid)), self.ns)
        self.kappa_y = 2.0 * self.steel.ey / self.d_el  # first-yield curvature per element
        self.curve_groups = self._groups()
        self._residual_maps()

    def contact(self, s: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
        """Force per length, tangent and contact deformation at every Gauss point (flat).

        The plies whose curves are of one kind are evaluated together, their
        parameters spread over the points (:func:`stacked_curve`): elementwise
        the same arithmetic as one curve at a time. Points in gaps stay zero.
        """
        p = np.zeros_like(s)
        dp = np.zeros_like(s)
        delta = np.zeros_like(s)
        for sel, cv, g_up, g_dn in self.curve_groups:
            ss = s[sel]
            up = ss > g_up
            dn = ss < -g_dn
            dl = np.where(up, ss - g_up, np.where(dn, ss + g_dn, 0.0))
            reg = GAP_STIFFNESS * cv.k0
            p[sel] = cv.q(dl) + reg * ss
            dp[sel] = np.where(up | dn, cv.dq(dl), 0.0) + reg
            delta[sel] = np.abs(dl)
        return p, dp, delta

    def _groups(self) -> list[tuple[np.ndarray, laws.BearingCurve, np.ndarray, np.ndarray]]:
        """Gauss points by kind of curve: (points, stacked curve, gaps up and down)."""
        point_ply = np.broadcast_to(self.ply[:, None], self.n.shape[:2]).ravel()
        kinds: dict[tuple[object, ...], list[int]] = {}
        for j, cv in enumerate(self.curves):
            kinds.setdefault(_curve_kind(cv), []).append(j)
        out = []
        for plies in kinds.values():
            sel = np.flatnonzero(np.isin(point_ply, plies))
            if sel.size == 0:
                continue
            local = np.searchsorted(plies, point_ply[sel])  # position within the group
            cv = stacked_curve([self.curves[j] for j in plies], local)
            out.append((sel, cv, self.gap_plus[point_ply[sel]], self.gap_minus[point_ply[sel]]))
        return out

    def _residual_maps(self) -> None:
        """Where element, ply and spring forces go in the residual (A, then members)."""
        lay = self.lay
        na, nm = lay.na, lay.nm
        sink = na + nm  # held displacements: summed there and dropped
        ok = lay.edofs >= 0
        self.fe_ok = ok
        own, mem = lay.tgt_kind == "a", lay.tgt_kind == "m"
        fu_dest = np.full(lay.tgt_idx.shape, sink)
        fu_dest[own] = lay.tgt_idx[own]
        fu_dest[mem] = na + lay.tgt_idx[mem]
        self.fu_dest = fu_dest

        def index(end: tuple[str, int]) -> int:
            kind, i = end
            return i if kind == "a" else na + i if kind == "m" else sink

        ia = np.array([index(sp.a) for sp in lay.springs], dtype=int)
        ib = np.array([index(sp.b) for sp in lay.springs], dtype=int)
        self.sp_a, self.sp_b = ia, ib
        self.sp_k = np.array([sp.k for sp in lay.springs], dtype=float)
        self.r_dest = np.concatenate([lay.edofs[ok], fu_dest, ia, ib])
        self.r_size = sink + 1

    def bending(self, de: np.ndarray, tangent: bool) -> dict[str, np.ndarray]:
        """The bolt elements' internal forces (and tangent) from their nodal displacements."""
        kappa = np.einsum("egi,ei->eg", self.b_k, de)
        M, dM = moment_curvature(self.steel, kappa, self.d_el[:, None])
        fb = np.einsum("eg,eg,egi->ei", self.wb, M, self.b_k) + np.einsum(
            "eij,ej->ei", self.k_s, de
        )
        out = {"fb": fb, "kappa": kappa}
        if tangent:
            dM = np.broadcast_to(dM, kappa.shape)
            kt = np.einsum("eg,eg,egi,egj->eij", self.wb, dM, self.b_k, self.b_k) + self.k_s
            out["kt"] = kt
        return out

    def evaluate(self, x: np.ndarray, y: np.ndarray, tangent: bool = True) -> dict[str, Any]:
        """Internal forces (and the tangent) at the state (x, y), one component."""
        lay = self.lay
        de, u_el, _ = element_displacements(lay, x[:, None], y[:, None])
        de, u_el = de[:, :, 0], u_el[:, 0]
        s = np.einsum("egi,ei->eg", self.n, de) - u_el[:, None]
        p, dp, delta = self.contact(s.ravel())
        p, dp, delta = p.reshape(s.shape), dp.reshape(s.shape), delta.reshape(s.shape)
        bend = self.bending(de, tangent)
        fe = bend["fb"] + np.einsum("eg,eg,egi->ei", self.wl, p, self.n)
        fu = -np.einsum("eg,eg->e", self.wl, p)
        v = np.concatenate([x, y, [0.0]])
        force = self.sp_k * (v[self.sp_a] - v[self.sp_b])
        r = np.bincount(
            self.r_dest,
            weights=np.concatenate([fe[self.fe_ok], fu, force, -force]),
            minlength=self.r_size,
        )
        ra, rm = r[: lay.na], r[lay.na : lay.na + lay.nm]
        out: dict[str, Any] = {
            "ra": ra,
            "rm": rm,
            "p": p,
            "delta": delta,
            "fb": bend["fb"],
            "de": de,
            "kappa": bend["kappa"],
        }
        if tangent:
            kbb = np.einsum("eg,eg,egi,egj->eij", self.wl, dp, self.n, self.n)
            kbu = -np.einsum("eg,eg,egi->ei", self.wl, dp, self.n)
            kuu = np.einsum("eg,eg->e", self.wl, dp)
            # scatter adds the elastic kel: pass the bolt's tangent as a correction to it
            out["K"] = scatter(lay, kbb + bend["kt"] - lay.kel, kbu, kuu)
        return out

    def state(self, x: np.ndarray, y: np.ndarray, lam: float) -> State:
        """The converged state's plane shears, bearings, deformations and diagrams."""
        ev = self.evaluate(x, y, tangent=False)
        ne = self.lay.ne
        nplies = len(self.joint.plies)
        bolt_on_ply_all = np.einsum("eg,eg->e", self.wl, ev["p"])  # per element
        ff_all = np.einsum("eg,eg,egi->ei", self.wl, ev["p"], self.n)
        kappa_all = np.abs(ev["kappa"]).max(axis=1)
        L = self.lay.mesh.lengths
        Vs, Ms, planes, bearings, deforms, kappas = [], [], [], [], [], []
        for st in range(self.ns):
            rows = self.lay.station_slice(st)
            bolt_on_ply, ff = bolt_on_ply_all[rows], ff_all[rows]
            V = np.zeros(ne + 1)
            V[1:] = np.cumsum(bolt_on_ply)
            # M from element equilibrium: dM/dz = V, with the bearing's own moment.
            M = np.zeros(ne + 1)
            if self.joint.bolt.ends == "clamped":
                M[0] = ev["fb"][rows][0, 1] + ff[0, 1]
            M[1:] = M[0] + np.cumsum(L * V[1:] - (ff[:, 1] + ff[:, 3] + L * ff[:, 2]))
            ply = self.ply[rows]
            bearing = np.zeros(nplies)
            np.add.at(bearing, np.maximum(ply, 0), np.where(ply >= 0, bolt_on_ply, 0.0))
            deform = np.zeros(nplies)
            np.maximum.at(
                deform, np.maximum(ply, 0), np.where(ply >= 0, ev["delta"][rows].max(axis=1), 0.0)
            )
            Vs.append(V)
            Ms.append(M)
            planes.append(np.abs(V[self.lay.mesh.plane_nodes]))
            bearings.append(np.abs(bearing))
            deforms.append(deform)
            kappas.append(kappa_all[rows])
        return State(
            load=float(lam * self.scale),
            slip=float(self.c @ y),
            plane_shear=np.array(planes),
            ply_bearing=np.array(bearings),
            deformation=np.array(deforms),
            V=np.array(Vs),
            M=np.array(Ms),
            curvature=np.array(kappas),
        )


def tangent_solve(ab: np.ndarray, rhs: np.ndarray) -> np.ndarray:
    """Solve the tangent block (upper banded storage) for right-hand sides (n, k).

    LAPACK's banded Cholesky (``dpbtrf``/``dpbtrs``, about four times cheaper
    than a banded LU) while the tangent is positive definite; past a peak, or
    where a softening law makes it indefinite, the banded LU of
    :func:`tangent_solve_lu`.

    Raises:
        CapacityError: If the tangent is singular.
    """
    c, info = lapack.dpbtrf(ab, lower=0)
    if info == 0:
        x, info = lapack.dpbtrs(c, rhs, lower=0)
        if info == 0 and np.all(np.isfinite(x)):
            return x
    return tangent_solve_lu(ab, rhs)


def tangent_solve_lu(ab: np.ndarray, rhs: np.ndarray) -> np.ndarray:
    """Solve the tangent block by banded LU with partial pivoting (any regular tangent).

    Raises:
        CapacityError: If the tangent is singular.
    """
    full = _banded_full(ab)
    u = (full.shape[0] - 1) // 2
    try:
        x = solve_banded((u, u), full, rhs, check_finite=False)
    except (np.linalg.LinAlgError, ValueError) as exc:
        raise CapacityError(f"singular tangent ({exc})") from None
    if not np.all(np.isfinite(x)):
        raise CapacityError("singular tangent")
    return x


def _banded_full(ab_upper: np.ndarray) -> np.ndarray:
    """Upper symmetric band storage → full (l, u) band storage for solve_banded."""
    u, n = ab_upper.shape[0] - 1, ab_upper.shape[1]
    full = np.zeros((2 * u + 1, n))
    full[: u + 1] = ab_upper
    for k in range(1, u + 1):
        full[u + k, : n - k] = ab_upper[u - k, k:]
    return full


def _newton(
    model: _Model, x: np.ndarray, y: np.ndarray, lam: float, target: float
) -> tuple[np.ndarray, np.ndarray, float, list[float]]:
    """Converge to the state whose generalised displacement is ``target``."""
    P, c = model.pattern, model.c
    norms: list[float] = []
    for _ in range(MAX_ITER):
        ev = model.evaluate(x, y)
        ra, rm = ev["ra"], ev["rm"] - lam * P
        g = float(c @ y) - target
        # relative to the load carried, so that the pattern's own magnitude does not matter
        level = model.scale * max(1.0, abs(lam))
        norm = max(float(np.abs(ra).max(initial=0.0)), float(np.abs(rm).max())) / level
        norms.append(norm)
        if norm < TOL_FORCE and abs(g) < 1e-12 * (1.0 + abs(target)):
            return x, y, lam, norms
        ab, B, C = ev["K"]
        sol = tangent_solve(ab, np.column_stack([-ra, B]))
        xa, XB = sol[:, 0], sol[:, 1:]
        S = C - B.T @ XB
        nm = S.shape[0]
        big = np.zeros((nm + 1, nm + 1))
        big[:nm, :nm] = S
        big[:nm, nm] = -P
        big[nm, :nm] = c
        rhs2 = np.concatenate([-rm - B.T @ xa, [-g]])
        try:
            step = np.linalg.solve(big, rhs2)
        except np.linalg.LinAlgError as exc:
            raise CapacityError(f"singular member system ({exc})") from None
        dy, dlam = step[:nm], step[nm]
        x = x + xa - XB @ dy
        y = y + dy
        lam = lam + dlam
    raise CapacityError(f"Newton did not converge (residual {norms[-1]:.1e})")


def _tag(model: _Model, b: int) -> str:
    return f"bolt {b + 1} " if model.ns > 1 else ""


def _section_events(model: _Model, st: State) -> list[Event]:
    """Rupture of every bolt section under shear and moment (measure ≥ 1: ruptured)."""
    mesh = model.lay.mesh
    s = model.strength
    vu = s.shear(mesh.z)
    vu[mesh.plane_nodes] = s.plane  # a plane's own strength (equal unless a study sets it)
    # today's M_p for the elastic bolt; the law's largest stress for a yielding one
    sigma = s.fyb if model.steel.model == "elastic" else model.steel.peak_stress
    mu = plastic_moment(sigma, s.diameter(model.joint.bolt.threaded_along(mesh.z)))
    out = []
    plane_at = {int(n): i for i, n in enumerate(mesh.plane_nodes)}
    for b in range(model.ns):
        inter = np.hypot(st.M[b] / mu, st.V[b] / vu)
        for n, i in plane_at.items():
            out.append(
                Event("plane shear rupture", f"{_tag(model, b)}plane {i + 1}", float(inter[n]))
            )
        inner = np.array([k for k in range(inter.size) if k not in plane_at], dtype=int)
        # a yielding bolt's bending is its material law's (and its elongation's) to limit
        if inner.size and model.steel.model == "elastic":
            k = int(inner[np.argmax(inter[inner])])
            out.append(
                Event(
                    "bolt bending and shear",
                    f"bolt {b + 1}" if model.ns > 1 else "bolt",
                    float(inter[k]),
                    float(mesh.z[k]),
                )
            )
    return out


def _limit_events(model: _Model, st: State) -> list[Event]:
    """The deformation limits: ply bearing deformation and the bolt's elongation."""
    out = []
    joint = model.joint
    for b in range(model.ns):
        for j, (dl, cv) in enumerate(zip(st.deformation[b], model.curves, strict=True)):
            if np.isfinite(cv.delta_limit):
                out.append(
                    Event(
                        "ply bearing deformation",
                        f"{_tag(model, b)}ply {joint.plies[j].name}",
                        float(dl / cv.delta_limit),
                    )
                )
        if model.steel.model != "elastic":
            rows = model.lay.station_slice(b)
            strain = st.curvature[b] * model.d_el[rows] / 2.0
            k = int(np.argmax(strain))
            z = 0.5 * (model.lay.mesh.z[k] + model.lay.mesh.z[k + 1])
            out.append(
                Event(
                    "bolt fibre strain at elongation",
                    f"bolt {b + 1}" if model.ns > 1 else "bolt",
                    float(strain[k] / model.steel.eu),
                    float(z),
                )
            )
    return out


def end_events(model: _Model, st: State) -> list[Event]:
    """Every measure that ends the analysis (≥ 1 means reached)."""
    out = _section_events(model, st)
    if model.joint.analysis.deformation_limits:
        out += _limit_events(model, st)
    else:
        d = model.joint.bolt.diameter
        out.append(
            Event("slip of one bolt diameter", "joint", abs(st.slip) / (SLIP_LIMIT_DIAMETERS * d))
        )
    return out


class _Recorder:
    """Records first yield, hinges and plies at full bearing as the load grows."""

    def __init__(self, model: _Model) -> None:
        self.model = model
        self.events: list[Event] = []
        self.yielded = False
        self.hinges: list[tuple[int, int, int]] = []  # (bolt, first element, last element)
        self.full: set[tuple[int, int]] = set()

    def update(self, prev: State, st: State) -> None:
        m = self.model
        z = m.lay.mesh.z
        mid = 0.5 * (z[:-1] + z[1:])

        def at(ratio_prev: float, ratio: float) -> float:
            """Load where a measure crosses 1 between the two states (linear)."""
            t = (1.0 - ratio_prev) / (ratio - ratio_prev) if ratio > ratio_prev else 1.0
            return prev.load + min(max(t, 0.0), 1.0) * (st.load - prev.load)

        if m.steel.model != "elastic":
            for b in range(m.ns):
                rows = m.lay.station_slice(b)
                r_prev = prev.curvature[b] / m.kappa_y[rows]
                r_now = st.curvature[b] / m.kappa_y[rows]
                if not self.yielded and r_now.max() >= 1.0:
                    k = int(np.argmax(r_now))
                    self.yielded = True
                    self.events.append(
                        Event(
                            "first yield of the bolt",
                            self._bolt(b),
                            float(r_now[k]),
                            float(mid[k]),
                            at(float(r_prev[k]), float(r_now[k])),
                        )
                    )
                self._hinges(b, r_prev / HINGE_CURVATURE, r_now / HINGE_CURVATURE, mid, at)
        for b in range(m.ns):
            cap = m.strength.ply_force
            for j in range(len(m.joint.plies)):
                if (b, j) in self.full or not cap[j] > 0:
                    continue
                r = st.ply_bearing[b, j] / (FULL_BEARING * cap[j])
                if r >= 1.0:
                    self.full.add((b, j))
                    r0 = prev.ply_bearing[b, j] / (FULL_BEARING * cap[j])
                    self.events.append(
                        Event(
                            "ply at full bearing",
                            f"{_tag(m, b)}ply {m.joint.plies[j].name}",
                            float(r),
                            None,
                            at(float(r0), float(r)),
                        )
                    )

    def _bolt(self, b: int) -> str:
        return f"bolt {b + 1}" if self.model.ns > 1 else "bolt"

    def _hinges(
        self,
        b: int,
        r_prev: np.ndarray,
        r_now: np.ndarray,
        mid: np.ndarray,
        at: Callable[[float, float], float],
    ) -> None:
        over = r_now >= 1.0
        k = 0
        while k < over.size:
            if not over[k]:
                k += 1
                continue
            j = k
            while j + 1 < over.size and over[j + 1]:
                j += 1
            if not any(hb == b and not (j < a or k > e) for hb, a, e in self.hinges):
                peak = k + int(np.argmax(r_now[k : j + 1]))
                self.hinges.append((b, k, j))
                self.events.append(
                    Event(
                        "plastic hinge",
                        self._bolt(b),
                        float(r_now[peak]),
                        float(mid[peak]),
                        at(float(r_prev[peak]), float(r_now[peak])),
                    )
                )
            k = j + 1


def analyse(
    joint: Joint, steps: int = 40, max_load_factor: float = 1e3, strength: Strengths | None = None
) -> CapacityResult:
    """Load the joint along its load pattern to the end of its load–slip curve.

    Args:
        joint: The joint (its member loads give the pattern and direction).
        steps: Initial number of steps up to the linear first-event estimate.
        max_load_factor: Give up beyond this multiple of the linear estimate.
        strength: Strengths that bound the analysis (default:
            :func:`plyshear.mechanics.strengths.strengths`).

    Returns:
        The :class:`CapacityResult`.

    Raises:
        CapacityError: If the analysis does not converge or finds no end.
    """
    joint = reference_pattern(joint)
    strength = strength or strengths(joint)
    model = _Model(joint, strength)
    x = np.zeros(model.lay.na)
    y = np.zeros(model.lay.nm)
    lam = 0.0
    # Size the steps from the fitted elastic state: the slip at its first event,
    # plus the widest gap to close.
    fitted = (
        model
        if joint.analysis.clearance == "fitted"
        else _Model(
            dataclasses.replace(
                joint, analysis=dataclasses.replace(joint.analysis, clearance="fitted")
            ),
            strength,
        )
    )
    x1, y1, lam1, _ = _newton(fitted, x, y, lam, 1e-3)
    st1 = fitted.state(x1, y1, lam1)
    worst = max(
        max(e.measure for e in end_events(fitted, st1)),
        float((st1.ply_bearing / strength.ply_force).max()),
    )
    gap = float(max(model.gap_plus.max(), model.gap_minus.max()))
    du = (1e-3 / max(worst, 1e-12) + gap) / steps
    du_max = 0.005 * joint.bolt.diameter
    history = [model.state(x, y, lam)]
    iterations: list[tuple[float, ...]] = []
    recorder = _Recorder(model)
    target = 0.0
    halvings = 0
    while True:
        try:
            xn, yn, lamn, norms = _newton(model, x, y, lam, target + du)
        except CapacityError:
            halvings += 1
            if halvings > MAX_HALVINGS:
                raise CapacityError(
                    f"no convergence past load {history[-1].load:.4g} N "
                    f"(step cut {MAX_HALVINGS} times)"
                ) from None
            du /= 2.0
            continue
        st = model.state(xn, yn, lamn)
        found = [e for e in end_events(model, st) if e.measure >= 1.0]
        if found:
            x, y, lam, target, st, event = locate_end(
                model, x, y, lam, target, target + du, history[-1], st
            )
            recorder.update(history[-1], st)
            return _result(model, history + [st], iterations + [tuple(norms)], event, recorder)
        recorder.update(history[-1], st)
        if st.load < max(s.load for s in history) * (1.0 - 1e-6):
            history.append(st)
            iterations.append(tuple(norms))
            top = max(history, key=lambda s: s.load)
            event = Event("peak of the load-slip curve", "joint", 1.0, None, top.load)
            return _result(model, history, iterations, event, recorder, load=top.load)
        x, y, lam, target = xn, yn, lamn, target + du
        history.append(st)
        iterations.append(tuple(norms))
        if halvings == 0 and len(norms) <= 5:
            du = min(du * 1.25, max(du_max, du))
        halvings = max(0, halvings - 1)
        if st.load > max_load_factor * (st1.load / worst) or len(history) > MAX_STATES:
            raise CapacityError("no failure event found: check the bearing law and strengths")


def _result(
    model: _Model,
    history: list[State],
    iterations: list[tuple[float, ...]],
    event: Event,
    recorder: _Recorder,
    load: float | None = None,
) -> CapacityResult:
    end = history[-1].load if load is None else load
    ended = dataclasses.replace(event, load=end)
    known = elongation(model.joint.bolt)[1]
    return CapacityResult(
        load=end,
        event=ended,
        history=tuple(history),
        iterations=tuple(iterations),
        peak=max(s.load for s in history),
        events=tuple(sorted(recorder.events, key=lambda e: e.load)) + (ended,),
        elongation_known=known or model.steel.model == "elastic",
    )


def _top(model: _Model, st: State) -> Event:
    return max(end_events(model, st), key=lambda e: e.measure)


def locate_end(
    model: _Model,
    x: np.ndarray,
    y: np.ndarray,
    lam: float,
    lo: float,
    hi: float,
    lo_state: State,
    hi_state: State,
) -> tuple[np.ndarray, np.ndarray, float, float, State, Event]:
    """Locate the first end event between two generalised displacements.

    The largest end measure minus one changes sign between ``lo`` (the state
    ``x, y, lam``, below every end) and ``hi`` (an end reached). The crossing is
    bracketed by the Illinois variant of regula falsi (M. Dowell and P. Jarratt,
    "A modified regula falsi method for computing the root of an equation",
    BIT 11 (1971) 168–174, from memory): the secant through the bracket's ends,
    the retained end's value halved when the same end is kept twice, so the
    bracket closes superlinearly; each trial point is kept half the tolerance
    inside the bracket, so the last one closes it. It ends, like
    :func:`bisect_end`, when the bracket is narrower than :data:`BISECT_TOL`,
    with the state at its upper end (in about five Newton solves where the
    bisection takes twenty).

    Returns:
        ``(x, y, lam, target, state, event)`` at the upper end of the final bracket.
    """
    f_lo = _top(model, lo_state).measure - 1.0
    f_hi = _top(model, hi_state).measure - 1.0
    best = None
    kept = 0  # +1: the upper end moved last, −1: the lower end
    while hi - lo > BISECT_TOL * max(abs(hi), 1e-12):
        margin = 0.5 * BISECT_TOL * max(abs(hi), 1e-12)
        t = lo + (hi - lo) * (-f_lo / (f_hi - f_lo)) if f_hi > f_lo else 0.5 * (lo + hi)
        t = min(max(t, lo + margin), hi - margin)
        xm, ym, lamm, _ = _newton(model, x, y, lam, t)
        st = model.state(xm, ym, lamm)
        top = _top(model, st)
        f = top.measure - 1.0
        if f >= 0.0:
            hi, f_hi = t, f
            best = (xm, ym, lamm, t, st, top)
            if kept == 1:
                f_lo *= 0.5
            kept = 1
        else:
            lo, f_lo, x, y, lam = t, f, xm, ym, lamm
            if kept == -1:
                f_hi *= 0.5
            kept = -1
    if best is None:
        xm, ym, lamm, _ = _newton(model, x, y, lam, hi)
        st = model.state(xm, ym, lamm)
        best = (xm, ym, lamm, hi, st, _top(model, st))
    return best


def bisect_end(
    model: _Model,
    x: np.ndarray,
    y: np.ndarray,
    lam: float,
    lo: float,
    hi: float,
    lo_state: State | None = None,
    hi_state: State | None = None,
) -> tuple[np.ndarray, np.ndarray, float, float, State, Event]:
    """Locate the first end event between two generalised displacements by bisection.

    The plain search that :func:`locate_end` replaces (kept as its reference);
    the states at the ends are not used.
    """
    best = None
    while hi - lo > BISECT_TOL * max(abs(hi), 1e-12):
        mid = 0.5 * (lo + hi)
        xm, ym, lamm, _ = _newton(model, x, y, lam, mid)
        st = model.state(xm, ym, lamm)
        top = _top(model, st)
        if top.measure >= 1.0:
            hi = mid
            best = (xm, ym, lamm, mid, st, top)
        else:
            lo, x, y, lam = mid, xm, ym, lamm
    if best is None:
        xm, ym, lamm, _ = _newton(model, x, y, lam, hi)
        st = model.state(xm, ym, lamm)
        best = (xm, ym, lamm, hi, st, _top(model, st))
    return best
