"""The nominal strengths every capacity answer is bounded by, in one place.

For a joint (N, mm, MPa):

* each ply's **bearing strength** as a line load along the bolt, N/mm of bolt
  length (the ply's total is that times its thickness): the AISC 360-22
  J3.10(a)(1) nominal bearing and tear-out strengths, hole deformation at
  service a consideration, per unit thickness:
  min(2.4·d·F_u, 1.2·l_c·F_u), with l_c = edge − d_h/2 where the ply gives
  its edge (bearing alone otherwise). A law with a lower ceiling of its own
  (the Rex & Easterling peak) keeps its own. The bearing law gives the
  stiffness; this gives the strength, so the linear stiffness laws are
  bounded too;
* each section's **shear rupture strength** 0.62·f_ub·A (A = A_s where the
  section is threaded, the shank's area elsewhere; Kulak, Fisher & Struik
  1987, :data:`plyshear.mechanics.laws.SHEAR_OVER_TENSION`);
* each section's **plastic moment** f_yb·d³/6 (d: the shank, or the diameter
  of the stress area through threads);
* the **net-section strengths** F_u·(w − d_h)·t of the plies of a bolt row;
* for a pin (``[check] connector = "pin"``, one station), each pin plate's
  **lug rupture strengths** where the ply gives its ``edge`` and ``width``:
  net tension F_u·2·t·b_e with b_e = 2t + 16 mm (0.63 in) ≤ (w − d_h)/2
  and shear-out 0.6·F_u·2·t·(a + d/2) with a = edge − d_h/2 (AISC 360-22
  D5.1(a), Eq. D5-1 and D5.1(b), Eq. D5-2, nominal). The lower one caps the
  ply's bearing strength (as a force per unit length over its thickness), so
  a lug that ruptures first bounds the collapse load and the nonlinear
  ultimate, and the ply's ``bearing_rule`` names it.
"""

from __future__ import annotations

import math
from collections.abc import Callable, Sequence
from dataclasses import dataclass

import numpy as np

from plyshear.mechanics import laws
from plyshear.mechanics.assembly import build_mesh, ply_moduli
from plyshear.mechanics.section import plastic_moment
from plyshear.model import catalog
from plyshear.model.joint import Joint

#: AISC 360-22 J3.10(a)(1): tear-out strength 1.2·l_c·t·F_u, hole deformation at
#: service a design consideration (the companion of 2.4·d·t·F_u).
C_TEAROUT = 1.2
#: Hole clearance taken when the standard's hole table has no row for the bolt, mm.
FALLBACK_CLEARANCE = 2.0
#: AISC 360-22 D5.1(a): b_e = 2t + 16 mm (S.I. form) or 2t + 0.63 in (US form).
LUG_B_E_ALLOWANCE = {"si": 16.0, "us": 0.63 * 25.4}
#: The pin hole's clearance when the model gives none, mm: AISC 360-22 D5.2's limit,
#: 1/32 in (US form) or 1 mm (S.I. form); EN 1993-1-8: 1 mm (the issue's convention,
#: common practice, no source).
PIN_HOLE_CLEARANCE = {"us": 25.4 / 32.0, "si": 1.0}
#: The rule names of a lug's rupture (also the check items' ``what``).
LUG_NET_TENSION = "lug net tension"
LUG_SHEAR_OUT = "lug shear-out"


def law_name(joint: Joint) -> str:
    """The nonlinear law behind the model's bearing law ("component" is linear)."""
    return "linear" if joint.analysis.bearing == "component" else joint.analysis.bearing


def hole_clearance(joint: Joint) -> float:
    """Diametral clearance of the holes, mm: the model's, or the standard's hole table."""
    if joint.analysis.hole_clearance is not None:
        return joint.analysis.hole_clearance
    d = joint.bolt.diameter
    try:
        return catalog.hole_diameter(d, joint.bolt.hole, joint.check.standard) - d
    except catalog.CatalogError:
        return FALLBACK_CLEARANCE


def unit_form(joint: Joint) -> str:
    """The unit form of the AISC equations the model's units call for: "us" or "si"."""
    return "us" if joint.units == "kip-in" else "si"


def pin_hole(joint: Joint, standard: str | None = None) -> float:
    """Diameter of a pin's hole, mm: d + the model's clearance, else d + 1/32 in or 1 mm.

    Args:
        joint: The joint.
        standard: The standard whose convention applies (the model's by default).
    """
    d = joint.bolt.diameter
    if joint.analysis.hole_clearance is not None:
        return d + joint.analysis.hole_clearance
    std = standard or joint.check.standard
    return d + PIN_HOLE_CLEARANCE[unit_form(joint) if std == "aisc360-22" else "si"]


@dataclass(frozen=True)
class LugStrength:
    """Nominal rupture strengths of one pin plate (AISC 360-22 D5.1), N.

    Attributes:
        net_tension: F_u·2·t·b_e (D5.1(a), Eq. D5-1).
        shear_out: 0.6·F_u·2·t·(a + d/2) (D5.1(b), Eq. D5-2).
        b_e: The effective edge distance, mm.
        a: The distance from the hole's edge to the end edge, mm.
    """

    net_tension: float
    shear_out: float
    b_e: float
    a: float

    @property
    def governing(self) -> tuple[float, str]:
        """The lower strength, N, and its rule name."""
        if self.net_tension <= self.shear_out:
            return self.net_tension, LUG_NET_TENSION
        return self.shear_out, LUG_SHEAR_OUT


def lug_strengths(joint: Joint) -> tuple[LugStrength | None, ...]:
    """Every ply's lug rupture strengths (None where they do not apply).

    They apply to the plies of a pin (``[check] connector = "pin"``, a single
    station) that give both ``edge`` and ``width``; the hole is centred
    (:func:`pin_hole`). The same equations as :mod:`plyshear.codes.aisc360`'s
    ``P_n_pin_tension`` and ``P_n_pin_shear`` (mechanics does not call codes).
    """
    if joint.check.connector != "pin" or len(joint.stations) > 1:
        return tuple(None for _ in joint.plies)
    d, dh = joint.bolt.diameter, pin_hole(joint)
    out: list[LugStrength | None] = []
    for p in joint.plies:
        if p.is_filler or p.edge is None or p.width is None:
            out.append(None)
            continue
        t = p.thickness
        b_e = max(min(2.0 * t + LUG_B_E_ALLOWANCE[unit_form(joint)], (p.width - dh) / 2.0), 0.0)
        a = max(p.edge - dh / 2.0, 0.0)
        out.append(
            LugStrength(
                net_tension=p.fu * 2.0 * t * b_e,
                shear_out=0.6 * p.fu * 2.0 * t * (a + d / 2.0),
                b_e=b_e,
                a=a,
            )
        )
    return tuple(out)


@dataclass(frozen=True)
class Strengths:
    """Nominal strengths of a joint.

    Attributes:
        bearing: Bearing strength of every ply per unit length of bolt, N/mm.
        bearing_rule: What governs each ply's bearing strength, for the report.
        curves: Every ply's bearing curve under the model's law, capped at its
            bearing strength (the incremental analysis uses these).
        plane: Shear rupture strength of every plane, N (head to nut).
        plane_threaded: Whether each plane's section is threaded.
        net_section: Net-section strength of every ply between bolts, N (inf
            where the ply gives no width).
        diameter_shank: The shank's diameter, mm.
        diameter_thread: The diameter of the stress area, mm.
        fyb: Bolt yield strength, MPa.
        fub: Bolt tensile strength, MPa.
        thickness: Every ply's thickness, mm.
        threaded_along: The bolt's ``threaded_along(z)``, for the section lookups.
    """

    bearing: np.ndarray
    bearing_rule: tuple[str, ...]
    curves: tuple[laws.BearingCurve, ...]
    plane: np.ndarray
    plane_threaded: tuple[bool, ...]
    net_section: np.ndarray
    diameter_shank: float
    diameter_thread: float
    fyb: float
    fub: float
    thickness: np.ndarray
    threaded_along: Callable[[np.ndarray], np.ndarray]

    def diameter(self, threaded: np.ndarray) -> np.ndarray:
        """Section diameter where ``threaded`` (mm)."""
        return np.where(threaded, self.diameter_thread, self.diameter_shank)

    def moment(self, z: np.ndarray) -> np.ndarray:
        """Plastic moment of the bolt section at ``z``, N·mm."""
        return plastic_moment(self.fyb, self.diameter(self.threaded_along(np.asarray(z))))

    def shear(self, z: np.ndarray) -> np.ndarray:
        """Shear rupture strength of the bolt section at ``z``, N."""
        d = self.diameter(self.threaded_along(np.asarray(z)))
        return laws.SHEAR_OVER_TENSION * self.fub * np.pi * d**2 / 4.0

    @property
    def ply_force(self) -> np.ndarray:
        """Every ply's total bearing strength, N (line strength × thickness)."""
        return self.bearing * self.thickness

    @property
    def shank_moment(self) -> float:
        """The shank's plastic moment, N·mm."""
        return float(plastic_moment(self.fyb, self.diameter_shank))


def plane_strength(joint: Joint, threaded: bool) -> float:
    """Shear rupture strength of one plane of the bolt, N (0.62·fub·A)."""
    area = joint.bolt.stress_area if threaded else joint.bolt.gross_area
    return laws.SHEAR_OVER_TENSION * joint.bolt.fub * area


def plane_threads(joint: Joint) -> tuple[bool, ...]:
    """Whether the bolt is threaded at each plane (head to nut)."""
    mesh = build_mesh(joint)
    return tuple(joint.bolt.threaded_at(float(mesh.z[n])) for n in mesh.plane_nodes)


def ply_bearing(joint: Joint) -> tuple[np.ndarray, tuple[str, ...]]:
    """Every ply's bearing strength per unit bolt length (N/mm) and what governs it.

    Raises:
        ValueError: If a ply's edge leaves no material beyond its hole.
    """
    d = joint.bolt.diameter
    dh = d + hole_clearance(joint)
    q, rule = [], []
    for i, p in enumerate(joint.plies, start=1):
        bearing = laws.C_BEARING * d * p.fu
        if p.edge is not None and p.edge <= dh / 2.0:
            raise ValueError(
                f"ply[{i}].edge: {p.edge:g} mm leaves no material beyond the {dh:g} mm hole"
            )
        if p.edge is not None and C_TEAROUT * (p.edge - dh / 2.0) * p.fu < bearing:
            q.append(C_TEAROUT * (p.edge - dh / 2.0) * p.fu)
            rule.append("tear-out 1.2 lc t fu")
        else:
            q.append(bearing)
            rule.append("bearing 2.4 d t fu")
    return np.array(q), tuple(rule)


def lug_capped(
    joint: Joint, q: np.ndarray, rule: tuple[str, ...]
) -> tuple[np.ndarray, tuple[str, ...]]:
    """The bearing strengths lowered to each pin plate's lug rupture strength, if lower."""
    q, out = q.copy(), list(rule)
    for j, lug in enumerate(lug_strengths(joint)):
        if lug is not None and lug.governing[0] / joint.plies[j].thickness < q[j]:
            q[j] = lug.governing[0] / joint.plies[j].thickness
            out[j] = lug.governing[1]
    return q, tuple(out)


def strengths(joint: Joint, bearing: Sequence[tuple[float, str]] | None = None) -> Strengths:
    """Return the nominal strengths of ``joint``.

    Args:
        joint: The joint.
        bearing: Every ply's bearing strength per unit bolt length (N/mm) and its
            rule, e.g. the model's standard's
            (:func:`plyshear.codes.resistance.nominal_bearing`); default: the
            AISC 360-22 J3.10(a)(1) form of :func:`ply_bearing`.

    Raises:
        ValueError: If a ply's bearing law cannot be built (e.g. an edge
            distance that leaves no material beyond the hole).
    """
    b = joint.bolt
    if bearing is None:
        q, rule = ply_bearing(joint)
    else:
        q, rule = np.array([v for v, _ in bearing], dtype=float), tuple(r for _, r in bearing)
    q, rule = lug_capped(joint, q, rule)
    name = law_name(joint)
    curves, rules = [], list(rule)
    for j, (p, k) in enumerate(zip(joint.plies, ply_moduli(joint), strict=True)):
        cv = laws.curve(name, b, p, float(k))
        if cv.q_max < q[j]:
            q[j] = cv.q_max
            rules[j] = f"{cv.name} law's peak"
        else:
            cv = laws.capped(cv, float(q[j]))
        curves.append(cv)
    threads = plane_threads(joint)
    d0 = b.diameter + hole_clearance(joint)
    net = np.array(
        [
            p.fu * (p.width - d0) * p.thickness if p.width is not None else math.inf
            for p in joint.plies
        ]
    )
    return Strengths(
        bearing=q,
        bearing_rule=tuple(rules),
        curves=tuple(curves),
        plane=np.array([plane_strength(joint, t) for t in threads]),
        plane_threaded=threads,
        net_section=net,
        diameter_shank=b.diameter,
        diameter_thread=math.sqrt(4.0 * b.stress_area / math.pi),
        fyb=b.fyb,
        fub=b.fub,
        thickness=np.array([p.thickness for p in joint.plies]),
        threaded_along=b.threaded_along,
    )
