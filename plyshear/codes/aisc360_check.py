"""AISC 360-22 checks of a solved joint (LRFD or ASD).

Per plane: bolt shear (J3.6, Table J3.2) with threads included or excluded from
the geometry, the J5.2 filler factor on planes that bound a filler pack, the
long-joint factor. Per ply: bearing and tear-out (J3.10) with the ply's own
solved bearing force, or pin bearing (J7). The bolt: tension and combined
tension–shear (J3.7), slip (J3.8), and, as an informative item outside the
standard's text, bending against the plastic moment of the bolt section.
"""

from __future__ import annotations

from plyshear.codes import aisc360 as aisc
from plyshear.codes import common
from plyshear.codes.clause import Clause, cited
from plyshear.codes.result import CheckItem
from plyshear.mechanics.results import BoltResult
from plyshear.model import catalog
from plyshear.model.joint import Joint
from plyshear.units import MM_PER_IN, force_str, length_str

PHI_BOLT, OMEGA_BOLT = 0.75, 2.00  # J3.6, J3.7, J3.10 and J7
PHI_FLEXURE, OMEGA_FLEXURE = 0.90, 1.67  # F1, used for the informative bending item
MU = {"A": 0.30, "B": 0.50}  # J3.8 Class A and Class B surfaces


def _group(joint: Joint) -> str | None:
    """The Table J3.2 group of the bolt's grade ("A307", "A", "B", "C"), or None."""
    grade = catalog.fastener(joint.bolt.grade)
    return grade.aisc_group if grade.key != "A307" else "A307"


def _notes(joint: Joint) -> list[str]:
    grade = catalog.fastener(joint.bolt.grade)
    group = _group(joint)
    if group is None:
        return [
            f"grade {grade.key} is not an ASTM structural bolt: Table J3.2 "
            "threaded-part strengths with Fu = fub are used"
        ]
    return [f"bolt group: {aisc.EDITION_GROUP_NAMES.get(group, group)} (model key {grade.key})"]


def _bolt(joint: Joint, bolt: BoltResult, method: str, notes: list[str]) -> list[CheckItem]:
    group = _group(joint)
    return (
        _shear(joint, bolt, method, group, notes)
        + _bearing(joint, bolt, method)
        + _bolt_items(joint, bolt, method, group, notes)
    )


def _long_joint(joint: Joint) -> tuple[float, str]:
    length = common.joint_length(joint)
    return (aisc.long_joint_factor(length) if length > 0 else 1.0, "AISC 360-22 J3.6 long-joint")


def _avail(rn: float, method: str, phi: float = PHI_BOLT, omega: float = OMEGA_BOLT) -> float:
    return aisc.available(rn, method, phi, omega)


def _fnv(group: str | None, fub: float, threads: bool) -> tuple[float, Clause]:
    if group is None:
        fnv = aisc.F_nv_threaded_part(fub, threads_excluded=not threads)
        return fnv, cited(aisc.F_nv_threaded_part)
    return aisc.F_nv(group, threads_excluded=not threads), cited(aisc.F_nv)


def _shear(
    joint: Joint, bolt: BoltResult, method: str, group: str | None, notes: list[str]
) -> list[CheckItem]:
    b = joint.bolt
    ab = b.gross_area  # J3.6: nominal unthreaded body area, also through threads
    items = []
    long_factor = (
        aisc.long_joint_factor(common.joint_length(joint))
        if common.joint_length(joint) > 0
        else 1.0
    )
    grip_factor = aisc.A307_long_grip_factor(joint.grip, b.diameter) if group == "A307" else 1.0
    developed = joint.check.fillers == "developed"
    for p in bolt.planes:
        fnv, fnv_clause = _fnv(group, b.fub, p.threads)
        clauses = [cited(aisc.R_n_shear), fnv_clause]
        rn = aisc.R_n_shear(fnv, ab) * long_factor * grip_factor
        if long_factor < 1.0:
            clauses.append(cited(aisc.long_joint_factor))
        if grip_factor < 1.0:
            clauses.append(cited(aisc.A307_long_grip_factor))
        note = "threads included" if p.threads else "threads excluded"
        t_pack = common.pack_at_plane(joint, p.above, p.below)
        if t_pack > 0:
            try:
                form = "us" if joint.units == "kip-in" else "si"
                factor = aisc.filler_factor(t_pack, developed=developed, form=form)
            except ValueError as exc:
                items.append(
                    CheckItem(
                        "filler thickness",
                        t_pack,
                        aisc.FILLER_MAX,
                        "length",
                        (cited(aisc.filler_factor),),
                        **common.at_plane(p),
                        note=str(exc),
                    )
                )
                factor = 1.0
            rn *= factor
            clauses.append(cited(aisc.filler_factor))
            note += f", filler {length_str(joint.units, t_pack)}: factor {factor:.3f}"
        items.append(
            CheckItem(
                f"{common.noun(joint)} shear",
                p.shear,
                _avail(rn, method),
                "force",
                tuple(clauses),
                **common.at_plane(p),
                note=note,
            )
        )
    if common.packs(joint) and not developed:
        notes.append(
            "fillers taken as not developed (J5.2); set [check] fillers = "
            '"developed" if they are extended and bolted or welded'
        )
    return items


def hole(joint: Joint) -> float:
    """The hole diameter under AISC 360-22: its table, or its fallback off the table, mm."""
    inch = catalog.is_inch_size(joint.bolt.diameter)
    return common.hole_diameter(joint, "aisc360-22", MM_PER_IN / 16.0 if inch else 2.0)


def _bearing(joint: Joint, bolt: BoltResult, method: str) -> list[CheckItem]:
    b = joint.bolt
    pin = joint.check.connector == "pin"
    long_slot = b.hole == "long-slot"
    deform = joint.check.deformation_considered
    dh = hole(joint)
    items = []
    for pb, ply, where in common.bearing_plies(joint, bolt):
        if pin:
            rn = aisc.R_n_pin_bearing(ply.thickness * b.diameter, ply.fy)
            items.append(
                CheckItem(
                    "pin bearing",
                    pb.force,
                    _avail(rn, method),
                    "force",
                    (cited(aisc.R_n_pin_bearing),),
                    **where,
                )
            )
        else:
            rn = aisc.R_n_bearing(b.diameter, ply.thickness, ply.fu, deform, long_slot)
            note = "deformation at service considered" if deform else "deformation not considered"
            items.append(
                CheckItem(
                    "bearing",
                    pb.force,
                    _avail(rn, method),
                    "force",
                    (cited(aisc.R_n_bearing),),
                    **where,
                    note=note,
                )
            )
        if ply.edge is not None:
            lc = aisc.l_c_edge(ply.edge, dh) if ply.edge > dh / 2 else 0.0
            rn = aisc.R_n_tearout(lc, ply.thickness, ply.fu, deform, long_slot) if lc > 0 else 0.0
            items.append(
                CheckItem(
                    "tear-out",
                    pb.force,
                    _avail(rn, method),
                    "force",
                    (cited(aisc.R_n_tearout), cited(aisc.l_c_edge)),
                    **where,
                    note=f"lc = {length_str(joint.units, lc)}, hole {length_str(joint.units, dh)}",
                )
            )
    return items


def _bolt_items(
    joint: Joint, bolt: BoltResult, method: str, group: str | None, notes: list[str]
) -> list[CheckItem]:
    b = joint.bolt
    items = []
    # Bending: informative, the plastic moment of the section where M is largest.
    m = common.resultants(bolt.M)
    i = int(m.argmax())
    threaded = bool(joint.bolt.threaded_along(bolt.z)[i])
    mp = aisc.M_p_circle(common.bolt_section_diameter(joint, threaded), b.fyb)
    items.append(
        CheckItem(
            f"{common.noun(joint)} bending",
            float(m[i]),
            _avail(mp, method, PHI_FLEXURE, OMEGA_FLEXURE),
            "moment",
            (cited(aisc.M_p_circle),),
            informative=True,
            z=float(bolt.z[i]),
            note="outside the standard's text: plastic moment of the "
            + ("threaded" if threaded else "shank")
            + " section, phi 0.90 / Omega 1.67",
        )
    )
    # Tension and combined tension and shear (J3.7).
    if b.tension > 0:
        fnt = aisc.F_nt(group) if group is not None else aisc.F_nt_threaded_part(b.fub)
        worst = max(bolt.planes, key=lambda p: p.shear)
        fnv, _ = _fnv(group, b.fub, worst.threads)
        frv = worst.shear / b.gross_area
        fnt_p = aisc.F_nt_prime(fnt, fnv, frv, method, PHI_BOLT, OMEGA_BOLT)
        items.append(
            CheckItem(
                "bolt tension",
                b.tension,
                _avail(fnt * b.gross_area, method),
                "force",
                (cited(aisc.F_nt),),
            )
        )
        items.append(
            CheckItem(
                "tension + shear",
                b.tension,
                _avail(fnt_p * b.gross_area, method),
                "force",
                (cited(aisc.F_nt_prime),),
                plane=worst.index,
                note=f"frv = {frv:.0f} MPa",
            )
        )
    # Slip (J3.8).
    if joint.check.slip_critical or b.pretension > 0:
        items += _slip(joint, bolt, method, group, notes)
    return items


def _slip(
    joint: Joint, bolt: BoltResult, method: str, group: str | None, notes: list[str]
) -> list[CheckItem]:
    b = joint.bolt
    tb = b.pretension
    if tb <= 0:
        if group not in ("A", "B"):
            notes.append(
                "slip not checked: no pretension given and Table J3.1 covers "
                "Group A and B bolts only"
            )
            return []
        try:
            tb = aisc.T_b_min(b.diameter, group)
        except ValueError as exc:
            notes.append(f"slip not checked: {exc}")
            return []
    surface = joint.check.slip_class or "A"

    n_fillers = sum(len(run) for run, _ in common.packs(joint))
    hf = aisc.h_f(n_fillers, developed=joint.check.fillers == "developed")
    ns = common.slip_planes(joint, bolt)
    if ns == 0:
        return []
    rn = aisc.R_n_slip(MU[surface], tb, ns, hf)
    clauses = [cited(aisc.R_n_slip), cited(aisc.h_f)]
    if b.tension > 0:
        rn *= aisc.k_sc(b.tension, tb, 1, method)
        clauses.append(cited(aisc.k_sc))
    avail = _avail(rn, method, aisc.phi_slip(b.hole), aisc.omega_slip(b.hole))
    return [
        CheckItem(
            "slip",
            common.transferred_force(joint, bolt),
            avail,
            "force",
            tuple(clauses),
            note=f"Class {surface}, mu {MU[surface]}, Tb {force_str(joint.units, tb)}, "
            f"ns {ns}, hf {hf}",
        )
    ]


ITEMS = common.StandardItems(
    standard="aisc360-22", edition=aisc.STANDARD, notes=_notes, bolt=_bolt, long_joint=_long_joint
)

__all__ = ["ITEMS", "OMEGA_BOLT", "PHI_BOLT"]
