"""EN 1993-1-8:2005 (bolts, packs, long joints, slip, pins) as small pure clause functions.

SI floats in (N, mm, MPa), SI floats out (N, N·mm). The partial factors are
keyword arguments with the recommended values (γM0 = 1.0, γM2 = 1.25,
γM3 = 1.25); a National Annex may set others. Hole types use the model file's
words ("standard" = the standard's "normal", also accepted; "oversized",
"short-slot", "long-slot").
"""

from __future__ import annotations

import math

from plyshear.codes.clause import clause
from plyshear.codes.inputs import non_negative as _non_negative
from plyshear.codes.inputs import positive as _positive
from plyshear.codes.inputs import within as _within
from plyshear.model.joint import HOLE_TYPES as _HOLE_TYPES

STANDARD = "EN 1993-1-8:2005"

#: Bolt classes covered by EN 1993-1-8:2005 (3.1.1, Table 3.1).
BOLT_CLASSES = ("4.6", "4.8", "5.6", "5.8", "6.8", "8.8", "10.9")
_ALPHA_V_06 = ("4.6", "5.6", "8.8")

#: The model's hole types, and "normal": the standard's own name of a standard hole.
HOLE_TYPES = (*_HOLE_TYPES, "normal")


def _governs(value: float | None) -> bool:
    """Say whether an optional spacing is given (None or +inf: not governing)."""
    return value is not None and not math.isinf(value)


@clause(STANDARD, "Table 3.3")
def e_min(d_0: float) -> float:
    r"""Minimum end or edge distance e1, e2.

    .. math:: e_{1,min} = e_{2,min} = 1.2\,d_0

    Args:
        d_0: Hole diameter, mm.

    Returns:
        The minimum distance, mm.
    """
    _positive(d_0=d_0)
    return 1.2 * d_0


@clause(STANDARD, "Table 3.3")
def p_1_min(d_0: float) -> float:
    r"""Minimum spacing p1 in the direction of load transfer.

    .. math:: p_{1,min} = 2.2\,d_0

    Args:
        d_0: Hole diameter, mm.

    Returns:
        The minimum spacing, mm.
    """
    _positive(d_0=d_0)
    return 2.2 * d_0


@clause(STANDARD, "Table 3.3")
def p_2_min(d_0: float) -> float:
    r"""Minimum spacing p2 perpendicular to the direction of load transfer.

    .. math:: p_{2,min} = 2.4\,d_0

    Args:
        d_0: Hole diameter, mm.

    Returns:
        The minimum spacing, mm.
    """
    _positive(d_0=d_0)
    return 2.4 * d_0


@clause(STANDARD, "Table 3.4")
def alpha_v(grade: str, threads_in_plane: bool) -> float:
    """Shear factor αv of a bolt class for one shear plane.

    Threads in the plane: 0.6 for classes 4.6, 5.6, 8.8; 0.5 for 4.8, 5.8,
    6.8, 10.9. Unthreaded shank in the plane: 0.6 for every class. Class 12.9
    is not covered by EN 1993-1-8:2005 (3.1.1) and is rejected.

    Args:
        grade: Bolt class, one of :data:`BOLT_CLASSES`.
        threads_in_plane: True when the shear plane passes through the threaded portion.

    Returns:
        αv, dimensionless.
    """
    if grade not in BOLT_CLASSES:
        raise ValueError(f"bolt class must be one of {BOLT_CLASSES}, got {grade!r}")
    if not threads_in_plane or grade in _ALPHA_V_06:
        return 0.6
    return 0.5


@clause(STANDARD, "Table 3.4")
def F_v_Rd(alpha_v: float, f_ub: float, A: float, gamma_M2: float = 1.25) -> float:
    r"""Shear resistance of a bolt per shear plane.

    A is the tensile stress area A_s when the plane passes through the thread,
    the gross area πd²/4 when it passes through the shank. γM2 is a keyword
    (recommended 1.25; National Annex may differ).

    .. math:: F_{v,Rd} = \frac{\alpha_v f_{ub} A}{\gamma_{M2}}

    Args:
        alpha_v: Shear factor, dimensionless (:func:`alpha_v`), in (0, 0.6].
        f_ub: Ultimate tensile strength of the bolt, MPa.
        A: Shear area of the bolt in the plane, mm².
        gamma_M2: Partial factor, dimensionless.

    Returns:
        Fv,Rd, N.
    """
    _within("alpha_v", alpha_v, 0.0, 0.6)
    _positive(f_ub=f_ub, A=A, gamma_M2=gamma_M2)
    return alpha_v * f_ub * A / gamma_M2


@clause(STANDARD, "Table 3.4")
def alpha_b(
    e_1: float | None,
    p_1: float | None,
    d_0: float,
    f_ub: float,
    f_u: float,
    end_bolt: bool,
) -> float:
    r"""Bearing factor αb in the direction of load transfer.

    An end bolt uses e1, an inner bolt p1; the other may be None. Distances
    below the Table 3.3 minima (e1 < 1.2 d0, p1 < 2.2 d0) are rejected.

    .. math::
        \alpha_b = \min\left(\alpha_d,\; \frac{f_{ub}}{f_u},\; 1.0\right), \quad
        \alpha_d = \frac{e_1}{3 d_0} \;(\text{end bolt}), \quad
        \alpha_d = \frac{p_1}{3 d_0} - \frac{1}{4} \;(\text{inner bolt})

    Args:
        e_1: End distance along the force, mm (needed for an end bolt).
        p_1: Spacing along the force, mm (needed for an inner bolt).
        d_0: Hole diameter, mm.
        f_ub: Ultimate tensile strength of the bolt, MPa.
        f_u: Ultimate tensile strength of the ply, MPa.
        end_bolt: True for an end bolt, False for an inner bolt.

    Returns:
        αb, dimensionless, in (0, 1].
    """
    _positive(d_0=d_0, f_ub=f_ub, f_u=f_u)
    if end_bolt:
        if e_1 is None:
            raise ValueError("an end bolt needs e_1")
        _positive(e_1=e_1)
        if e_1 < e_min(d_0):
            raise ValueError(f"e_1 = {e_1} mm is below the minimum 1.2 d0 = {e_min(d_0)} mm")
        alpha_d = e_1 / (3.0 * d_0)
    else:
        if p_1 is None:
            raise ValueError("an inner bolt needs p_1")
        _positive(p_1=p_1)
        if p_1 < p_1_min(d_0):
            raise ValueError(f"p_1 = {p_1} mm is below the minimum 2.2 d0 = {p_1_min(d_0)} mm")
        alpha_d = p_1 / (3.0 * d_0) - 0.25
    return min(alpha_d, f_ub / f_u, 1.0)


@clause(STANDARD, "Table 3.4")
def k_1(e_2: float | None, p_2: float | None, d_0: float, edge_bolt: bool) -> float:
    r"""Bearing factor k1 perpendicular to the direction of load transfer.

    p2 (and e2 for an inner bolt) may be None or ``math.inf`` meaning "not
    governing" (a single line of bolts). Distances below the Table 3.3 minima
    (e2 < 1.2 d0, p2 < 2.4 d0) are rejected.

    .. math::
        k_1 = \min\left(2.8\frac{e_2}{d_0} - 1.7,\; 1.4\frac{p_2}{d_0} - 1.7,\; 2.5\right)
        \;(\text{edge bolt}), \qquad
        k_1 = \min\left(1.4\frac{p_2}{d_0} - 1.7,\; 2.5\right) \;(\text{inner bolt})

    Args:
        e_2: Edge distance across the force, mm (needed for an edge bolt).
        p_2: Spacing across the force, mm, or None.
        d_0: Hole diameter, mm.
        edge_bolt: True for an edge bolt, False for an inner bolt.

    Returns:
        k1, dimensionless, in (0, 2.5].
    """
    _positive(d_0=d_0)
    candidates = [2.5]
    if _governs(p_2):
        assert p_2 is not None
        _positive(p_2=p_2)
        if p_2 < p_2_min(d_0):
            raise ValueError(f"p_2 = {p_2} mm is below the minimum 2.4 d0 = {p_2_min(d_0)} mm")
        candidates.append(1.4 * p_2 / d_0 - 1.7)
    if edge_bolt:
        if not _governs(e_2):
            raise ValueError("an edge bolt needs a finite e_2")
        assert e_2 is not None
        _positive(e_2=e_2)
        if e_2 < e_min(d_0):
            raise ValueError(f"e_2 = {e_2} mm is below the minimum 1.2 d0 = {e_min(d_0)} mm")
        candidates.append(2.8 * e_2 / d_0 - 1.7)
    return min(candidates)


@clause(STANDARD, "Table 3.4")
def F_b_Rd(
    k_1: float, alpha_b: float, f_u: float, d: float, t: float, gamma_M2: float = 1.25
) -> float:
    r"""Bearing resistance of one ply at one bolt.

    γM2 is a keyword (recommended 1.25; National Annex may differ). Reductions
    for oversized and slotted holes: :func:`bearing_hole_factor`.

    .. math:: F_{b,Rd} = \frac{k_1 \alpha_b f_u d t}{\gamma_{M2}}

    Args:
        k_1: Factor across the force, dimensionless (:func:`k_1`), in (0, 2.5].
        alpha_b: Factor along the force, dimensionless (:func:`alpha_b`), in (0, 1].
        f_u: Ultimate tensile strength of the ply, MPa.
        d: Bolt diameter, mm.
        t: Ply thickness, mm.
        gamma_M2: Partial factor, dimensionless.

    Returns:
        Fb,Rd, N.
    """
    _within("k_1", k_1, 0.0, 2.5)
    _within("alpha_b", alpha_b, 0.0, 1.0)
    _positive(f_u=f_u, d=d, t=t, gamma_M2=gamma_M2)
    return k_1 * alpha_b * f_u * d * t / gamma_M2


@clause(STANDARD, "Table 3.4, footnote on oversized and slotted holes")
def bearing_hole_factor(hole: str, slot_parallel_to_load: bool = False) -> float:
    """Factor on Fb,Rd for the hole type.

    Normal holes 1.0; oversized holes 0.8; slotted holes with the slot
    perpendicular to the force 0.6. For slots parallel to the force the note
    gives no reduction (1.0).

    Args:
        hole: One of :data:`HOLE_TYPES`.
        slot_parallel_to_load: For slots, True when the slot runs parallel to the force.

    Returns:
        The factor, dimensionless.
    """
    _check_hole(hole, slot_parallel_to_load)
    if hole in ("standard", "normal"):
        return 1.0
    if hole == "oversized":
        return 0.8
    return 1.0 if slot_parallel_to_load else 0.6


@clause(STANDARD, "Table 3.4")
def F_t_Rd(f_ub: float, A_s: float, k_2: float = 0.9, gamma_M2: float = 1.25) -> float:
    r"""Tension resistance of a bolt.

    k2 = 0.9, or 0.63 for countersunk bolts (keyword). γM2 is a keyword
    (recommended 1.25; National Annex may differ).

    .. math:: F_{t,Rd} = \frac{k_2 f_{ub} A_s}{\gamma_{M2}}

    Args:
        f_ub: Ultimate tensile strength of the bolt, MPa.
        A_s: Tensile stress area, mm².
        k_2: Factor, dimensionless, in (0, 0.9].
        gamma_M2: Partial factor, dimensionless.

    Returns:
        Ft,Rd, N.
    """
    _positive(f_ub=f_ub, A_s=A_s)
    _within("k_2", k_2, 0.0, 0.9)
    _positive(gamma_M2=gamma_M2)
    return k_2 * f_ub * A_s / gamma_M2


@clause(STANDARD, "Table 3.4")
def shear_tension_interaction(F_v_Ed: float, F_v_Rd: float, F_t_Ed: float, F_t_Rd: float) -> float:
    r"""Utilization of a bolt under combined shear and tension (to be <= 1.0).

    .. math:: \frac{F_{v,Ed}}{F_{v,Rd}} + \frac{F_{t,Ed}}{1.4 F_{t,Rd}}

    Args:
        F_v_Ed: Design shear force per plane, N (>= 0).
        F_v_Rd: Shear resistance per plane, N.
        F_t_Ed: Design tension, N (>= 0).
        F_t_Rd: Tension resistance, N.

    Returns:
        The interaction ratio, dimensionless.
    """
    _non_negative(F_v_Ed=F_v_Ed, F_t_Ed=F_t_Ed)
    _positive(F_v_Rd=F_v_Rd, F_t_Rd=F_t_Rd)
    return F_v_Ed / F_v_Rd + F_t_Ed / (1.4 * F_t_Rd)


@clause(STANDARD, "3.6.1(12)")
def beta_p(d: float, t_p: float) -> float:
    r"""Reduction of the shear resistance of a bolt passing through packing.

    Applies when the total packing thickness exceeds d/3; otherwise 1.

    .. math:: \beta_p = \frac{9d}{8d + 3t_p} \le 1

    Args:
        d: Nominal bolt diameter, mm.
        t_p: Total thickness of the packing, mm (>= 0).

    Returns:
        βp, dimensionless, in (0, 1].
    """
    _positive(d=d)
    _non_negative(t_p=t_p)
    if t_p <= d / 3.0:
        return 1.0
    return min(1.0, 9.0 * d / (8.0 * d + 3.0 * t_p))


@clause(STANDARD, "3.8(1)")
def beta_Lf(L_j: float, d: float) -> float:
    r"""Reduction of the shear resistance of all bolts in a long joint.

    Applies when the distance between the centres of the end fasteners, Lj,
    exceeds 15d; otherwise 1.

    .. math:: \beta_{Lf} = 1 - \frac{L_j - 15d}{200d}, \qquad 0.75 \le \beta_{Lf} \le 1.0

    Args:
        L_j: Distance between the centres of the end fasteners, mm (>= 0).
        d: Nominal bolt diameter, mm.

    Returns:
        βLf, dimensionless, in [0.75, 1].
    """
    _non_negative(L_j=L_j)
    _positive(d=d)
    value = 1.0 - (L_j - 15.0 * d) / (200.0 * d)
    return min(1.0, max(0.75, value))


@clause(STANDARD, "3.9.1(2), Eq. 3.7")
def F_p_C(f_ub: float, A_s: float) -> float:
    """Design preload of a bolt.

    .. math:: F_{p,C} = 0.7 f_{ub} A_s

    Args:
        f_ub: Ultimate tensile strength of the bolt, MPa.
        A_s: Tensile stress area, mm².

    Returns:
        Fp,C, N.
    """
    _positive(f_ub=f_ub, A_s=A_s)
    return 0.7 * f_ub * A_s


def _check_hole(hole: str, slot_parallel_to_load: bool) -> None:
    if hole not in HOLE_TYPES:
        raise ValueError(f"hole must be one of {HOLE_TYPES}, got {hole!r}")
    if slot_parallel_to_load and hole not in ("short-slot", "long-slot"):
        raise ValueError("slot_parallel_to_load applies to 'short-slot' and 'long-slot' only")


@clause(STANDARD, "Table 3.6")
def k_s(hole: str, slot_parallel_to_load: bool = False) -> float:
    """Hole factor ks of the slip resistance.

    Normal holes 1.0; oversized holes and short slots perpendicular to the
    force 0.85; long slots perpendicular 0.7; short slots parallel 0.76; long
    slots parallel 0.63.

    Args:
        hole: One of :data:`HOLE_TYPES`.
        slot_parallel_to_load: For slots, True when the slot axis runs parallel
            to the direction of load transfer.

    Returns:
        ks, dimensionless.
    """
    _check_hole(hole, slot_parallel_to_load)
    if hole in ("standard", "normal"):
        return 1.0
    if hole == "oversized":
        return 0.85
    if hole == "short-slot":
        return 0.76 if slot_parallel_to_load else 0.85
    return 0.63 if slot_parallel_to_load else 0.7


@clause(STANDARD, "Table 3.7")
def mu_class(surface_class: str) -> float:
    """Slip factor of a friction-surface class.

    Args:
        surface_class: ``"A"`` (0.5), ``"B"`` (0.4), ``"C"`` (0.3) or ``"D"`` (0.2).

    Returns:
        μ, dimensionless.
    """
    values = {"A": 0.5, "B": 0.4, "C": 0.3, "D": 0.2}
    if surface_class not in values:
        raise ValueError(f"surface class must be one of {tuple(values)}, got {surface_class!r}")
    return values[surface_class]


def _slip_arguments(k_s: float, n: int, mu: float, F_p_C: float, gamma_M3: float) -> None:
    _within("k_s", k_s, 0.0, 1.0)
    if int(n) != n or n < 1:
        raise ValueError(f"n must be an integer >= 1 (friction surfaces), got {n!r}")
    _within("mu", mu, 0.0, 1.0)
    _positive(F_p_C=F_p_C, gamma_M3=gamma_M3)


@clause(STANDARD, "3.9.1, Eq. 3.6")
def F_s_Rd(k_s: float, n: int, mu: float, F_p_C: float, gamma_M3: float = 1.25) -> float:
    r"""Slip resistance of a preloaded bolt.

    γM3 is a keyword: 1.25 at the ultimate limit state (category C), 1.1
    (γM3,ser) for category B at serviceability; National Annex may differ.

    .. math:: F_{s,Rd} = \frac{k_s\, n\, \mu}{\gamma_{M3}} F_{p,C}

    Args:
        k_s: Hole factor, dimensionless (:func:`k_s`).
        n: Number of friction surfaces, >= 1.
        mu: Slip factor, dimensionless (:func:`mu_class`).
        F_p_C: Preload, N (:func:`F_p_C`).
        gamma_M3: Partial factor, dimensionless.

    Returns:
        Fs,Rd, N.
    """
    _slip_arguments(k_s, n, mu, F_p_C, gamma_M3)
    return k_s * n * mu * F_p_C / gamma_M3


@clause(STANDARD, "3.9.2, Eq. 3.8")
def F_s_Rd_with_tension(
    k_s: float,
    n: int,
    mu: float,
    F_p_C: float,
    F_t_Ed: float,
    gamma_M3: float = 1.25,
) -> float:
    r"""Slip resistance of a preloaded bolt that also carries tension.

    Category C uses F_t_Ed at ULS with γM3 = 1.25 (Eq. 3.8a); category B uses
    Ft,Ed,ser with γM3,ser = 1.1 (Eq. 3.8b). Both are keywords a National
    Annex may change. Not negative.

    .. math:: F_{s,Rd} = \frac{k_s\, n\, \mu\, (F_{p,C} - 0.8 F_{t,Ed})}{\gamma_{M3}}

    Args:
        k_s: Hole factor, dimensionless (:func:`k_s`).
        n: Number of friction surfaces, >= 1.
        mu: Slip factor, dimensionless (:func:`mu_class`).
        F_p_C: Preload, N (:func:`F_p_C`).
        F_t_Ed: Design tension, N (>= 0).
        gamma_M3: Partial factor, dimensionless.

    Returns:
        Fs,Rd, N, >= 0.
    """
    _slip_arguments(k_s, n, mu, F_p_C, gamma_M3)
    _non_negative(F_t_Ed=F_t_Ed)
    return k_s * n * mu * max(0.0, F_p_C - 0.8 * F_t_Ed) / gamma_M3


@clause(STANDARD, "3.13.2, Table 3.10")
def F_v_Rd_pin(A: float, f_up: float, gamma_M2: float = 1.25) -> float:
    r"""Shear resistance of a pin per shear plane.

    γM2 is a keyword (recommended 1.25; National Annex may differ).

    .. math:: F_{v,Rd} = \frac{0.6\, A\, f_{up}}{\gamma_{M2}}

    Args:
        A: Cross-sectional area of the pin, mm².
        f_up: Ultimate tensile strength of the pin, MPa.
        gamma_M2: Partial factor, dimensionless.

    Returns:
        Fv,Rd, N.
    """
    _positive(A=A, f_up=f_up, gamma_M2=gamma_M2)
    return 0.6 * A * f_up / gamma_M2


@clause(STANDARD, "3.13.2, Table 3.10")
def F_b_Rd_pin(t: float, d: float, f_y: float, gamma_M0: float = 1.0) -> float:
    r"""Bearing resistance of a plate and a pin.

    f_y is the lower of the yield strengths of the pin and the plate. γM0 is
    a keyword (recommended 1.0; National Annex may differ).

    .. math:: F_{b,Rd} = \frac{1.5\, t\, d\, f_y}{\gamma_{M0}}

    Args:
        t: Plate thickness, mm.
        d: Pin diameter, mm.
        f_y: Lower yield strength of pin and plate, MPa.
        gamma_M0: Partial factor, dimensionless.

    Returns:
        Fb,Rd, N.
    """
    _positive(t=t, d=d, f_y=f_y, gamma_M0=gamma_M0)
    return 1.5 * t * d * f_y / gamma_M0


@clause(STANDARD, "3.13.2, Table 3.10")
def M_Rd_pin(d: float, f_yp: float, gamma_M0: float = 1.0) -> float:
    r"""Bending resistance of a pin.

    γM0 is a keyword (recommended 1.0; National Annex may differ).

    .. math:: M_{Rd} = \frac{1.5\, W_{el}\, f_{yp}}{\gamma_{M0}}, \qquad W_{el} = \frac{\pi d^3}{32}

    Args:
        d: Pin diameter, mm.
        f_yp: Yield strength of the pin, MPa.
        gamma_M0: Partial factor, dimensionless.

    Returns:
        M_Rd, N·mm.
    """
    _positive(d=d, f_yp=f_yp, gamma_M0=gamma_M0)
    return 1.5 * (math.pi * d**3 / 32.0) * f_yp / gamma_M0


@clause(STANDARD, "3.13.2, Table 3.10")
def pin_interaction(M_Ed: float, M_Rd: float, F_v_Ed: float, F_v_Rd: float) -> float:
    r"""Utilization of a pin under combined bending and shear (to be <= 1.0).

    .. math:: \left(\frac{M_{Ed}}{M_{Rd}}\right)^2 + \left(\frac{F_{v,Ed}}{F_{v,Rd}}\right)^2

    Args:
        M_Ed: Design bending moment, N·mm (>= 0).
        M_Rd: Bending resistance, N·mm.
        F_v_Ed: Design shear force per plane, N (>= 0).
        F_v_Rd: Shear resistance per plane, N.

    Returns:
        The interaction ratio, dimensionless.
    """
    _non_negative(M_Ed=M_Ed, F_v_Ed=F_v_Ed)
    _positive(M_Rd=M_Rd, F_v_Rd=F_v_Rd)
    return (M_Ed / M_Rd) ** 2 + (F_v_Ed / F_v_Rd) ** 2


@clause(STANDARD, "3.13.2, Figure 3.11")
def M_Ed_clevis(F_Ed: float, a: float, b: float, c: float) -> float:
    r"""Design bending moment of a pin in a clevis (fork) with uniform bearing.

    .. math:: M_{Ed} = \frac{F_{Ed}\,(b + 4c + 2a)}{8}

    Args:
        F_Ed: Design force carried by the inner plate, N (>= 0).
        a: Thickness of each outer plate, mm.
        b: Thickness of the inner plate, mm.
        c: Clear gap between the inner and each outer plate, mm (>= 0).

    Returns:
        M_Ed, N·mm.
    """
    _non_negative(F_Ed=F_Ed)
    _positive(a=a, b=b)
    _non_negative(c=c)
    return F_Ed * (b + 4.0 * c + 2.0 * a) / 8.0


# Pin plates (3.13.1, Table 3.9) and replaceable pins (3.13.2) -------------------------


@clause(STANDARD, "3.13.1, Table 3.9 (type A)")
def a_min_pin_plate(F_Ed: float, t: float, f_y: float, d_0: float, gamma_M0: float = 1.0) -> float:
    r"""Least distance a from the hole edge to the plate's end, along the force (type A).

    γM0 is a keyword (recommended 1.0; National Annex may differ).

    .. math:: a \ge \frac{F_{Ed}\,\gamma_{M0}}{2\,t\,f_y} + \frac{2 d_0}{3}

    Args:
        F_Ed: Design force on the plate, N (>= 0).
        t: Plate thickness, mm.
        f_y: Yield strength of the plate, MPa.
        d_0: Hole diameter, mm.
        gamma_M0: Partial factor, dimensionless.

    Returns:
        The least a, mm.
    """
    _non_negative(F_Ed=F_Ed)
    _positive(t=t, f_y=f_y, d_0=d_0, gamma_M0=gamma_M0)
    return F_Ed * gamma_M0 / (2.0 * t * f_y) + 2.0 * d_0 / 3.0


@clause(STANDARD, "3.13.1, Table 3.9 (type A)")
def c_min_pin_plate(F_Ed: float, t: float, f_y: float, d_0: float, gamma_M0: float = 1.0) -> float:
    r"""Least distance c from the hole edge to the plate's side, across the force (type A).

    γM0 is a keyword (recommended 1.0; National Annex may differ).

    .. math:: c \ge \frac{F_{Ed}\,\gamma_{M0}}{2\,t\,f_y} + \frac{d_0}{3}

    Args:
        F_Ed: Design force on the plate, N (>= 0).
        t: Plate thickness, mm.
        f_y: Yield strength of the plate, MPa.
        d_0: Hole diameter, mm.
        gamma_M0: Partial factor, dimensionless.

    Returns:
        The least c, mm.
    """
    _non_negative(F_Ed=F_Ed)
    _positive(t=t, f_y=f_y, d_0=d_0, gamma_M0=gamma_M0)
    return F_Ed * gamma_M0 / (2.0 * t * f_y) + d_0 / 3.0


@clause(STANDARD, "3.13.1, Table 3.9 (type B)")
def t_min_pin_plate(F_Ed: float, f_y: float, gamma_M0: float = 1.0) -> float:
    r"""Least thickness of a pin plate of the given (type B) shape.

    γM0 is a keyword (recommended 1.0; National Annex may differ).

    .. math:: t \ge 0.7 \sqrt{\frac{F_{Ed}\,\gamma_{M0}}{f_y}}

    Args:
        F_Ed: Design force on the plate, N (>= 0).
        f_y: Yield strength of the plate, MPa.
        gamma_M0: Partial factor, dimensionless.

    Returns:
        The least t, mm.
    """
    _non_negative(F_Ed=F_Ed)
    _positive(f_y=f_y, gamma_M0=gamma_M0)
    return 0.7 * math.sqrt(F_Ed * gamma_M0 / f_y)


@clause(STANDARD, "3.13.1, Table 3.9 (type B)")
def d_0_max_pin_plate(t: float) -> float:
    r"""Largest hole in a pin plate of the given (type B) shape.

    .. math:: d_0 \le 2.5\,t

    Args:
        t: Plate thickness, mm.

    Returns:
        The largest d_0, mm.
    """
    _positive(t=t)
    return 2.5 * t


@clause(STANDARD, "3.13.2, Table 3.10 (replaceable pin)")
def F_b_Rd_ser_pin(t: float, d: float, f_y: float, gamma_M6_ser: float = 1.0) -> float:
    r"""Bearing resistance of a plate and a replaceable pin at serviceability.

    f_y is the lower of the yield strengths of the pin and the plate. γM6,ser is
    a keyword (recommended 1.0; National Annex may differ).

    .. math:: F_{b,Rd,ser} = \frac{0.6\, t\, d\, f_y}{\gamma_{M6,ser}}

    Args:
        t: Plate thickness, mm.
        d: Pin diameter, mm.
        f_y: The lower yield strength, MPa.
        gamma_M6_ser: Partial factor, dimensionless.

    Returns:
        Fb,Rd,ser, N.
    """
    _positive(t=t, d=d, f_y=f_y, gamma_M6_ser=gamma_M6_ser)
    return 0.6 * t * d * f_y / gamma_M6_ser


@clause(STANDARD, "3.13.2, Table 3.10 (replaceable pin)")
def M_Rd_ser_pin(d: float, f_yp: float, gamma_M6_ser: float = 1.0) -> float:
    r"""Bending resistance of a replaceable pin at serviceability.

    γM6,ser is a keyword (recommended 1.0; National Annex may differ).

    .. math:: M_{Rd,ser} = \frac{0.8\, W_{el}\, f_{yp}}{\gamma_{M6,ser}}, \qquad
        W_{el} = \frac{\pi d^3}{32}

    Args:
        d: Pin diameter, mm.
        f_yp: Yield strength of the pin, MPa.
        gamma_M6_ser: Partial factor, dimensionless.

    Returns:
        M_Rd,ser, N·mm.
    """
    _positive(d=d, f_yp=f_yp, gamma_M6_ser=gamma_M6_ser)
    return 0.8 * (math.pi * d**3 / 32.0) * f_yp / gamma_M6_ser


@clause(STANDARD, "3.13.2(3), Eq. 3.14")
def sigma_h_Ed(E: float, F_b_Ed_ser: float, d_0: float, d: float, t: float) -> float:
    r"""Contact bearing stress between a replaceable pin and its plate.

    .. math:: \sigma_{h,Ed} = 0.591 \sqrt{\frac{E\,F_{b,Ed,ser}\,(d_0 - d)}{d^2\, t}}

    Args:
        E: Elastic modulus, MPa.
        F_b_Ed_ser: Bearing force on the plate at serviceability, N (>= 0).
        d_0: Hole diameter, mm (>= d).
        d: Pin diameter, mm.
        t: Plate thickness, mm.

    Returns:
        σh,Ed, MPa.
    """
    _positive(E=E, d=d, t=t, d_0=d_0)
    _non_negative(F_b_Ed_ser=F_b_Ed_ser)
    if d_0 < d:
        raise ValueError(f"d_0 = {d_0} mm must be >= d = {d} mm")
    return 0.591 * math.sqrt(E * F_b_Ed_ser * (d_0 - d) / (d**2 * t))


@clause(STANDARD, "3.13.2(3), Eq. 3.15")
def f_h_Rd(f_y: float, gamma_M6_ser: float = 1.0) -> float:
    r"""Limit of the contact bearing stress of a replaceable pin.

    f_y is the lower of the yield strengths of the pin and the plate. γM6,ser
    is a keyword (recommended 1.0; National Annex may differ).

    .. math:: f_{h,Rd} = \frac{2.5\, f_y}{\gamma_{M6,ser}}

    Args:
        f_y: The lower yield strength, MPa.
        gamma_M6_ser: Partial factor, dimensionless.

    Returns:
        fh,Rd, MPa.
    """
    _positive(f_y=f_y, gamma_M6_ser=gamma_M6_ser)
    return 2.5 * f_y / gamma_M6_ser
