"""AISC 360-22 Chapter J (bolts, fillers, pins) as small pure clause functions.

SI floats in (N, mm, MPa), SI floats out (N, N·mm, MPa). Table values printed
in ksi or kips are stored as printed and converted with exact factors. The
functions return nominal strengths R_n; :func:`available` applies φ (LRFD) or
Ω (ASD). Bolt groups keep the model file's keys ("A307", "A", "B", "C"); the
2022 edition's names are in :data:`EDITION_GROUP_NAMES`.
"""

from __future__ import annotations

import math

from plyshear.codes.clause import clause
from plyshear.codes.inputs import count as _count
from plyshear.codes.inputs import non_negative as _non_negative
from plyshear.codes.inputs import positive as _positive
from plyshear.codes.inputs import within as _within
from plyshear.model.joint import HOLE_TYPES, METHODS
from plyshear.units import MM_PER_IN, MPA_PER_KSI, N_PER_KIP

STANDARD = "AISC 360-22"

#: The 2022 edition's name of each bolt group (from memory; check against the
#: printed Table J3.2 before quoting it in a report).
EDITION_GROUP_NAMES = {"A307": "ASTM A307", "A": "Group 120", "B": "Group 150", "C": "Group 200"}

# Table J3.2, ksi: Fnt; Fnv with threads included (N) and excluded (X) from the
# shear plane. A307: threads are permitted in the shear planes; one value.
_F_NT_KSI = {"A307": 45.0, "A": 90.0, "B": 113.0, "C": 150.0}
_F_NV_N_KSI = {"A307": 27.0, "A": 54.0, "B": 68.0, "C": 90.0}
_F_NV_X_KSI = {"A307": 27.0, "A": 68.0, "B": 84.0, "C": 113.0}

# Table J3.1 (kips), columns as printed: size (in), Group A, Group B.
_T_B_SIZES_IN = (0.5, 0.625, 0.75, 0.875, 1.0, 1.125, 1.25, 1.375, 1.5)
_T_B_KIP = {
    "A": (12.0, 19.0, 28.0, 39.0, 51.0, 56.0, 71.0, 85.0, 103.0),
    "B": (15.0, 24.0, 35.0, 49.0, 64.0, 80.0, 102.0, 121.0, 148.0),
}
# Table J3.1M (kN), columns as printed: size (M), Group A, Group B.
_T_B_SIZES_MM = (16.0, 20.0, 22.0, 24.0, 27.0, 30.0, 36.0)
_T_B_KN = {
    "A": (91.0, 142.0, 176.0, 205.0, 267.0, 326.0, 475.0),
    "B": (114.0, 179.0, 221.0, 257.0, 334.0, 408.0, 595.0),
}
_SIZE_MATCH_MM = 0.05  # how close (mm) d must be to a tabulated size
#: Long-joint limit of J3.6: pattern length 38 in (printed metric: 965 mm).
L_LONG_JOINT = 965.2  # 38 in x 25.4 mm/in, exact in decimal
#: The thickest filler J5.2 admits undeveloped: 3/4 in.
FILLER_MAX = 0.75 * MM_PER_IN


def _method(method: str) -> str:
    key = method.lower()
    if key not in METHODS:
        raise ValueError(f"method must be one of {METHODS}, got {method!r}")
    return key


def _group(group: str, allowed: tuple[str, ...]) -> str:
    if group not in allowed:
        raise ValueError(f"bolt group must be one of {allowed}, got {group!r}")
    return group


@clause(STANDARD, "B3.1, B3.2")
def available(R_n: float, method: str, phi: float, omega: float) -> float:
    r"""Available strength from a nominal strength: φRn (LRFD) or Rn/Ω (ASD).

    .. math:: R_{avail} = \phi R_n \;(\text{LRFD}), \qquad R_n/\Omega \;(\text{ASD})

    Args:
        R_n: Nominal strength, N (or N·mm for a moment).
        method: ``"lrfd"`` or ``"asd"``.
        phi: Resistance factor φ of the limit state (LRFD), dimensionless, > 0 and <= 1.
        omega: Safety factor Ω of the limit state (ASD), dimensionless, >= 1.

    Returns:
        The available strength, in the unit of ``R_n``.
    """
    key = _method(method)
    _non_negative(R_n=R_n)
    _within("phi", phi, 0.0, 1.0)
    if not (math.isfinite(omega) and omega >= 1.0):
        raise ValueError(f"omega must be >= 1, got {omega!r}")
    return phi * R_n if key == "lrfd" else R_n / omega


@clause(STANDARD, "Table J3.2")
def F_nt(group: str) -> float:
    """Nominal tensile stress Fnt of a bolt group.

    Table values (ksi): A307 45, Group A 90, Group B 113, Group C 150.

    Args:
        group: ``"A307"``, ``"A"``, ``"B"`` or ``"C"``.

    Returns:
        Fnt, MPa.
    """
    return _F_NT_KSI[_group(group, tuple(_F_NT_KSI))] * MPA_PER_KSI


@clause(STANDARD, "Table J3.2")
def F_nv(group: str, threads_excluded: bool) -> float:
    """Nominal shear stress Fnv of a bolt group in a bearing-type connection.

    Table values (ksi), threads included / excluded: A307 27 / 27, Group A
    54 / 68, Group B 68 / 84, Group C 90 / 113. Reductions:
    :func:`long_joint_factor`, :func:`A307_long_grip_factor`, :func:`filler_factor`.

    Args:
        group: ``"A307"``, ``"A"``, ``"B"`` or ``"C"``.
        threads_excluded: True when the threads are excluded from the shear plane.

    Returns:
        Fnv, MPa.
    """
    table = _F_NV_X_KSI if threads_excluded else _F_NV_N_KSI
    return table[_group(group, tuple(table))] * MPA_PER_KSI


@clause(STANDARD, "Table J3.2")
def F_nt_threaded_part(F_u: float) -> float:
    """Nominal tensile stress of a threaded part (rod) meeting Section A3.4.

    .. math:: F_{nt} = 0.75 F_u

    Args:
        F_u: Specified minimum tensile strength of the rod material, MPa.

    Returns:
        Fnt, MPa.
    """
    _positive(F_u=F_u)
    return 0.75 * F_u


@clause(STANDARD, "Table J3.2")
def F_nv_threaded_part(F_u: float, threads_excluded: bool) -> float:
    r"""Nominal shear stress of a threaded part in a bearing-type connection.

    .. math:: F_{nv} = 0.450 F_u \;(\text{threads included}), \quad 0.563 F_u \;(\text{excluded})

    Args:
        F_u: Specified minimum tensile strength of the rod material, MPa.
        threads_excluded: True when the threads are excluded from the shear plane.

    Returns:
        Fnv, MPa.
    """
    _positive(F_u=F_u)
    return (0.563 if threads_excluded else 0.450) * F_u


@clause(STANDARD, "Table J3.2, note on A307 bolts")
def A307_long_grip_factor(grip: float, d: float) -> float:
    r"""Reduction of the A307 table values for a grip longer than five diameters.

    The tabulated values are reduced by 1 % for each 1/16 in of grip beyond
    5d; the reduction is applied in proportion (not in whole steps). The
    S.I. text rounds 1/16 in to 2 mm; the exact 1/16 in = 1.5875 mm is used.

    .. math:: f = 1 - 0.01\,\frac{\max(0,\; L_g - 5d)}{1/16\ \text{in}}

    Args:
        grip: Grip length L_g, mm (> 0).
        d: Nominal bolt diameter, mm (> 0).

    Returns:
        The factor on Fnt and Fnv, dimensionless, in (0, 1].
    """
    _positive(grip=grip, d=d)
    factor = 1.0 - 0.01 * max(0.0, grip - 5.0 * d) / (MM_PER_IN / 16.0)
    if factor <= 0.0:
        raise ValueError(f"grip {grip} mm is beyond the range of the A307 reduction (factor <= 0)")
    return factor


@clause(STANDARD, "J3.6")
def long_joint_factor(L_pattern: float) -> float:
    r"""Fnv reduction for an end-loaded connection with a long fastener pattern.

    For end-loaded connections (the caller decides) whose pattern length
    (largest distance along the force between bolt centrelines connecting two
    parts with one faying surface) exceeds 38 in (exact 965.2 mm is used; the
    printed metric limit is 965 mm), Fnv is reduced to 83.3 %.

    .. math:: f = 1.0 \; (L \le 38\ \text{in}), \qquad 0.833 \; (L > 38\ \text{in})

    Args:
        L_pattern: Fastener pattern length, mm (>= 0).

    Returns:
        The factor on Fnv, dimensionless.
    """
    _non_negative(L_pattern=L_pattern)
    return 1.0 if L_pattern <= L_LONG_JOINT else 0.833


@clause(STANDARD, "J3.6, Eq. J3-1")
def R_n_shear(F_nv: float, A_b: float) -> float:
    """Nominal shear strength of a bolt in one shear plane.

    A_b is the nominal unthreaded body area πd²/4 also when the threads are in
    the plane: the thread effect is in Fnv. Use φ = 0.75 (LRFD) or Ω = 2.00
    (ASD) with :func:`available`.

    .. math:: R_n = F_{nv} A_b

    Args:
        F_nv: Nominal shear stress, MPa.
        A_b: Nominal unthreaded body area of the bolt, mm².

    Returns:
        Rn per shear plane, N.
    """
    _positive(F_nv=F_nv, A_b=A_b)
    return F_nv * A_b


@clause(STANDARD, "J3.7")
def F_nt_prime(
    F_nt: float,
    F_nv: float,
    f_rv: float,
    method: str,
    phi: float = 0.75,
    omega: float = 2.00,
) -> float:
    r"""Nominal tensile stress modified for the shear stress (bearing-type joints).

    φ and Ω are keyword arguments (defaults: the J3.6 values 0.75 and 2.00).
    The result is limited to Fnt and, when the shear stress alone exhausts the
    bolt, to zero.

    .. math::
        F'_{nt} = 1.3F_{nt} - \frac{F_{nt}}{\phi F_{nv}} f_{rv} \le F_{nt} \;(\text{LRFD}),
        \qquad
        F'_{nt} = 1.3F_{nt} - \frac{\Omega F_{nt}}{F_{nv}} f_{rv} \le F_{nt} \;(\text{ASD})

    Args:
        F_nt: Nominal tensile stress, MPa.
        F_nv: Nominal shear stress, MPa.
        f_rv: Required shear stress from LRFD or ASD load combinations, MPa (>= 0).
        method: ``"lrfd"`` or ``"asd"``.
        phi: Resistance factor, dimensionless.
        omega: Safety factor, dimensionless.

    Returns:
        F'nt, MPa, in [0, Fnt].
    """
    key = _method(method)
    _positive(F_nt=F_nt, F_nv=F_nv)
    _non_negative(f_rv=f_rv)
    if key == "lrfd":
        value = 1.3 * F_nt - F_nt / (phi * F_nv) * f_rv
    else:
        value = 1.3 * F_nt - omega * F_nt / F_nv * f_rv
    return min(F_nt, max(0.0, value))


@clause(STANDARD, "J3.8")
def R_n_slip(mu: float, T_b: float, n_s: int, h_f: float = 1.0, D_u: float = 1.13) -> float:
    r"""Nominal slip resistance of one bolt.

    D_u is a keyword (1.13; other values may be approved by the engineer of
    record). φ and Ω depend on the hole: :func:`phi_slip`, :func:`omega_slip`.

    .. math:: R_n = \mu D_u h_f T_b n_s

    Args:
        mu: Mean slip coefficient, dimensionless (J3.8: Class A 0.30, Class B 0.50).
        T_b: Minimum bolt pretension, N (:func:`T_b_min`).
        n_s: Number of slip planes, >= 1.
        h_f: Filler factor, dimensionless (:func:`h_f`).
        D_u: Ratio of mean installed to minimum pretension, dimensionless.

    Returns:
        Rn, N.
    """
    _within("mu", mu, 0.0, 1.0)
    _within("h_f", h_f, 0.0, 1.0)
    _count("n_s", n_s, 1)
    _positive(T_b=T_b, D_u=D_u)
    return mu * D_u * h_f * T_b * n_s


def _slip_hole_index(hole: str, slot_parallel_to_load: bool) -> int:
    if hole not in HOLE_TYPES:
        raise ValueError(f"hole must be one of {HOLE_TYPES}, got {hole!r}")
    if slot_parallel_to_load and hole not in ("short-slot", "long-slot"):
        raise ValueError("slot_parallel_to_load applies to 'short-slot' and 'long-slot' only")
    if hole == "standard" or (hole == "short-slot" and not slot_parallel_to_load):
        return 0
    if hole in ("oversized", "short-slot"):
        return 1
    return 2


@clause(STANDARD, "J3.8")
def phi_slip(hole: str, slot_parallel_to_load: bool = False) -> float:
    """Resistance factor φ of the slip limit state.

    Standard holes and short slots perpendicular to the force 1.00; oversized
    holes and short slots parallel to the force 0.85; long slots 0.70.

    Args:
        hole: One of :data:`HOLE_TYPES`.
        slot_parallel_to_load: For slots, True when the slot runs parallel to the force.

    Returns:
        φ, dimensionless.
    """
    return (1.00, 0.85, 0.70)[_slip_hole_index(hole, slot_parallel_to_load)]


@clause(STANDARD, "J3.8")
def omega_slip(hole: str, slot_parallel_to_load: bool = False) -> float:
    """Safety factor Ω of the slip limit state.

    Standard holes and short slots perpendicular to the force 1.50; oversized
    holes and short slots parallel to the force 1.76; long slots 2.14.

    Args:
        hole: One of :data:`HOLE_TYPES`.
        slot_parallel_to_load: For slots, True when the slot runs parallel to the force.

    Returns:
        Ω, dimensionless.
    """
    return (1.50, 1.76, 2.14)[_slip_hole_index(hole, slot_parallel_to_load)]


@clause(STANDARD, "J3.8")
def h_f(n_fillers: int, developed: bool = False) -> float:
    """Filler factor of the slip resistance.

    1.0 with no filler, one filler, or fillers to which bolts have been added
    to distribute the load (``developed``); 0.85 for two or more fillers
    between the connected parts without such bolts.

    Args:
        n_fillers: Number of fillers between the connected parts, >= 0.
        developed: True when bolts have been added to distribute the load in the fillers.

    Returns:
        h_f, dimensionless.
    """
    _count("n_fillers", n_fillers, 0)
    return 1.0 if developed or n_fillers <= 1 else 0.85


@clause(STANDARD, "J3.9")
def k_sc(T: float, T_b: float, n_b: int, method: str, D_u: float = 1.13) -> float:
    r"""Slip-resistance factor for combined tension and shear (slip-critical).

    .. math::
        k_{sc} = 1 - \frac{T_u}{D_u T_b n_b} \;(\text{LRFD}), \qquad
        k_{sc} = 1 - \frac{1.5 T_a}{D_u T_b n_b} \;(\text{ASD}), \qquad k_{sc} \ge 0

    Args:
        T: Required tension T_u (LRFD) or T_a (ASD), N (>= 0).
        T_b: Minimum bolt pretension, N.
        n_b: Number of bolts carrying the tension, >= 1.
        method: ``"lrfd"`` or ``"asd"``.
        D_u: Ratio of mean installed to minimum pretension (keyword; default 1.13).

    Returns:
        k_sc, dimensionless, in [0, 1].
    """
    key = _method(method)
    _non_negative(T=T)
    _positive(T_b=T_b, D_u=D_u)
    _count("n_b", n_b, 1)
    demand = T if key == "lrfd" else 1.5 * T
    return max(0.0, 1.0 - demand / (D_u * T_b * n_b))


@clause(STANDARD, "Table J3.1, Table J3.1M")
def T_b_min(d: float, group: str) -> float:
    """Minimum bolt pretension (0.70 of the bolt's minimum tensile strength).

    Inch sizes 1/2 to 1-1/2 in are read from Table J3.1 (kips), metric sizes
    M16 to M36 from Table J3.1M (kN).

    Args:
        d: Nominal bolt diameter, mm (an inch size as ``n * 25.4``).
        group: ``"A"`` or ``"B"``.

    Returns:
        T_b, N.
    """
    _group(group, ("A", "B"))
    _positive(d=d)
    for size_in, kips in zip(_T_B_SIZES_IN, _T_B_KIP[group], strict=True):
        if abs(d - size_in * MM_PER_IN) <= _SIZE_MATCH_MM:
            return kips * N_PER_KIP
    for size_mm, kilonewtons in zip(_T_B_SIZES_MM, _T_B_KN[group], strict=True):
        if abs(d - size_mm) <= _SIZE_MATCH_MM:
            return kilonewtons * 1000.0
    inch = ", ".join(f"{s:g} in" for s in _T_B_SIZES_IN)
    metric = ", ".join(f"M{s:g}" for s in _T_B_SIZES_MM)
    raise ValueError(f"no pretension tabulated for d = {d} mm; sizes: {inch}; {metric}")


@clause(STANDARD, "J3.10(a)")
def R_n_bearing(
    d: float,
    t: float,
    F_u: float,
    deformation_considered: bool = True,
    long_slot_perpendicular: bool = False,
) -> float:
    r"""Nominal bearing strength of the connected material at one bolt hole.

    A long slot perpendicular to the force has one equation (``deformation_considered``
    has no effect). φ = 0.75, Ω = 2.00.

    .. math::
        R_n = 2.4\,d\,t\,F_u \;(\text{deformation considered}),\;
        3.0\,d\,t\,F_u \;(\text{not}),\; 2.0\,d\,t\,F_u \;(\text{long slot} \perp)

    Args:
        d: Nominal bolt diameter, mm.
        t: Thickness of the connected material, mm.
        F_u: Specified minimum tensile strength of the connected material, MPa.
        deformation_considered: True when hole deformation at service load is a consideration.
        long_slot_perpendicular: True for a long slot perpendicular to the force.

    Returns:
        Rn, N.
    """
    _positive(d=d, t=t, F_u=F_u)
    coefficient = 2.0 if long_slot_perpendicular else (2.4 if deformation_considered else 3.0)
    return coefficient * d * t * F_u


@clause(STANDARD, "J3.10(b)")
def R_n_tearout(
    l_c: float,
    t: float,
    F_u: float,
    deformation_considered: bool = True,
    long_slot_perpendicular: bool = False,
) -> float:
    r"""Nominal tearout strength of the connected material at one bolt hole.

    A long slot perpendicular to the force has one equation (``deformation_considered``
    has no effect). φ = 0.75, Ω = 2.00.

    .. math::
        R_n = 1.2\,l_c\,t\,F_u \;(\text{deformation considered}),\;
        1.5\,l_c\,t\,F_u \;(\text{not}),\; 1.0\,l_c\,t\,F_u \;(\text{long slot} \perp)

    Args:
        l_c: Clear distance along the force from the hole edge to the
            material edge or the next hole, mm (>= 0; :func:`l_c_edge`, :func:`l_c_inner`).
        t: Thickness of the connected material, mm.
        F_u: Specified minimum tensile strength of the connected material, MPa.
        deformation_considered: True when hole deformation at service load is a consideration.
        long_slot_perpendicular: True for a long slot perpendicular to the force.

    Returns:
        Rn, N.
    """
    _non_negative(l_c=l_c)
    _positive(t=t, F_u=F_u)
    coefficient = 1.0 if long_slot_perpendicular else (1.2 if deformation_considered else 1.5)
    return coefficient * l_c * t * F_u


@clause(STANDARD, "J3.10")
def l_c_edge(edge: float, d_hole: float) -> float:
    """Clear distance from a hole to the edge of the material along the force.

    .. math:: l_c = L_e - d_h/2

    Args:
        edge: Distance from the hole centre to the edge, mm.
        d_hole: Hole diameter (its width along the force), mm.

    Returns:
        l_c, mm.
    """
    _positive(d_hole=d_hole, edge=edge)
    if edge <= d_hole / 2.0:
        raise ValueError(f"edge {edge} mm must exceed d_hole/2 = {d_hole / 2.0} mm")
    return edge - d_hole / 2.0


@clause(STANDARD, "J3.10")
def l_c_inner(pitch: float, d_hole: float) -> float:
    """Clear distance between two adjacent holes along the force.

    .. math:: l_c = s - d_h

    Args:
        pitch: Centre-to-centre spacing of the holes, mm.
        d_hole: Hole diameter (its width along the force), mm.

    Returns:
        l_c, mm.
    """
    _positive(d_hole=d_hole, pitch=pitch)
    if pitch <= d_hole:
        raise ValueError(f"pitch {pitch} mm must exceed d_hole = {d_hole} mm")
    return pitch - d_hole


@clause(STANDARD, "J5.2(b)")
def filler_factor(t: float, developed: bool = False, form: str = "si") -> float:
    r"""Reduction of bolt shear strength for fillers in bearing-type connections.

    No reduction up to 6 mm (1/4 in) or for developed fillers (extended and
    bolted, or welded). Beyond, the printed S.I. form with the 0.85 floor
    (floor from memory of the 2016/2022 text), up to 3/4 in = 19.05 mm (the
    floor governs there in either unit form); thicker undeveloped fillers raise.

    .. math:: f = 1 - 0.0154\,(t - 6) \ge 0.85 \qquad (6 < t \le 19\ \text{mm})

    The standard prints the factor in both unit forms; ``form = "us"`` uses
    1 − 0.4(t − 0.25) with t in inches (no reduction up to 1/4 in exactly).

    Args:
        t: Total thickness of the fillers in the shear plane's load path, mm (>= 0).
        developed: True when the fillers are developed.
        form: ``"si"`` (t in mm form) or ``"us"`` (t in inches form).

    Returns:
        The factor on the bolt shear strength, dimensionless, in [0.85, 1].
    """
    _non_negative(t=t)
    if form not in ("si", "us"):
        raise ValueError(f"form must be 'si' or 'us', got {form!r}")
    if t > FILLER_MAX and not developed:
        raise ValueError(f"filler t = {t} mm > 3/4 in (19 mm): such fillers must be developed")
    if form == "us":
        t_in = t / MM_PER_IN
        return 1.0 if developed or t_in <= 0.25 else max(0.85, 1.0 - 0.4 * (t_in - 0.25))
    if developed or t <= 6.0:
        return 1.0
    return max(0.85, 1.0 - 0.0154 * (t - 6.0))


@clause(STANDARD, "J7(a), Eq. J7-1")
def R_n_pin_bearing(A_pb: float, F_y: float) -> float:
    r"""Nominal bearing strength of a pin in a reamed, drilled or bored hole.

    φ = 0.75, Ω = 2.00. Also the bearing limit state of a pin-connected member (D5.1).

    .. math:: R_n = 1.8\,F_y\,A_{pb}

    Args:
        A_pb: Projected bearing area (thickness × pin diameter), mm².
        F_y: Specified minimum yield stress of the plate, MPa.

    Returns:
        Rn, N.
    """
    _positive(A_pb=A_pb, F_y=F_y)
    return 1.8 * F_y * A_pb


@clause(STANDARD, "informative (plastic moment of a solid circle)")
def M_p_circle(d: float, F_y: float) -> float:
    r"""Plastic moment of a solid circular bolt or pin section.

    Not a clause of the standard: Z = d³/6 for a solid circle. Use with
    φb = 0.90, Ωb = 1.67 (Chapter F) where the engineer judges it appropriate.

    .. math:: M_p = F_y \frac{d^3}{6}

    Args:
        d: Diameter of the section, mm.
        F_y: Yield stress, MPa.

    Returns:
        M_p, N·mm.
    """
    _positive(d=d, F_y=F_y)
    return F_y * d**3 / 6.0


# Pin-connected members (D5) and their gross section (D2) -------------------------

#: D5.1(a): the allowance added to 2t in the effective width: 0.63 in (US form),
#: 16 mm (S.I. form).
B_E_ALLOWANCE = {"us": 0.63 * MM_PER_IN, "si": 16.0}
#: D5.2: the largest pin-hole clearance where the pin provides for relative
#: movement under full load: 1/32 in (US form), 1 mm (S.I. form).
PIN_HOLE_CLEARANCE = {"us": MM_PER_IN / 32.0, "si": 1.0}


def _form(form: str) -> str:
    if form not in ("si", "us"):
        raise ValueError(f"form must be 'si' or 'us', got {form!r}")
    return form


@clause(STANDARD, "D5.1(a)")
def b_e_pin(t: float, side: float | None = None, form: str = "si") -> float:
    r"""Effective edge distance of a pin-connected plate.

    .. math:: b_e = 2t + 0.63\ \text{in}\ (2t + 16\ \text{mm}) \le b

    Args:
        t: Plate thickness, mm.
        side: The distance from the edge of the hole to the edge of the plate
            normal to the force, mm (>= 0); None = no cap (as the D5.2 rules take it).
        form: ``"si"`` (16 mm) or ``"us"`` (0.63 in).

    Returns:
        b_e, mm.
    """
    _positive(t=t)
    b_e = 2.0 * t + B_E_ALLOWANCE[_form(form)]
    if side is None:
        return b_e
    _non_negative(side=side)
    return min(b_e, side)


@clause(STANDARD, "D5.1(a), Eq. D5-1")
def P_n_pin_tension(t: float, b_e: float, F_u: float) -> float:
    r"""Nominal tensile rupture strength of a pin-connected plate on its net effective area.

    φt = 0.75, Ωt = 2.00.

    .. math:: P_n = F_u\,(2\,t\,b_e)

    Args:
        t: Plate thickness, mm.
        b_e: Effective edge distance, mm (:func:`b_e_pin`, >= 0).
        F_u: Specified minimum tensile strength of the plate, MPa.

    Returns:
        Pn, N.
    """
    _positive(t=t, F_u=F_u)
    _non_negative(b_e=b_e)
    return F_u * 2.0 * t * b_e


@clause(STANDARD, "D5.1(b), Eq. D5-2")
def P_n_pin_shear(t: float, a: float, d: float, F_u: float) -> float:
    r"""Nominal shear rupture strength of a pin-connected plate beyond the hole.

    φsf = 0.75, Ωsf = 2.00.

    .. math:: P_n = 0.6\,F_u\,A_{sf}, \qquad A_{sf} = 2\,t\,(a + d/2)

    Args:
        t: Plate thickness, mm.
        a: Shortest distance from the edge of the pin hole to the edge of the
            plate, parallel to the force, mm (>= 0).
        d: Pin diameter, mm.
        F_u: Specified minimum tensile strength of the plate, MPa.

    Returns:
        Pn, N.
    """
    _positive(t=t, d=d, F_u=F_u)
    _non_negative(a=a)
    return 0.6 * F_u * 2.0 * t * (a + d / 2.0)


@clause(STANDARD, "D2(a), Eq. D2-1")
def P_n_yield(A_g: float, F_y: float) -> float:
    r"""Nominal tensile yielding strength on the gross section.

    φt = 0.90, Ωt = 1.67.

    .. math:: P_n = F_y\,A_g

    Args:
        A_g: Gross area, mm².
        F_y: Specified minimum yield stress, MPa.

    Returns:
        Pn, N.
    """
    _positive(A_g=A_g, F_y=F_y)
    return F_y * A_g


@clause(STANDARD, "D5.2")
def pin_plate_min_width(b_e: float, d: float) -> float:
    r"""Least width of a pin-connected plate at the pin hole.

    .. math:: w \ge 2\,b_e + d

    Args:
        b_e: Effective edge distance, mm (:func:`b_e_pin`).
        d: Pin diameter, mm.

    Returns:
        The least width, mm.
    """
    _positive(b_e=b_e, d=d)
    return 2.0 * b_e + d


@clause(STANDARD, "D5.2")
def pin_plate_min_extension(b_e: float) -> float:
    r"""Least extension a beyond the bearing end of the pin hole, parallel to the force.

    .. math:: a \ge 1.33\,b_e

    Args:
        b_e: Effective edge distance, mm (:func:`b_e_pin`).

    Returns:
        The least a, mm.
    """
    _positive(b_e=b_e)
    return 1.33 * b_e


@clause(STANDARD, "D5.2")
def pin_hole_max(d: float, form: str = "si") -> float:
    r"""Largest pin hole where the pin provides for relative movement under full load.

    .. math:: d_h \le d + 1/32\ \text{in}\ (d + 1\ \text{mm})

    Args:
        d: Pin diameter, mm.
        form: ``"si"`` (1 mm) or ``"us"`` (1/32 in).

    Returns:
        The largest hole diameter, mm.
    """
    _positive(d=d)
    return d + PIN_HOLE_CLEARANCE[_form(form)]
