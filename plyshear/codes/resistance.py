"""The factor from a nominal capacity to a design value, per standard and method.

The capacity analyses give nominal strengths; set against the model's loads
(factored for LRFD and EN, service for ASD) they need the standard's factor.
"""

from __future__ import annotations

from plyshear.codes.aisc360_check import OMEGA_BOLT, PHI_BOLT
from plyshear.model.joint import Joint

#: EN 1993-1-8:2005 Table 2.1: partial factor for bolts, pins and plates in bearing
#: (the recommended value; a National Annex may change it).
GAMMA_M2 = 1.25


def design_factor(standard: str, method: str) -> tuple[float, str]:
    """Return the factor on a nominal capacity and how it reads in a report.

    Args:
        standard: "aisc360-22" or "en1993-1-8".
        method: "lrfd" or "asd" (AISC only).

    Returns:
        (factor, label), e.g. (0.75, "phi = 0.75").
    """
    if standard == "en1993-1-8":
        return 1.0 / GAMMA_M2, f"1/gamma_M2 = 1/{GAMMA_M2:.2f}, EN 1993-1-8 Table 2.1"
    if method == "asd":
        return 1.0 / OMEGA_BOLT, f"1/Omega = 1/{OMEGA_BOLT:.2f}, AISC 360-22 J3.6 and J3.10"
    return PHI_BOLT, f"phi = {PHI_BOLT:.2f}, AISC 360-22 J3.6 and J3.10"


def nominal_bearing(joint: Joint) -> list[tuple[float, str]]:
    """Every ply's nominal bearing strength under the model's standard, per mm of ply.

    The line strength along the bolt, N/mm (times the ply's thickness: the
    ply's strength), and the rule that gives it. The standard's own clause
    functions, with t = 1 and no partial factor (nominal, or characteristic):

    * AISC 360-22 bolts: min(J3.10(a) bearing, J3.10(b) tear-out to the ply's edge);
      pins: J7, 1.8·Fy·A_pb;
    * EN 1993-1-8 bolts: Table 3.4, k1·αb·fu·d (k1 from e2 = width/2, or from the
      minimum e2 = 1.2·d0 where no width is given: conservative; αb from the edge
      e1 where given); pins: Table 3.10, 1.5·fy·d (fy the lower of pin and plate).

    Raises:
        ValueError: One line naming the ply's ``edge`` when it leaves no material
            beyond the hole, or is below the standard's minimum.
    """
    from plyshear.codes import aisc360 as aisc
    from plyshear.codes import en1993_1_8 as en
    from plyshear.codes.aisc360_check import hole as aisc_hole
    from plyshear.codes.en1993_1_8_check import hole as en_hole

    b, std = joint.bolt, joint.check.standard
    pin = joint.check.connector == "pin"
    out: list[tuple[float, str]] = []
    for i, p in enumerate(joint.plies, start=1):
        try:
            if std == "en1993-1-8":
                if pin:
                    out.append(
                        (
                            en.F_b_Rd_pin(1.0, b.diameter, min(p.fy, b.fyb), 1.0),
                            "EN Table 3.10 1.5 fy d t",
                        )
                    )
                    continue
                d0 = en_hole(joint)
                ab = (
                    en.alpha_b(p.edge, None, d0, b.fub, p.fu, end_bolt=True)
                    if p.edge is not None
                    else min(b.fub / p.fu, 1.0)
                )
                e2 = p.width / 2.0 if p.width is not None else en.e_min(d0)
                k1 = en.k_1(e2, None, d0, edge_bolt=True)
                q = en.F_b_Rd(k1, ab, p.fu, b.diameter, 1.0, 1.0) * en.bearing_hole_factor(b.hole)
                out.append((q, f"EN Table 3.4 k1 {k1:.2f} ab {ab:.2f}"))
                continue
            if pin:
                out.append((aisc.R_n_pin_bearing(b.diameter, p.fy), "AISC J7 1.8 Fy d t"))
                continue
            deform = joint.check.deformation_considered
            q = aisc.R_n_bearing(b.diameter, 1.0, p.fu, deform)
            rule = f"bearing {2.4 if deform else 3.0:g} d t fu"
            if p.edge is not None:
                lc = aisc.l_c_edge(p.edge, aisc_hole(joint))
                tear = aisc.R_n_tearout(lc, 1.0, p.fu, deform)
                if tear < q:
                    q, rule = tear, f"tear-out {1.2 if deform else 1.5:g} lc t fu"
            out.append((q, rule))
        except ValueError as exc:
            raise ValueError(f"ply[{i}].edge: {exc}") from None
    return out
