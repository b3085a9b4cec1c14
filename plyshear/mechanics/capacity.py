"""Incremental analysis of one bolt to its first failure event.

The bearing of every ply follows a nonlinear law (:mod:`plyshear.mechanics.laws`)
with the hole clearance as a gap. The joint is loaded along one direction: the
load pattern of the model, scaled by λ. Newton–Raphson with the consistent
tangent, under control of the generalised displacement along the load pattern
(so the analysis passes a peak of the load), with adaptive steps.

Failure events, with nominal strengths (no resistance factors):

* plane shear rupture: the plane shear reaches 0.62·fub·A (A = A_s through
  threads, gross through the shank): Kulak, Fisher & Struik, *Guide to Design
  Criteria for Bolted and Riveted Joints*, 2nd ed. (1987), §4.2;
* ply bearing deformation: the contact deformation reaches the law's limit;
* bolt bending and shear: (M/M_p)² + (V/V_u)² = 1 along the bolt, M_p =
  fyb·d³/6 (plastic moment of a solid circle); its measure is the square root,
  so that every measure grows in proportion to the load while elastic.

The capacity is the load at the first event, located by bisection between
converged steps.
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass
from typing import TYPE_CHECKING

import numpy as np
from scipy.linalg import solve_banded

from plyshear.mechanics import beam, laws
from plyshear.mechanics.assembly import (
    Layout,
    element_displacements,
    endpoint_value,
    layout,
    scatter,
)
from plyshear.model import catalog
from plyshear.model.joint import Joint

if TYPE_CHECKING:
    from plyshear.mechanics.results import Solution

SHEAR_OVER_TENSION = 0.62  # Kulak, Fisher & Struik (1987): bolt shear / tensile strength
#: A tiny stiffness added to every bearing law, as a fraction of the ply's initial
#: bearing stiffness: it keeps the tangent regular before contact and on a plastic
#: plateau (where the bolt's position between yielded plies is otherwise free), and
#: lifts forces by about this fraction of k0 times the deformation.
GAP_STIFFNESS = 1e-8
TOL_FORCE = 1e-9  # Newton: residual over the load, at convergence
MAX_ITER = 30
MAX_HALVINGS = 12
BISECTIONS = 30


class CapacityError(RuntimeError):
    """The incremental analysis did not converge."""


@dataclass(frozen=True)
class Limits:
    """Nominal strengths that define the failure events.

    Attributes:
        plane: Shear rupture strength of every plane, N.
        moment: Plastic moment of the bolt section at every node, N·mm.
        shear: Shear rupture strength of the bolt section at every node, N.
    """

    plane: np.ndarray
    moment: np.ndarray
    shear: np.ndarray


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
    """

    load: float
    slip: float
    plane_shear: np.ndarray
    ply_bearing: np.ndarray
    deformation: np.ndarray
    V: np.ndarray
    M: np.ndarray


@dataclass(frozen=True)
class Event:
    """A failure event: what and where, and its measure (≥ 1 means reached).

    ``z`` (mm) places an event on the bolt itself ("bolt" in ``where``).
    """

    event: str
    where: str
    measure: float
    z: float | None = None


@dataclass(frozen=True)
class CapacityResult:
    """The nonlinear capacity of a joint.

    Attributes:
        load: The load at the first failure event, N.
        event: The first event.
        history: Converged states from zero load to the event.
        iterations: Residual norms of the Newton iterations of every step.
        peak: The largest load reached in the history, N.
    """

    load: float
    event: Event
    history: tuple[State, ...]
    iterations: tuple[tuple[float, ...], ...]
    peak: float


def plane_strength(joint: Joint, threaded: bool) -> float:
    """Shear rupture strength of one plane of the bolt, N (0.62·fub·A)."""
    area = joint.bolt.stress_area if threaded else joint.bolt.gross_area
    return SHEAR_OVER_TENSION * joint.bolt.fub * area


def limits(joint: Joint, z: np.ndarray, plane_threads: list[bool]) -> Limits:
    """Return the nominal strengths of the planes and of the bolt along ``z``."""
    b = joint.bolt
    threaded = b.threaded_along(z)
    d = np.where(threaded, np.sqrt(4.0 * b.stress_area / np.pi), b.diameter)
    return Limits(
        plane=np.array([plane_strength(joint, t) for t in plane_threads]),
        moment=b.fyb * d**3 / 6.0,
        shear=SHEAR_OVER_TENSION * b.fub * np.pi * d**2 / 4.0,
    )


def net_section_strengths(joint: Joint) -> list[float]:
    """Tensile rupture strength of each ply's net section between bolts, N (fu·(w − d0)·t).

    Infinite where the ply gives no width (a single bolt needs none).
    """
    d0 = joint.bolt.diameter + hole_clearance(joint)
    return [p.fu * (p.width - d0) * p.thickness if p.width is not None else float("inf")
            for p in joint.plies]


def law_name(joint: Joint) -> str:
    """The nonlinear law behind the model's bearing law ("component" is linear)."""
    return "linear" if joint.analysis.bearing == "component" else joint.analysis.bearing


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
            raise CapacityError(f"ply {p.name}: hole_offset {o:g} mm is more than half the "
                                f"clearance ({half:g} mm)")
    return half + offset, half - offset


def hole_clearance(joint: Joint) -> float:
    """Diametral clearance of the holes, mm: the model's, or the standard's hole table."""
    if joint.analysis.hole_clearance is not None:
        return joint.analysis.hole_clearance
    d = joint.bolt.diameter
    try:
        return catalog.hole_diameter(d, joint.bolt.hole, joint.check.standard) - d
    except catalog.CatalogError:
        return 2.0


def load_pattern(joint: Joint) -> np.ndarray:
    """The free members' loads along the load axis, N, in member order (the pattern scaled).

    Raises:
        CapacityError: If the loads are not collinear (the capacity scales one
            direction) or there is no load.
    """
    axis = joint.load_axis()
    loads = np.array([m.load for m in joint.members if not m.support],
                     dtype=float).reshape(-1, 2)
    along = loads @ axis
    across = loads @ np.array([-axis[1], axis[0]])
    if np.abs(across).max(initial=0.0) > 1e-9 * np.abs(along).max(initial=1.0):
        raise CapacityError("the member loads are not collinear; the capacity analysis "
                            "scales one load direction")
    if not np.any(along != 0.0):
        raise CapacityError("no load: the capacity needs a loaded member")
    return along


def pattern_total(joint: Joint) -> float:
    """The magnitude of the model's load pattern, Σ|P| over the members, N."""
    return sum(math.hypot(*m.load) for m in joint.members)


class _Model:
    """The discretised joint along the load direction, for repeated evaluation."""

    def __init__(self, joint: Joint) -> None:
        from plyshear.mechanics.assembly import ply_moduli

        self.joint = joint
        self.lay: Layout = layout(joint)
        self.ns = len(self.lay.stations)
        self.L = np.tile(self.lay.mesh.lengths, self.ns)
        self.ply = self.lay.el_ply
        self.n = beam.shape_w(beam.GAUSS_XI, self.lay.phi, self.L)  # (e, g, 4)
        self.wl = beam.GAUSS_W[None, :] * self.L[:, None] * (self.ply >= 0)[:, None]
        k_lin = ply_moduli(joint)
        name = law_name(joint)
        self.curves = [laws.curve(name, joint.bolt, p, float(k)) for p, k in
                       zip(joint.plies, k_lin, strict=True)]
        self.gap_plus, self.gap_minus = clearances(joint)
        self.pattern = load_pattern(joint)  # free members' loads along the axis, N
        self.scale = float(np.abs(self.pattern).sum())  # the pattern's magnitude: Σ|P_m|
        unit = self.pattern / self.scale  # first to O(1): a tiny load's square underflows
        self.c = unit / float(np.linalg.norm(unit))

    def contact(self, s: np.ndarray, j: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
        """Force per length, tangent and contact deformation at Gauss points of ply j."""
        p = np.zeros_like(s)
        dp = np.zeros_like(s)
        delta = np.zeros_like(s)
        for jj in np.unique(j):
            if jj < 0:
                continue
            sel = j == jj
            cv = self.curves[jj]
            g_up, g_dn = self.gap_plus[jj], self.gap_minus[jj]
            ss = s[sel]
            up = ss > g_up
            dn = ss < -g_dn
            dl = np.where(up, ss - g_up, np.where(dn, ss + g_dn, 0.0))
            reg = GAP_STIFFNESS * cv.k0
            p[sel] = cv.q(dl) + reg * ss
            dp[sel] = np.where(up | dn, cv.dq(dl), 0.0) + reg
            delta[sel] = np.abs(dl)
        return p, dp, delta

    def evaluate(self, x: np.ndarray, y: np.ndarray, tangent: bool = True):
        """Internal forces (and the tangent) at the state (x, y), one component."""
        lay = self.lay
        de, u_el, _ = element_displacements(lay, x[:, None], y[:, None])
        de, u_el = de[:, :, 0], u_el[:, 0]
        s = np.einsum("egi,ei->eg", self.n, de) - u_el[:, None]
        jg = np.broadcast_to(self.ply[:, None], s.shape)
        p, dp, delta = self.contact(s.ravel(), jg.ravel())
        p, dp, delta = p.reshape(s.shape), dp.reshape(s.shape), delta.reshape(s.shape)
        fe = np.einsum("eij,ej->ei", lay.kel, de) + np.einsum("eg,eg,egi->ei", self.wl, p, self.n)
        fu = -np.einsum("eg,eg->e", self.wl, p)
        ra = np.zeros(lay.na)
        rm = np.zeros(lay.nm)
        ok = lay.edofs >= 0
        np.add.at(ra, lay.edofs[ok], fe[ok])
        own = lay.tgt_kind == "a"
        np.add.at(ra, lay.tgt_idx[own], fu[own])
        mem = lay.tgt_kind == "m"
        np.add.at(rm, lay.tgt_idx[mem], fu[mem])
        for sp in lay.springs:
            force = sp.k * (endpoint_value(sp.a, x, y) - endpoint_value(sp.b, x, y))
            for (kind, i), f in ((sp.a, force), (sp.b, -force)):
                if kind == "a":
                    ra[i] += f
                elif kind == "m":
                    rm[i] += f
        out = {"ra": ra, "rm": rm, "p": p, "delta": delta, "fe": fe, "de": de, "u_el": u_el}
        if tangent:
            kbb = np.einsum("eg,eg,egi,egj->eij", self.wl, dp, self.n, self.n)
            kbu = -np.einsum("eg,eg,egi->ei", self.wl, dp, self.n)
            kuu = np.einsum("eg,eg->e", self.wl, dp)
            out["K"] = scatter(lay, kbb, kbu, kuu)
        return out

    def state(self, x: np.ndarray, y: np.ndarray, lam: float) -> State:
        """The converged state's plane shears, bearings, deformations and diagrams."""
        ev = self.evaluate(x, y, tangent=False)
        ne = self.lay.ne
        nplies = len(self.joint.plies)
        bolt_on_ply_all = np.einsum("eg,eg->e", self.wl, ev["p"])  # per element
        ff_all = np.einsum("eg,eg,egi->ei", self.wl, ev["p"], self.n)
        L = self.lay.mesh.lengths
        Vs, Ms, planes, bearings, deforms = [], [], [], [], []
        for st in range(self.ns):
            rows = self.lay.station_slice(st)
            bolt_on_ply, ff = bolt_on_ply_all[rows], ff_all[rows]
            V = np.zeros(ne + 1)
            V[1:] = np.cumsum(bolt_on_ply)
            # M from element equilibrium: dM/dz = V, with the bearing's own moment.
            M = np.zeros(ne + 1)
            if self.joint.bolt.ends == "clamped":
                M[0] = (self.lay.kel[rows][0] @ ev["de"][rows][0])[1] + ff[0, 1]
            M[1:] = M[0] + np.cumsum(L * V[1:] - (ff[:, 1] + ff[:, 3] + L * ff[:, 2]))
            ply = self.ply[rows]
            bearing = np.zeros(nplies)
            np.add.at(bearing, np.maximum(ply, 0), np.where(ply >= 0, bolt_on_ply, 0.0))
            deform = np.zeros(nplies)
            np.maximum.at(deform, np.maximum(ply, 0),
                          np.where(ply >= 0, ev["delta"][rows].max(axis=1), 0.0))
            Vs.append(V)
            Ms.append(M)
            planes.append(np.abs(V[self.lay.mesh.plane_nodes]))
            bearings.append(np.abs(bearing))
            deforms.append(deform)
        return State(load=float(lam * self.scale), slip=float(self.c @ y),
                     plane_shear=np.array(planes), ply_bearing=np.array(bearings),
                     deformation=np.array(deforms), V=np.array(Vs), M=np.array(Ms))


def _banded_full(ab_upper: np.ndarray) -> np.ndarray:
    """Upper symmetric band storage → full (l, u) band storage for solve_banded."""
    u, n = ab_upper.shape[0] - 1, ab_upper.shape[1]
    full = np.zeros((2 * u + 1, n))
    full[: u + 1] = ab_upper
    for k in range(1, u + 1):
        full[u + k, : n - k] = ab_upper[u - k, k:]
    return full


def _newton(model: _Model, x: np.ndarray, y: np.ndarray, lam: float, target: float
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
        full = _banded_full(ab)
        u = (full.shape[0] - 1) // 2
        rhs = np.column_stack([-ra, B])
        try:
            sol = solve_banded((u, u), full, rhs, check_finite=False)
        except (np.linalg.LinAlgError, ValueError) as exc:
            raise CapacityError(f"singular tangent ({exc})") from None
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


def events(joint: Joint, model: _Model, st: State, lim: Limits) -> list[Event]:
    """Return every failure measure of a state (≥ 1 means the event is reached)."""
    out = []
    many = model.ns > 1
    for b in range(model.ns):
        tag = f"bolt {b + 1} " if many else ""
        out += [Event("plane shear rupture", f"{tag}plane {i + 1}", float(v / r))
                for i, (v, r) in enumerate(zip(st.plane_shear[b], lim.plane, strict=True))]
        for j, (dl, cv) in enumerate(zip(st.deformation[b], model.curves, strict=True)):
            if np.isfinite(cv.delta_limit):
                out.append(Event("ply bearing deformation",
                                 f"{tag}ply {joint.plies[j].name}", float(dl / cv.delta_limit)))
        inter = np.sqrt((st.M[b] / lim.moment) ** 2 + (st.V[b] / lim.shear) ** 2)
        k = int(np.argmax(inter))
        out.append(Event("bolt bending and shear", f"bolt {b + 1}" if many else "bolt",
                         float(inter[k]), float(model.lay.mesh.z[k])))
    return out


#: The load pattern is scaled to this total (N) before a capacity analysis: the
#: capacity depends only on the pattern's direction and proportions, and a pattern
#: of 1e-300 kN or 1e9 kN would otherwise leave the range of the tolerances.
REFERENCE_PATTERN_N = 1e3


def reference_pattern(joint: Joint) -> Joint:
    """Return ``joint`` with its member loads scaled to a total of :data:`REFERENCE_PATTERN_N`."""
    total = pattern_total(joint)
    if not (total > 0.0 and math.isfinite(total)):
        return joint
    f = REFERENCE_PATTERN_N / total
    members = tuple(dataclasses.replace(m, load=(m.load[0] * f, m.load[1] * f))
                    for m in joint.members)
    return dataclasses.replace(joint, members=members)


def analyse(joint: Joint, steps: int = 40, max_load_factor: float = 1e3,
            strengths: Limits | None = None) -> CapacityResult:
    """Load the joint along its load pattern to the first failure event.

    Args:
        joint: The joint (its member loads give the pattern and direction).
        steps: Initial number of steps up to the linear first-failure estimate.
        max_load_factor: Give up beyond this multiple of the linear estimate.
        strengths: Strengths that define the events (default: :func:`limits`).

    Returns:
        The :class:`CapacityResult`.

    Raises:
        CapacityError: If the analysis does not converge or finds no event.
    """
    joint = reference_pattern(joint)
    model = _Model(joint)
    mesh = model.lay.mesh
    lim = strengths or limits(joint, mesh.z, [joint.bolt.threaded_at(float(mesh.z[n]))
                                              for n in mesh.plane_nodes])
    x = np.zeros(model.lay.na)
    y = np.zeros(model.lay.nm)
    lam = 0.0
    # Size the steps from the fitted elastic state: the slip at its first event,
    # plus the widest gap to close.
    fitted = model if joint.analysis.clearance == "fitted" else _Model(
        dataclasses.replace(joint, analysis=dataclasses.replace(joint.analysis,
                                                                clearance="fitted")))
    x1, y1, lam1, _ = _newton(fitted, x, y, lam, 1e-3)
    st1 = fitted.state(x1, y1, lam1)
    worst = max(e.measure for e in events(joint, fitted, st1, lim))
    gap = float(max(model.gap_plus.max(), model.gap_minus.max()))
    du = (1e-3 / max(worst, 1e-12) + gap) / steps
    history = [model.state(x, y, lam)]
    iterations: list[tuple[float, ...]] = []
    target = 0.0
    halvings = 0
    while True:
        try:
            xn, yn, lamn, norms = _newton(model, x, y, lam, target + du)
        except CapacityError:
            halvings += 1
            if halvings > MAX_HALVINGS:
                raise CapacityError(f"no convergence past load {history[-1].load:.4g} N "
                                    f"(step cut {MAX_HALVINGS} times)") from None
            du /= 2.0
            continue
        st = model.state(xn, yn, lamn)
        found = [e for e in events(joint, model, st, lim) if e.measure >= 1.0]
        if found:
            x, y, lam, target, st, event = _bisect(joint, model, lim, x, y, lam, target,
                                                   target + du)
            history.append(st)
            iterations.append(tuple(norms))
            peak = max(s.load for s in history)
            return CapacityResult(load=st.load, event=event, history=tuple(history),
                                  iterations=tuple(iterations), peak=peak)
        x, y, lam, target = xn, yn, lamn, target + du
        history.append(st)
        iterations.append(tuple(norms))
        if halvings == 0 and len(history) % 10 == 0:
            du *= 1.5
        halvings = max(0, halvings - 1)
        if st.load > max_load_factor * (st1.load / worst) or len(history) > 5000:
            raise CapacityError("no failure event found: check the bearing law and strengths")


def _bisect(joint: Joint, model: _Model, lim: Limits, x, y, lam, lo: float, hi: float):
    """Locate the first event between two generalised displacements."""
    best = None
    for _ in range(BISECTIONS):
        mid = 0.5 * (lo + hi)
        xm, ym, lamm, _ = _newton(model, x, y, lam, mid)
        st = model.state(xm, ym, lamm)
        evs = events(joint, model, st, lim)
        top = max(evs, key=lambda e: e.measure)
        if top.measure >= 1.0:
            hi = mid
            best = (xm, ym, lamm, mid, st, top)
        else:
            lo, x, y, lam = mid, xm, ym, lamm
        if hi - lo < 1e-9 * max(hi, 1e-12):
            break
    if best is None:
        xm, ym, lamm, _ = _newton(model, x, y, lam, hi)
        st = model.state(xm, ym, lamm)
        top = max(events(joint, model, st, lim), key=lambda e: e.measure)
        best = (xm, ym, lamm, hi, st, top)
    return best


@dataclass(frozen=True)
class Answer:
    """One capacity answer: the load, and the event and where (or the cut).

    ``z`` (mm) places an event on the bolt itself.
    """

    load: float
    event: str
    where: str
    z: float | None = None


@dataclass(frozen=True)
class CapacitySummary:
    """The elastic, nonlinear and plastic capacities side by side.

    Attributes:
        planes: Number of shear planes between different members, all bolts together.
        plane_strength: One plane's nominal rupture strength (the strongest plane), N.
        elastic: First failure of the linear solution, scaled.
        nonlinear: First failure of the incremental analysis.
        plastic: The max-flow bound (``where`` lists the cut).
        cut: The planes and plies of the minimum cut.
        analysis: The incremental analysis itself (history, iterations).
    """

    planes: int
    plane_strength: float
    elastic: Answer
    nonlinear: Answer
    plastic: Answer
    cut: tuple[str, ...]
    analysis: CapacityResult

    def efficiency(self, load: float) -> float:
        """Plane efficiency: load / (planes × one plane's strength)."""
        return load / (self.planes * self.plane_strength) if self.planes else float("nan")


def separating_planes(joint: Joint) -> int:
    """Planes between different members, a filler pack counting as transparent."""
    owners = [p.member for p in joint.plies if p.member is not None]
    return sum(1 for a, b in zip(owners, owners[1:], strict=False) if a != b)


def bearing_strengths(joint: Joint) -> list[float]:
    """The bearing strength per unit thickness of every ply under the model's law, N/mm."""
    from plyshear.mechanics.assembly import ply_moduli

    name = law_name(joint)
    return [laws.curve(name, joint.bolt, p, float(k)).q_max
            for p, k in zip(joint.plies, ply_moduli(joint), strict=True)]


def elastic_capacity(joint: Joint, sol: Solution, lim: Limits | None = None,
                     q_max: list[float] | None = None) -> Answer:
    """The linear solution scaled to its first failure event.

    Args:
        joint: The joint.
        sol: Its linear solution at the model's loads.
        lim: Its strengths (default: :func:`limits` on the solution's mesh).
        q_max: Bearing strength per unit thickness of every ply (default:
            :func:`bearing_strengths`).

    Returns:
        The load (magnitude of the scaled pattern, N), the event and where.

    Raises:
        CapacityError: If the solution carries no load, or loads in two directions.
    """
    if lim is None:
        z = sol.bolts[0].z
        lim = limits(joint, z, [p.threads for p in sol.planes])
    if q_max is None:
        q_max = bearing_strengths(joint)
    scale = float(np.abs(load_pattern(joint)).sum())
    many = len(sol.bolts) > 1
    cands: list[tuple[float, str, str, float | None]] = []
    for b, bolt in enumerate(sol.bolts):
        tag = f"bolt {b + 1} " if many else ""
        for p, r in zip(bolt.planes, lim.plane, strict=True):
            if p.shear > 0:
                cands.append((r / p.shear, "plane shear rupture", f"{tag}plane {p.index}",
                              None))
        m = np.hypot(bolt.M[:, 0], bolt.M[:, 1])
        v = np.hypot(bolt.V[:, 0], bolt.V[:, 1])
        inter = np.sqrt((m / lim.moment) ** 2 + (v / lim.shear) ** 2)
        k = int(np.argmax(inter))
        if inter[k] > 0:
            cands.append((float(1.0 / inter[k]), "bolt bending and shear",
                          f"bolt {b + 1}" if many else "bolt", float(bolt.z[k])))
        for pb, q in zip(bolt.plies, q_max, strict=True):
            cap = q * joint.plies[pb.ply].thickness
            if pb.force > 0 and np.isfinite(cap):
                cands.append((cap / pb.force, "ply bearing strength",
                              f"{tag}ply {joint.plies[pb.ply].name}", None))
    if not cands:
        raise CapacityError("no load: the capacity needs a loaded member")
    lam, event, where, z_ev = min(cands, key=lambda c: c[0])
    return Answer(float(lam * scale), event, where, z_ev)


def summarize(joint: Joint) -> CapacitySummary:
    """Return the elastic, nonlinear and plastic capacities of ``joint``.

    Raises:
        CapacityError: If the incremental analysis fails.
    """
    from plyshear.mechanics.loadpath import plastic_bound
    from plyshear.mechanics.solve import solve

    joint = reference_pattern(joint)
    model = _Model(joint)
    sol = solve(joint)
    mesh = model.lay.mesh
    lim = limits(joint, mesh.z, [joint.bolt.threaded_at(float(mesh.z[n]))
                                 for n in mesh.plane_nodes])
    elastic = elastic_capacity(joint, sol, lim, [cv.q_max for cv in model.curves])
    result = analyse(joint)
    nonlinear = Answer(float(result.load), result.event.event, result.event.where,
                       result.event.z)
    ply_caps = [cv.q_max * p.thickness for cv, p in zip(model.curves, joint.plies, strict=True)]
    bound = plastic_bound(joint, list(lim.plane), ply_caps, net_section_strengths(joint))
    plastic = Answer(bound.load, "mechanism", ", ".join(bound.cut))
    strength = float(max(lim.plane))
    return CapacitySummary(planes=separating_planes(joint) * len(joint.stations),
                           plane_strength=strength,
                           elastic=elastic, nonlinear=nonlinear, plastic=plastic,
                           cut=bound.cut, analysis=result)
