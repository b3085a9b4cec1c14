"""Pin plates: each ply's own limit states beside the pin's.

With ``[check] connector = "pin"``, every ply that gives its ``edge`` (hole
centre to the end edge, along its force) and ``width`` (across the force) is
checked as a pin plate with its own solved bearing force, thickness and steel:

* AISC 360-22: tensile rupture on the net effective area (D5.1(a)), shear
  rupture beyond the hole (D5.1(b)), yielding on the gross section (D2(a)),
  and the D5.2 dimensional rules (width, extension, hole clearance). The
  bearing on the projected area (J7, D5.1(c)) is the driver's "pin bearing".
* EN 1993-1-8: the Table 3.9 geometry for a given thickness (type A) and, as
  an informative item, for a given geometry (type B); with ``[check]
  replaceable = true`` the serviceability rules of 3.13.2 (bearing, contact
  stress, pin bending) at the service load. Table 3.10's plate bearing is the
  driver's "pin bearing" (each ply with its own f_y).

The hole is the model's (d + ``[analysis] hole_clearance``), else d + 1/32 in
(1 mm in S.I.) under AISC, d + 1 mm under EN
(:func:`plyshear.mechanics.strengths.pin_hole`), and it is taken as centred
across the plate.
"""

from __future__ import annotations

import dataclasses

import numpy as np

from plyshear.codes import aisc360 as aisc
from plyshear.codes import en1993_1_8 as en
from plyshear.codes.clause import Clause, cited
from plyshear.codes.common import load_level, resultants
from plyshear.codes.en1993_1_8_check import figure_3_11
from plyshear.codes.result import CheckItem, CheckResult
from plyshear.mechanics.results import BoltResult, Solution
from plyshear.mechanics.strengths import LUG_NET_TENSION, LUG_SHEAR_OUT, pin_hole, unit_form
from plyshear.model.joint import Joint, Ply
from plyshear.units import length_str

PHI_RUPTURE, OMEGA_RUPTURE = 0.75, 2.00  # D5.1(a), D5.1(b)
PHI_YIELD, OMEGA_YIELD = 0.90, 1.67  # D2(a)
GEOMETRY = "lug geometry"
GROSS_YIELDING = "lug gross yielding"


def applies(joint: Joint) -> bool:
    """True for a pin (the pin-plate rules are the standards' rules for pins only)."""
    return joint.check.connector == "pin"


def service_only(joint: Joint, standard: str, method: str) -> bool:
    """True when a replaceable pin's model gives service loads under EN 1993-1-8.

    Such a model is checked to the serviceability rules alone (the strength
    rules take factored loads).
    """
    return (
        standard == "en1993-1-8"
        and applies(joint)
        and joint.check.replaceable
        and load_level(joint, standard, method) == "service"
    )


def extend(joint: Joint, solution: Solution, result: CheckResult, method: str) -> CheckResult:
    """Return ``result`` with the pin-plate items and notes added (unchanged for bolts)."""
    if not applies(joint):
        return result
    service = service_only(joint, result.standard, method)
    out: list[CheckItem] = []
    count = len(solution.bolts)
    for k, bolt in enumerate(solution.bolts):
        per: list[CheckItem] = []
        for pb in bolt.plies:
            ply = joint.plies[pb.ply]
            if ply.is_filler:
                continue
            if result.standard == "en1993-1-8" and joint.check.replaceable:
                per += en_service_items(joint, ply, pb.force)  # no edge or width needed
            if ply.edge is None or ply.width is None:
                continue
            if result.standard == "aisc360-22":
                per += aisc_items(joint, ply, pb.force, method)
            elif not service:
                per += en_items(joint, ply, pb.force)
        if result.standard == "en1993-1-8" and joint.check.replaceable:
            per.append(en_service_bending(joint, bolt, resultants(bolt.M)))
        out += [dataclasses.replace(i, bolt=k, row=count) for i in per]
    return dataclasses.replace(
        result,
        items=result.items + tuple(out),
        notes=tuple(dict.fromkeys(result.notes + tuple(notes(joint, result, service)))),
    )


def notes(joint: Joint, result: CheckResult, service: bool) -> list[str]:
    """What the pin-plate checks leave out, and the load level of the service rules."""
    rules = "D5, D5.2" if result.standard == "aisc360-22" else "Table 3.9"
    out = [
        f"ply {p.name}: no {' or '.join(k for k in ('edge', 'width') if getattr(p, k) is None)}"
        f" given: the pin-plate rules ({rules}) not checked"
        for p in joint.plies
        if not p.is_filler and (p.edge is None or p.width is None)
    ]
    dh = pin_hole(joint, result.standard)
    out.append(
        f"pin plates: hole {length_str(joint.units, dh)}{_hole_source(joint, result)} "
        "taken as centred across each plate"
    )
    if result.standard == "en1993-1-8" and joint.check.replaceable:
        out.append(
            "replaceable pin: the serviceability rules checked with the model's service "
            "loads alone (the strength rules need factored loads)"
            if service
            else "replaceable pin: the serviceability rules (3.13.2) checked with the model's "
            "factored loads (conservative); give service loads and [check] loads = "
            '"service" to check them at the service level'
        )
    if result.standard == "aisc360-22" and joint.check.replaceable:
        out.append(
            "[check] replaceable: AISC 360-22 has no serviceability rule for replaceable "
            "pins (the EN 1993-1-8 rules are not applied)"
        )
    return out


def _hole_source(joint: Joint, result: CheckResult) -> str:
    """Where the pin hole's size comes from, for the note ("" when the model gives it)."""
    if joint.analysis.hole_clearance is not None:
        return ""
    if result.standard != "aisc360-22":
        return " (d + 1 mm)"
    return (
        " (d + 1/32 in, the D5.2 limit)"
        if unit_form(joint) == "us"
        else " (d + 1 mm, the D5.2 limit)"
    )


def _item(
    joint: Joint,
    ply: Ply,
    what: str,
    where: str,
    demand: float,
    capacity: float,
    dimension: str,
    clauses: tuple[Clause, ...],
    **kw: object,
) -> CheckItem:
    """A ply's item; the rule after the ply's name (``"ply X, width"``) is its detail."""
    detail = where.split(", ", 1)[1] if ", " in where else ""
    return CheckItem(
        what,
        demand,
        capacity,
        dimension,
        clauses,
        part="ply",
        ply=joint.plies.index(ply),
        ply_name=ply.name,
        detail=detail,
        **kw,  # type: ignore[arg-type]
    )


def _geometry(joint: Joint, ply: Ply, standard: str) -> tuple[float, float, float]:
    """Hole d_h, extension a beyond the hole and side distance c beside it, mm."""
    dh = pin_hole(joint, standard)
    return dh, ply.edge - dh / 2.0, (ply.width - dh) / 2.0  # type: ignore[operator]


def aisc_items(joint: Joint, ply: Ply, force: float, method: str) -> list[CheckItem]:
    """AISC 360-22 D5 and D2 items of one pin plate carrying ``force`` (N)."""
    d, t = joint.bolt.diameter, ply.thickness
    form = unit_form(joint)
    dh, a, c = _geometry(joint, ply, "aisc360-22")
    where = f"ply {ply.name}"
    ln = joint.units

    def avail(rn: float, phi: float, omega: float) -> float:
        return aisc.available(rn, method, phi, omega)

    b_e = aisc.b_e_pin(t, max(c, 0.0), form)
    b_e0 = aisc.b_e_pin(t, None, form)
    rn_t = aisc.P_n_pin_tension(t, b_e, ply.fu)
    rn_s = aisc.P_n_pin_shear(t, max(a, 0.0), d, ply.fu)
    rn_y = aisc.P_n_yield(ply.width * t, ply.fy)  # type: ignore[operator]
    items = [
        _item(
            joint,
            ply,
            LUG_NET_TENSION,
            where,
            force,
            avail(rn_t, PHI_RUPTURE, OMEGA_RUPTURE),
            "force",
            (cited(aisc.P_n_pin_tension),),
            note=f"2 t be, be {length_str(ln, b_e)}"
            + (" (the side distance governs)" if b_e < b_e0 else ""),
        ),
        _item(
            joint,
            ply,
            LUG_SHEAR_OUT,
            where,
            force,
            avail(rn_s, PHI_RUPTURE, OMEGA_RUPTURE),
            "force",
            (cited(aisc.P_n_pin_shear),),
            note=f"Asf = 2 t (a + d/2), a {length_str(ln, a)}",
        ),
        _item(
            joint,
            ply,
            GROSS_YIELDING,
            where,
            force,
            avail(rn_y, PHI_YIELD, OMEGA_YIELD),
            "force",
            (cited(aisc.P_n_yield),),
            note=f"Ag = width x t, width {length_str(ln, ply.width)}",  # type: ignore[arg-type]
        ),
        _item(
            joint,
            ply,
            GEOMETRY,
            f"{where}, width",
            aisc.pin_plate_min_width(b_e0, d),
            ply.width,  # type: ignore[arg-type]
            "length",
            (cited(aisc.pin_plate_min_width), cited(aisc.b_e_pin)),
            note=f"width >= 2 be + d, be = 2t + {length_str(ln, aisc.B_E_ALLOWANCE[form])}"
            f" = {length_str(ln, b_e0)}",
        ),
        _item(
            joint,
            ply,
            GEOMETRY,
            f"{where}, extension a",
            aisc.pin_plate_min_extension(b_e0),
            a,
            "length",
            (cited(aisc.pin_plate_min_extension),),
            note=f"a >= 1.33 be, a = edge - dh/2 = {length_str(ln, a)}",
        ),
    ]
    if joint.analysis.hole_clearance is not None:  # else the hole is d + the limit itself
        items.append(
            _item(
                joint,
                ply,
                GEOMETRY,
                f"{where}, hole",
                dh,
                aisc.pin_hole_max(d, form),
                "length",
                (cited(aisc.pin_hole_max),),
                informative=True,
                note=f"hole <= d + {length_str(ln, aisc.PIN_HOLE_CLEARANCE[form])}: required where "
                "the pin provides for relative movement under full load",
            )
        )
    return items


def en_items(joint: Joint, ply: Ply, force: float) -> list[CheckItem]:
    """EN 1993-1-8 Table 3.9 items of one pin plate carrying ``force`` (N)."""
    t = ply.thickness
    d0, a, c = _geometry(joint, ply, "en1993-1-8")
    ln = joint.units
    where = f"ply {ply.name}"
    a_req = en.a_min_pin_plate(force, t, ply.fy, d0)
    c_req = en.c_min_pin_plate(force, t, ply.fy, d0)
    if a_req / max(a, 1e-9) >= c_req / max(c, 1e-9):
        type_a = (
            a_req,
            a,
            f"type A: a >= F gM0/(2 t fy) + 2 d0/3, a = {length_str(ln, a)} "
            f"(c needs {length_str(ln, c_req)}, has {length_str(ln, c)})",
        )
    else:
        type_a = (
            c_req,
            c,
            f"type A: c >= F gM0/(2 t fy) + d0/3, c = {length_str(ln, c)} "
            f"(a needs {length_str(ln, a_req)}, has {length_str(ln, a)})",
        )
    t_req = en.t_min_pin_plate(force, ply.fy)
    d0_max = en.d_0_max_pin_plate(t)
    if t_req / t >= d0 / d0_max:
        type_b = (
            t_req,
            t,
            f"type B: t >= 0.7 sqrt(F gM0/fy) (d0 "
            f"{length_str(ln, d0)} <= 2.5 t = {length_str(ln, d0_max)})",
        )
    else:
        type_b = (d0, d0_max, f"type B: d0 <= 2.5 t (t needs {length_str(ln, t_req)})")
    return [
        _item(
            joint,
            ply,
            GEOMETRY,
            f"{where}, type A",
            type_a[0],
            type_a[1],
            "length",
            (cited(en.a_min_pin_plate),),
            note=type_a[2] + "; a plate of the type B shape may meet type B instead",
        ),
        _item(
            joint,
            ply,
            GEOMETRY,
            f"{where}, type B",
            type_b[0],
            type_b[1],
            "length",
            (cited(en.t_min_pin_plate),),
            informative=True,
            note=type_b[2] + "; only for a plate of the type B shape (not checked)",
        ),
    ]


def en_service_items(joint: Joint, ply: Ply, force: float) -> list[CheckItem]:
    """EN 1993-1-8 3.13.2 serviceability items of one plate of a replaceable pin."""
    b = joint.bolt
    d0 = pin_hole(joint, "en1993-1-8")
    fy = min(ply.fy, b.fyb)  # the lower of the pin's and the plate's
    where = f"ply {ply.name}"
    return [
        _item(
            joint,
            ply,
            "pin bearing (serviceability)",
            where,
            force,
            en.F_b_Rd_ser_pin(ply.thickness, b.diameter, fy),
            "force",
            (cited(en.F_b_Rd_ser_pin),),
            note=f"0.6 t d fy / gM6,ser, fy {fy:.0f} MPa",
        ),
        _item(
            joint,
            ply,
            "pin contact stress",
            where,
            en.sigma_h_Ed(ply.E, force, d0, b.diameter, ply.thickness),
            en.f_h_Rd(fy),
            "stress",
            (cited(en.sigma_h_Ed), cited(en.f_h_Rd)),
            note=f"d0 - d {length_str(joint.units, d0 - b.diameter)}",
        ),
    ]


def en_service_bending(joint: Joint, bolt: BoltResult, moment: np.ndarray) -> CheckItem:
    """EN 1993-1-8 Table 3.10: a replaceable pin's bending at serviceability.

    As for the strength item, never below the moment of Figure 3.11 (3.13.2 takes
    the bearing as uniform) where the stack is a clevis.
    """
    i = int(np.argmax(moment))
    demand, note = float(moment[i]), "0.8 Wel fyp / gM6,ser of the shank"
    figure = figure_3_11(joint, bolt)
    if figure is not None and figure > demand:
        demand, note = figure, note + "; the Figure 3.11 moment (uniform bearing) governs"
    return CheckItem(
        "pin bending (serviceability)",
        demand,
        en.M_Rd_ser_pin(joint.bolt.diameter, joint.bolt.fyb),
        "moment",
        (cited(en.M_Rd_ser_pin),),
        part="bolt",
        z=float(bolt.z[i]),
        note=note,
    )


__all__ = ["LUG_NET_TENSION", "LUG_SHEAR_OUT", "applies", "extend", "service_only"]
