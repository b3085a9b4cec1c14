"""EN 1993-1-8:2005 checks of a solved joint (partial factors γM0, γM2, γM3).

Per plane: shear resistance (Table 3.4) through the threads (A_s, αv by class)
or the shank (gross area, αv 0.6), times βp for a plane that bounds a pack
(3.6.1(12)) and βLf for long joints (3.8). Per ply: bearing (Table 3.4, k1 and
αb from the ply's edge distance and width). Pins (3.13, Table 3.10): shear,
bearing, bending and the bending–shear interaction along the solved moment
diagram. Bolts: tension and its interaction with shear, slip (3.9); bending and
its interaction as informative items.
"""

from __future__ import annotations

import numpy as np

from plyshear.codes import common
from plyshear.codes import en1993_1_8 as en
from plyshear.codes.clause import Clause, cited
from plyshear.codes.result import CheckItem
from plyshear.mechanics.results import BoltResult
from plyshear.model.joint import Joint
from plyshear.units import force_str, length_str, system

SURFACE_DEFAULT = "D"  # Table 3.7: the lowest class, when none is given


def _notes(joint: Joint) -> list[str]:
    grade = joint.bolt.grade
    if grade in en.BOLT_CLASSES:
        return []
    return [
        f"grade {grade} is outside the classes of EN 1993-1-8 Table 3.1: "
        "alpha_v taken as for class 10.9 (0.5 through threads)"
    ]


def _bolt(joint: Joint, bolt: BoltResult, method: str, notes: list[str]) -> list[CheckItem]:
    return _shear(joint, bolt) + _bearing(joint, bolt) + _bolt_items(joint, bolt, notes)


def _beta_lf(joint: Joint) -> float:
    """βLf of 3.8 for the row's length (1 up to 15 d)."""
    length, d = common.joint_length(joint), joint.bolt.diameter
    return en.beta_Lf(length, d) if length > 15 * d else 1.0


def _long_joint(joint: Joint) -> tuple[float, str]:
    return _beta_lf(joint), "EN 1993-1-8 3.8 beta_Lf"


def _alpha_v(grade: str, threads: bool) -> float:
    if grade in en.BOLT_CLASSES:
        return en.alpha_v(grade, threads)
    return en.alpha_v("10.9", threads)


def plane_resistance(joint: Joint, threads: bool) -> tuple[float, list[Clause]]:
    """Return F_v,Rd of one plane (N) and the clauses used, before βp and βLf."""
    b = joint.bolt
    area = b.stress_area if threads else b.gross_area
    if joint.check.connector == "pin":
        return en.F_v_Rd_pin(area, b.fub), [cited(en.F_v_Rd_pin)]
    return en.F_v_Rd(_alpha_v(b.grade, threads), b.fub, area), [cited(en.alpha_v), cited(en.F_v_Rd)]


def _shear(joint: Joint, bolt: BoltResult) -> list[CheckItem]:
    d = joint.bolt.diameter
    beta_lf = _beta_lf(joint)
    items = []
    for p in bolt.planes:
        frd, clauses = plane_resistance(joint, p.threads)
        note = "through threads (As)" if p.threads else "through shank (gross area)"
        tp = common.pack_at_plane(joint, p.above, p.below)
        if tp > 0:
            bp = en.beta_p(d, tp)
            frd *= bp
            clauses.append(cited(en.beta_p))
            note += f", pack {length_str(joint.units, tp)}: beta_p {bp:.3f}"
        if beta_lf < 1.0:
            frd *= beta_lf
            clauses.append(cited(en.beta_Lf))
            note += f", beta_Lf {beta_lf:.3f}"
        items.append(
            CheckItem(
                f"{common.noun(joint)} shear",
                p.shear,
                frd,
                "force",
                tuple(clauses),
                **common.at_plane(p),
                note=note,
            )
        )
    return items


def hole(joint: Joint) -> float:
    """The hole diameter under EN 1993-1-8: its table, or its fallback off the table, mm."""
    return common.hole_diameter(joint, "en1993-1-8", 2.0)


def _bearing(joint: Joint, bolt: BoltResult) -> list[CheckItem]:
    b = joint.bolt
    d0 = hole(joint)
    items = []
    for pb, ply, where in common.bearing_plies(joint, bolt):
        if joint.check.connector == "pin":
            # Table 3.10: fy is the lower of the pin's and the plate's yield strength
            frd = en.F_b_Rd_pin(ply.thickness, b.diameter, min(ply.fy, b.fyb))
            items.append(
                CheckItem("pin bearing", pb.force, frd, "force", (cited(en.F_b_Rd_pin),), **where)
            )
            continue
        e2 = ply.width / 2.0 if ply.width is not None else None
        k1_note = ""
        try:
            if ply.edge is not None:
                ab = en.alpha_b(ply.edge, None, d0, b.fub, ply.fu, end_bolt=True)
            else:
                ab = min(b.fub / ply.fu, 1.0)
            if e2 is None:
                # no width: the edge distance across the load is unknown; the smallest
                # the standard allows gives the smallest k1 (conservative)
                k1 = en.k_1(en.e_min(d0), None, d0, edge_bolt=True)
                k1_note = (
                    f" (no width given: k1 from the minimum e2 = 1.2 d0 = "
                    f"{length_str(joint.units, en.e_min(d0))}, Table 3.3; conservative)"
                )
            else:
                k1 = en.k_1(e2, None, d0, edge_bolt=True)
        except ValueError as exc:
            items.append(
                CheckItem(
                    "edge distance",
                    en.e_min(d0),
                    min(v for v in (ply.edge, e2) if v is not None),
                    "length",
                    (cited(en.e_min),),
                    **where,
                    note=str(exc),
                )
            )
            continue
        factor = en.bearing_hole_factor(b.hole)
        frd = en.F_b_Rd(k1, ab, ply.fu, b.diameter, ply.thickness) * factor
        clauses = [cited(en.alpha_b), cited(en.k_1), cited(en.F_b_Rd)]
        if factor < 1.0:
            clauses.append(cited(en.bearing_hole_factor))
        items.append(
            CheckItem(
                "bearing",
                pb.force,
                frd,
                "force",
                tuple(clauses),
                **where,
                note=f"k1 {k1:.2f}, alpha_b {ab:.2f}, d0 {length_str(joint.units, d0)}{k1_note}",
            )
        )
    return items


def _bending_shear(
    joint: Joint, bolt: BoltResult, arrays: tuple[np.ndarray, ...], informative: bool, tail: str
) -> CheckItem:
    """Table 3.10 bending with shear, by the model's ``[check] pin_interaction`` rule.

    "max-max" (the default, conservative): the largest M/M_Rd along the bolt with
    the largest F_v/F_v,Rd, wherever each occurs. "same-section": the moment and
    the shear of one section, at the section where their combination peaks.
    """
    m, mrd, v, vrd = arrays
    zs = bolt.z
    if joint.check.pin_interaction == "same-section":
        # the node where the interaction peaks (its terms are monotonic in both ratios),
        # then the clause's own value there
        k = int(np.argmax((m / mrd) ** 2 + (v / vrd) ** 2))
        value = en.pin_interaction(float(m[k]), float(mrd[k]), float(v[k]), float(vrd[k]))
        rule = (
            "(M/MRd)^2 + (Fv/FvRd)^2 with M and Fv of the same section ([check] "
            'pin_interaction = "same-section")'
        )
        z = float(zs[k])
    else:
        i, j = int(np.argmax(m / mrd)), int(np.argmax(v / vrd))
        value = en.pin_interaction(float(m[i]), float(mrd[i]), float(v[j]), float(vrd[j]))
        rule = (
            f"(M/MRd)^2 + (Fv/FvRd)^2 with the largest M (z = "
            f"{length_str(joint.units, float(zs[i]))}) and the largest Fv (z = "
            f"{length_str(joint.units, float(zs[j]))}), conservative; [check] "
            f'pin_interaction = "same-section" takes M and Fv of one section'
        )
        z = float(zs[i])
    return CheckItem(
        "bending + shear",
        value,
        1.0,
        "ratio",
        (cited(en.pin_interaction),),
        informative=informative,
        z=z,
        note=rule + tail,
    )


def figure_3_11(joint: Joint, bolt: BoltResult) -> float | None:
    """The moment of Figure 3.11 for a clevis (cheek, lug, cheek), or None for other stacks.

    a: the cheeks' mean thickness, b: the lug's, c: the mean gap between them; F_Ed
    the lug's bearing (the pin's load).
    """
    plies = [p for p in joint.plies if not p.is_filler]
    if len(plies) != 3 or len(joint.plies) != 3:
        return None
    if not (plies[0].member == plies[2].member != plies[1].member):
        return None
    a = 0.5 * (plies[0].thickness + plies[2].thickness)
    c = 0.5 * (plies[1].gap + plies[2].gap)
    return en.M_Ed_clevis(bolt.plies[1].force, a, plies[1].thickness, c)


def _bolt_items(joint: Joint, bolt: BoltResult, notes: list[str]) -> list[CheckItem]:
    b = joint.bolt
    pin = joint.check.connector == "pin"
    items = []
    # Bending and bending + shear along the bolt (Table 3.10; for bolts informative).
    m = common.resultants(bolt.M)
    v = common.resultants(bolt.V)
    threads = joint.bolt.threaded_along(bolt.z)
    # two sections at most (shank, thread): each resistance once, then spread on the nodes
    by_section = {
        t: (
            en.M_Rd_pin(common.bolt_section_diameter(joint, t), b.fyb),
            plane_resistance(joint, t)[0],
        )
        for t in {bool(t) for t in threads}
    }
    mrd = np.array([by_section[bool(t)][0] for t in threads])
    vrd = np.array([by_section[bool(t)][1] for t in threads])
    informative = not pin
    tail = "" if pin else " (the pin rule applied to a bolt: outside the standard's text)"
    figure = figure_3_11(joint, bolt) if pin else None
    if figure is not None and figure > m.max() > 0:
        # 3.13.2 takes the bearing as uniform (Figure 3.11): never below that moment
        m = m * (figure / m.max())
        u = system(joint.units)
        tail += (
            f"; the solved moments scaled to the Figure 3.11 moment "
            f"{figure / u.factor('moment'):.4g} {u.label('moment')} (uniform bearing, "
            "which governs)"
        )
    i = int(np.argmax(m / mrd))
    items.append(
        CheckItem(
            f"{common.noun(joint)} bending",
            float(m[i]),
            float(mrd[i]),
            "moment",
            (cited(en.M_Rd_pin),),
            informative=informative,
            z=float(bolt.z[i]),
            note="M_Rd = 1.5 Wel fyp / gamma_M0" + tail,
        )
    )
    items.append(_bending_shear(joint, bolt, (m, mrd, v, vrd), informative, tail))
    # Tension and combined (Table 3.4).
    if b.tension > 0:
        ftrd = en.F_t_Rd(b.fub, b.stress_area)
        items.append(CheckItem("bolt tension", b.tension, ftrd, "force", (cited(en.F_t_Rd),)))
        worst = max(bolt.planes, key=lambda p: p.shear / plane_resistance(joint, p.threads)[0])
        fvrd = plane_resistance(joint, worst.threads)[0]
        value = en.shear_tension_interaction(worst.shear, fvrd, b.tension, ftrd)
        items.append(
            CheckItem(
                "tension + shear",
                value,
                1.0,
                "ratio",
                (cited(en.shear_tension_interaction),),
                plane=worst.index,
            )
        )
    # Slip (3.9).
    if joint.check.slip_critical or b.pretension > 0:
        fpc = b.pretension if b.pretension > 0 else en.F_p_C(b.fub, b.stress_area)
        surface = joint.check.slip_class or SURFACE_DEFAULT
        mu = en.mu_class(surface)
        n = common.slip_planes(joint, bolt)
        if n > 0:
            ks = en.k_s(b.hole if b.hole != "standard" else "normal")
            if b.tension > 0:
                frd = en.F_s_Rd_with_tension(ks, n, mu, fpc, b.tension)
                clauses = (cited(en.F_s_Rd_with_tension), cited(en.k_s), cited(en.mu_class))
            else:
                frd = en.F_s_Rd(ks, n, mu, fpc)
                clauses = (cited(en.F_s_Rd), cited(en.k_s), cited(en.mu_class))
            items.append(
                CheckItem(
                    "slip",
                    common.transferred_force(joint, bolt),
                    frd,
                    "force",
                    clauses,
                    note=f"Class {surface}, mu {mu}, "
                    f"Fp,C {force_str(joint.units, fpc)}, n {n}, ks {ks}",
                )
            )
        if b.pretension <= 0:
            notes.append("slip: preload taken as Fp,C = 0.7 fub As (3.9.1(2))")
    return items


ITEMS = common.StandardItems(
    standard="en1993-1-8",
    edition=en.STANDARD,
    notes=_notes,
    bolt=_bolt,
    long_joint=_long_joint,
    method="partial-factors",
)

__all__ = ["ITEMS", "figure_3_11", "plane_resistance"]
