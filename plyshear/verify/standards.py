"""Verification cases of the design standards: AISC 360-22 and EN 1993-1-8."""

from __future__ import annotations

import math

from plyshear.verify.case import (
    IN,
    KIP,
    KSI,
    REL_END_TO_END,
    REL_PIN_FORMULA,
    REL_PRINTED_3,
    REL_ROUND_OFF,
    REL_STATICS,
    Case,
    case,
    clevis,
    item,
    ply,
    solve,
)

# --- AISC 360-22 --------------------------------------------------------------


@case
def case_aisc_table_j3_2_fnv_group_a_n() -> Case:
    """Nominal shear stress, Group A, threads included."""
    from plyshear.codes import aisc360 as aisc

    return Case(
        "AISC 360-22",
        "aisc_table_j3_2_fnv_group_a_n",
        "AISC 360-22 Table J3.2: Fnv = 54 ksi, Group A, threads included",
        "Fnv [MPa]",
        54.0 * KSI,
        aisc.F_nv("A", threads_excluded=False),
        REL_ROUND_OFF,
    )


@case
def case_aisc_manual_7_1_three_quarter_a_n() -> Case:
    """Design shear of a 3/4 in Group A-N bolt in single shear."""
    from plyshear.codes import aisc360 as aisc

    rn = aisc.R_n_shear(aisc.F_nv("A", threads_excluded=False), math.pi / 4 * (0.75 * IN) ** 2)
    return Case(
        "AISC 360-22",
        "aisc_manual_7_1_three_quarter_a_n",
        "from memory: AISC Manual Table 7-1, 3/4 in Group A-N, single shear "
        "φrn = 17.9 kips (J3.6, Eq. J3-1)",
        "φRn [kip]",
        17.9,
        aisc.available(rn, "lrfd", 0.75, 2.00) / KIP,
        REL_PRINTED_3,
    )


@case
def case_aisc_j3_10_bearing() -> Case:
    """Nominal bearing of a 3/4 in bolt on a 1/2 in A36 plate."""
    from plyshear.codes import aisc360 as aisc

    rn = aisc.R_n_bearing(0.75 * IN, 0.5 * IN, 58.0 * KSI)
    return Case(
        "AISC 360-22",
        "aisc_j3_10_bearing",
        "AISC 360-22 J3.10(a): Rn = 2.4 d t Fu (d = 3/4 in, t = 1/2 in, Fu = 58 ksi)",
        "Rn [kip]",
        2.4 * 0.75 * 0.5 * 58.0,
        rn / KIP,
        REL_ROUND_OFF,
    )


@case
def case_aisc_j5_2_filler_factor() -> Case:
    """Filler factor of a 1/2 in filler, US form against the SI form the code uses."""
    from plyshear.codes import aisc360 as aisc

    return Case(
        "AISC 360-22",
        "aisc_j5_2_filler_factor",
        "AISC 360-22 J5.2(b): 1 − 0.4(t − 0.25), t = 0.5 in (US form)",
        "filler factor by the SI form the check uses, t = 12.7 mm [-]",
        1 - 0.4 * (0.5 - 0.25),
        aisc.filler_factor(0.5 * IN),
        REL_PRINTED_3,
    )


@case
def case_aisc_long_joint() -> Case:
    """Shear reduction of a pattern longer than 38 in."""
    from plyshear.codes import aisc360 as aisc

    return Case(
        "AISC 360-22",
        "aisc_long_joint",
        "AISC 360-22 J3.6 (from memory): Fnv × 0.833 beyond 38 in",
        "factor at 40 in [-]",
        0.833,
        aisc.long_joint_factor(40 * IN),
        REL_ROUND_OFF,
    )


def _d7(extra: str = "") -> str:
    """AISC Design Example D.7: 1/2 in A36 plate on a 1 in pin, in a clevis."""
    a36 = "fy = 36\nfu = 58\n"
    return (
        'format = 1\nunits = "kip-in"\n[bolt]\ndiameter = 1.0\ngrade = "A325"\n'
        'threads = "excluded"\n'
        + ply("clevis-1", "clevis", 1.0, a36)
        + ply("plate", "plate", 0.5, a36)
        + ply("clevis-2", "clevis", 1.0, a36)
        + "[member.clevis]\nsupport = true\n[member.plate]\nload = 24.0\n"
        '[check]\nstandard = "aisc360-22"\nmethod = "lrfd"\nconnector = "pin"\n' + extra
    )


@case
def case_aisc_example_d7_pin_bearing() -> Case:
    """Design Example D.7 end to end: model, solve, check, pin bearing."""
    found = item(_d7(), "pin bearing", "ply plate")
    return Case(
        "AISC 360-22",
        "aisc_example_d7_pin_bearing",
        "AISC Design Examples, Example D.7: φRn = 0.75 × 1.8 Fy Apb = 24.3 kips (J7, Eq. J7-1)",
        "pin bearing design strength [kip]",
        24.3,
        found.capacity / KIP,
        REL_PRINTED_3,
    )


@case
def case_aisc_example_d7_demand() -> Case:
    """Design Example D.7 end to end: the solved bearing demand is the load."""
    found = item(_d7(), "pin bearing", "ply plate")
    return Case(
        "AISC 360-22",
        "aisc_example_d7_demand",
        "AISC Design Examples, Example D.7: Pu = 1.2(4) + 1.6(12) = 24.0 kips",
        "plate bearing demand [kip]",
        24.0,
        found.demand / KIP,
        REL_STATICS,
    )


def _filler_joint() -> str:
    """A 3/4 in A325-X bolt through a 1/2 in loose filler, three plies (kip-in)."""
    a36 = "fy = 36\nfu = 58\n"
    return (
        'format = 1\nunits = "kip-in"\n[bolt]\ndiameter = 0.75\ngrade = "A325"\n'
        'threads = "excluded"\n'
        + ply("plate", "plate", 0.75, a36)
        + ply("filler", None, 0.5, a36)
        + ply("splice", "splice", 0.75, a36)
        + "[member.plate]\nsupport = true\n[member.splice]\nload = 10.0\n"
        '[check]\nstandard = "aisc360-22"\nmethod = "lrfd"\n'
    )


def _single_lap(
    units: str, d: float, grade: str, t: float, steel: str, load: float, standard: str
) -> str:
    """Two plies in single shear, threads in the plane (the bolt's length puts them there)."""
    return (
        f'format = 1\nunits = "{units}"\n[bolt]\ndiameter = {d!r}\ngrade = "{grade}"\n'
        'threads = "included"\n'
        + ply("held", "held", t, f'steel = "{steel}"\n')
        + ply("pulled", "pulled", t, f'steel = "{steel}"\n')
        + f"[member.held]\nsupport = true\n[member.pulled]\nload = {load!r}\n"
        f'[check]\nstandard = "{standard}"\n'
    )


@case
def case_aisc_manual_7_1_end_to_end() -> Case:
    """End to end: a 3/4 in A325 bolt, threads included, in a single-shear lap."""
    found = item(
        _single_lap("kip-in", 0.75, "A325", 0.75, "A36", 10.0, "aisc360-22"),
        "bolt shear",
        "plane 1",
    )
    return Case(
        "AISC 360-22",
        "aisc_manual_7_1_end_to_end",
        "from memory: AISC Manual Table 7-1, 3/4 in Group A-N, single shear: "
        "φrn = 17.9 kips; model → solve → check",
        "plane 1 design shear strength [kip]",
        17.9,
        found.capacity / KIP,
        REL_PRINTED_3,
    )


@case
def case_aisc_bolt_shear_through_filler() -> Case:
    """End to end: a plane bounding a 1/2 in filler, threads excluded."""
    found = item(_filler_joint(), "bolt shear", "plane 1")
    ref = 0.75 * 68.0 * math.pi / 4 * 0.75**2 * (1 - 0.4 * (0.5 - 0.25))
    return Case(
        "AISC 360-22",
        "aisc_bolt_shear_through_filler",
        "AISC 360-22 J3.6 Eq. J3-1, Table J3.2 (Fnv = 68 ksi, A-X), J5.2(b) filler: "
        "0.75 Fnv Ab [1 − 0.4(t − 0.25)]",
        "plane 1 design shear strength [kip]",
        ref,
        found.capacity / KIP,
        REL_PRINTED_3,
    )


# --- EN 1993-1-8 ----------------------------------------------------------------


@case
def case_en_table_3_4_m20_8_8_threads() -> Case:
    """Shear resistance per plane of an M20 8.8 through its threads."""
    from plyshear.codes import en1993_1_8 as en

    value = en.F_v_Rd(en.alpha_v("8.8", threads_in_plane=True), 800.0, 245.0) / 1000
    return Case(
        "EN 1993-1-8",
        "en_table_3_4_m20_8_8_threads",
        "ArcelorMittal/SCI Orange Book, bolt resistances, M20 8.8: 94.1 kN "
        "(EN 1993-1-8 Table 3.4, As = 245 mm², ISO 898-1)",
        "Fv,Rd per plane [kN]",
        94.1,
        value,
        REL_PRINTED_3,
    )


@case
def case_en_orange_book_end_to_end() -> Case:
    """End to end: an M20 8.8 bolt, threads in the plane, in a single-shear lap."""
    found = item(
        _single_lap("kN-mm", 20.0, "8.8", 15.0, "S355", 50.0, "en1993-1-8"), "bolt shear", "plane 1"
    )
    return Case(
        "EN 1993-1-8",
        "en_orange_book_end_to_end",
        "ArcelorMittal/SCI Orange Book, M20 8.8 shear per plane through threads: "
        "94.1 kN; model → solve → check",
        "plane 1 Fv,Rd [kN]",
        94.1,
        found.capacity / 1000.0,
        REL_PRINTED_3,
    )


@case
def case_en_packing_beta_p() -> Case:
    """Packing factor for a 30 mm pack on an M20."""
    from plyshear.codes import en1993_1_8 as en

    return Case(
        "EN 1993-1-8",
        "en_packing_beta_p",
        "EN 1993-1-8 3.6.1(12): βp = 9d/(8d + 3tp), d = 20, tp = 30 mm",
        "βp [-]",
        9 * 20 / (8 * 20 + 3 * 30),
        en.beta_p(20.0, 30.0),
        REL_ROUND_OFF,
    )


@case
def case_en_long_joint_beta_lf() -> Case:
    """Long-joint factor at Lj = 30 d."""
    from plyshear.codes import en1993_1_8 as en

    return Case(
        "EN 1993-1-8",
        "en_long_joint_beta_lf",
        "EN 1993-1-8 3.8(1): βLf = 1 − (Lj − 15d)/200d, Lj = 30 d",
        "βLf [-]",
        1 - 15 / 200,
        en.beta_Lf(600.0, 20.0),
        REL_ROUND_OFF,
    )


def _en_pack_joint() -> str:
    """An M20 8.8 through a 30 mm pack of S355 between two members (N-mm)."""
    s355 = 'steel = "S355"\n'
    return (
        'format = 1\nunits = "N-mm"\n[bolt]\ndiameter = 20\ngrade = "8.8"\n'
        'threads = "excluded"\n'
        + ply("chord", "chord", 15.0, s355 + "edge = 40\nwidth = 100\n")
        + ply("pack", None, 30.0, s355)
        + ply("cover", "cover", 15.0, s355 + "edge = 40\nwidth = 100\n")
        + "[member.chord]\nsupport = true\n[member.cover]\nload = 50000.0\n"
        '[check]\nstandard = "en1993-1-8"\n'
    )


@case
def case_en_shear_through_pack() -> Case:
    """End to end: the plane bounding a 30 mm pack, shank in the plane."""
    found = item(_en_pack_joint(), "bolt shear", "plane 1")
    beta_p = 9 * 20 / (8 * 20 + 3 * 30)
    ref = beta_p * 0.6 * 800.0 * math.pi * 20**2 / 4 / 1.25
    return Case(
        "EN 1993-1-8",
        "en_shear_through_pack",
        "EN 1993-1-8 Table 3.4 (αv = 0.6, shank, γM2 = 1.25) × 3.6.1(12) βp",
        "plane 1 Fv,Rd [N]",
        ref,
        found.capacity,
        REL_END_TO_END,
    )


@case
def case_en_bearing_end_bolt() -> Case:
    """End to end: bearing of a 15 mm S355 ply, e1 = 40, e2 = 50 mm, M20 8.8."""
    found = item(_en_pack_joint(), "bearing", "ply chord")
    d0, fu = 22.0, 510.0  # EN 1090-2 normal hole d + 2; EN 10025-2 S355 fu (t ≤ 40 mm)
    alpha_b = min(40 / (3 * d0), 800.0 / fu, 1.0)
    k1 = min(2.8 * 50 / d0 - 1.7, 2.5)
    ref = k1 * alpha_b * fu * 20 * 15 / 1.25
    return Case(
        "EN 1993-1-8",
        "en_bearing_end_bolt",
        "EN 1993-1-8 Table 3.4: Fb,Rd = k1 αb fu d t/γM2 (end bolt: αb = e1/3d0)",
        "ply chord Fb,Rd [N]",
        ref,
        found.capacity,
        REL_END_TO_END,
    )


@case
def case_en_table_3_10_pin_moment() -> Case:
    """Pin moment in a clevis against the formula of Figure 3.11."""
    a, b, c = 10.0, 20.0, 2.0
    _, sol = solve(clevis(a, b, c))
    return Case(
        "EN 1993-1-8",
        "en_table_3_10_pin_moment",
        "EN 1993-1-8 3.13.2, Table 3.10 / Figure 3.11: M = F(b + 4c + 2a)/8",
        "largest pin moment, F = 100 kN [N·mm]",
        100000.0 * (b + 4 * c + 2 * a) / 8,
        sol.bolts[0].max_moment,
        REL_PIN_FORMULA,
    )
