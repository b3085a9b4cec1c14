"""Verification against EN 1993-1-8:2005 and published resistance tables.

References:
    EN 1993-1-8:2005 (+AC:2009), Eurocode 3: Design of steel structures,
    Part 1-8: Design of joints. CEN, Brussels: Table 3.4 (bolt resistances),
    3.6.1(12) (packing), 3.8 (long joints), 3.9 and Tables 3.6 / 3.7 (slip),
    3.13 and Table 3.10 (pins).
    ArcelorMittal / SCI, "Orange Book" design data, bolt resistance tables
    for non-countersunk bolts, Class 8.8 and Class 10.9 (per BS EN 1993-1-8
    with the UK National Annex, γM2 = 1.25, γM3 = 1.25, γM3,ser = 1.1),
    https://orangebook.arcelormittal.com/ (read): shear per plane through
    threads M16 / M20 / M24 / M30 8.8: 60.3 / 94.1 / 136 / 215 kN; 10.9:
    62.8 / 98 / 141 / 224 kN; slip resistance at SLS, μ = 0.5, single
    shear, M20 8.8: 62.4 kN; at ULS (countersunk table, same slip rule):
    M20 8.8, μ = 0.5, single: 54.9 kN.
    The packing example βp(d = 20, tp = 30) = 0.72 is from docs/references.md (read).

Stress areas As (mm²) are from ISO 898-1 (docs/references.md, read).
"""

from __future__ import annotations

import math

import pytest

from plyshear.codes import en1993_1_8 as ec

# Values printed to 3 significant figures: half a unit in the last place.
REL_TABLE_ROUNDING = 5e-3
# Closed forms recomputed in the test: only round-off remains.
REL_EXACT = 1e-12
# Values printed to 4 significant figures (e.g. 104.8 kN).
REL_FOUR_FIGURES = 5e-4

A_S = {16: 157.0, 20: 245.0, 24: 353.0, 30: 561.0}  # ISO 898-1 stress areas, mm²
F_UB = {"8.8": 800.0, "10.9": 1000.0}  # ISO 898-1 nominal fub, MPa


@pytest.mark.parametrize(
    ("size", "grade", "kn"),
    [
        (16, "8.8", 60.3),  # Orange Book, Class 8.8 bolt resistances (read)
        (20, "8.8", 94.1),  # Orange Book, Class 8.8 (read)
        (24, "8.8", 136.0),  # Orange Book, Class 8.8 (read)
        (30, "8.8", 215.0),  # Orange Book, Class 8.8 (read)
        (16, "10.9", 62.8),  # Orange Book, Class 10.9 (read)
        (20, "10.9", 98.0),  # Orange Book, Class 10.9 (read)
        (24, "10.9", 141.0),  # Orange Book, Class 10.9 (read)
        (30, "10.9", 224.0),  # Orange Book, Class 10.9 (read)
    ],
)
def test_table_3_4_shear_per_plane_through_threads(size: int, grade: str, kn: float) -> None:
    av = ec.alpha_v(grade, threads_in_plane=True)
    assert ec.F_v_Rd(av, F_UB[grade], A_S[size]) / 1000.0 == pytest.approx(
        kn, rel=REL_TABLE_ROUNDING
    )


def test_table_3_4_shear_through_shank_uses_alpha_06_and_gross_area() -> None:
    # derived: EN 1993-1-8 Table 3.4: 0.6*1000*pi/4*20²/1.25 = 150.80 kN (10.9 shank)
    av = ec.alpha_v("10.9", threads_in_plane=False)
    area = math.pi / 4.0 * 20.0**2
    assert ec.F_v_Rd(av, 1000.0, area) == pytest.approx(0.6 * 1000.0 * area / 1.25, rel=REL_EXACT)


def test_table_3_4_bearing_m20_end_and_edge_bolt() -> None:
    # derived (docs/references.md): M20, d0 22, t 10, fu 510, e1 40, e2 30, fub 800:
    # alpha_b = 40/66 = 0.606, k1 = 2.8*30/22 - 1.7 = 2.118 -> 104.8 kN
    ab = ec.alpha_b(e_1=40.0, p_1=None, d_0=22.0, f_ub=800.0, f_u=510.0, end_bolt=True)
    k1 = ec.k_1(e_2=30.0, p_2=None, d_0=22.0, edge_bolt=True)
    assert ab == pytest.approx(40.0 / 66.0, rel=REL_EXACT)
    assert k1 == pytest.approx(2.8 * 30.0 / 22.0 - 1.7, rel=REL_EXACT)
    assert ec.F_b_Rd(k1, ab, 510.0, 20.0, 10.0) / 1000.0 == pytest.approx(
        104.8, rel=REL_FOUR_FIGURES
    )


def test_table_3_4_tension_m20_8_8() -> None:
    # derived: Table 3.4 Ft,Rd = 0.9*800*245/1.25 = 141.1 kN
    # (from memory: SCI/Orange Book tables print 141 kN)
    assert ec.F_t_Rd(800.0, 245.0) / 1000.0 == pytest.approx(141.0, rel=REL_TABLE_ROUNDING)


def test_table_3_4_combined_shear_tension_at_limit() -> None:
    # derived: Table 3.4: Fv/FvRd + Ft/(1.4 FtRd) = 0.5 + 0.7/1.4 = 1.0
    ratio = ec.shear_tension_interaction(50.0, 100.0, 70.0, 100.0)
    assert ratio == pytest.approx(1.0, rel=REL_EXACT)


def test_clause_3_6_1_12_packing_d20_tp30() -> None:
    # docs/references.md (read): d 20, tp 30 -> beta_p = 9*20/(160 + 90) = 0.72
    assert ec.beta_p(20.0, 30.0) == pytest.approx(0.72, rel=REL_EXACT)


def test_clause_3_8_long_joint_m20() -> None:
    # derived: 3.8(1): Lj = 500, d = 20: 1 - (500 - 300)/4000 = 0.95
    assert ec.beta_Lf(500.0, 20.0) == pytest.approx(0.95, rel=REL_EXACT)
    # derived: Lj = 65d gives the lower limit 0.75 exactly
    assert ec.beta_Lf(65.0 * 20.0, 20.0) == pytest.approx(0.75, rel=REL_EXACT)


def test_clause_3_9_slip_sls_m20_8_8_class_a() -> None:
    # Orange Book, Class 8.8, slip resistance Fs,Rd,ser, mu = 0.5, single shear, M20:
    # 62.4 kN (read): ks = 1, n = 1, Fp,C = 0.7*800*245, gamma_M3,ser = 1.1
    fpc = ec.F_p_C(800.0, 245.0)
    fs = ec.F_s_Rd(ec.k_s("standard"), 1, ec.mu_class("A"), fpc, gamma_M3=1.1)
    assert fs / 1000.0 == pytest.approx(62.4, rel=REL_TABLE_ROUNDING)


def test_clause_3_9_slip_uls_m20_8_8_double_shear() -> None:
    # Orange Book, Class 8.8 countersunk, preloaded at ULS, M20, mu = 0.5:
    # single 54.9 kN, double 110 kN (read)
    fpc = ec.F_p_C(800.0, 245.0)
    single = ec.F_s_Rd(1.0, 1, 0.5, fpc)
    double = ec.F_s_Rd(1.0, 2, 0.5, fpc)
    assert single / 1000.0 == pytest.approx(54.9, rel=REL_TABLE_ROUNDING)
    assert double / 1000.0 == pytest.approx(110.0, rel=REL_TABLE_ROUNDING)


def test_clause_3_9_2_slip_with_tension() -> None:
    # derived: 3.9.2 Eq. 3.8a: ks n mu (Fp,C - 0.8 Ft,Ed)/gamma_M3
    fpc = ec.F_p_C(800.0, 245.0)
    expected = 1.0 * 1 * 0.5 * (fpc - 0.8 * 50e3) / 1.25
    assert ec.F_s_Rd_with_tension(1.0, 1, 0.5, fpc, 50e3) == pytest.approx(expected, rel=REL_EXACT)


@pytest.mark.parametrize(
    ("hole", "parallel", "ks"),
    [
        ("standard", False, 1.0),  # EN 1993-1-8 Table 3.6: normal holes
        ("oversized", False, 0.85),  # Table 3.6: oversized holes
        ("short-slot", False, 0.85),  # Table 3.6: short slots, axis perpendicular
        ("long-slot", False, 0.7),  # Table 3.6: long slots, axis perpendicular
        ("short-slot", True, 0.76),  # Table 3.6: short slots, axis parallel
        ("long-slot", True, 0.63),  # Table 3.6: long slots, axis parallel
    ],
)
def test_table_3_6_hole_factor(hole: str, parallel: bool, ks: float) -> None:
    assert ec.k_s(hole, slot_parallel_to_load=parallel) == pytest.approx(ks, rel=REL_EXACT)


@pytest.mark.parametrize(
    ("cls", "mu"),
    [("A", 0.5), ("B", 0.4), ("C", 0.3), ("D", 0.2)],  # EN 1993-1-8 Table 3.7
)
def test_table_3_7_slip_factor(cls: str, mu: float) -> None:
    assert ec.mu_class(cls) == pytest.approx(mu, rel=REL_EXACT)


def test_table_3_10_pin_in_clevis() -> None:
    # derived: Table 3.10 / Figure 3.11 for a 30 mm S355 pin (fyp 355, fup 490),
    # outer plates a = 10, inner b = 20, gap c = 1, F_Ed = 100 kN.
    d, f_yp, f_up = 30.0, 355.0, 490.0
    m_ed = ec.M_Ed_clevis(100e3, a=10.0, b=20.0, c=1.0)
    assert m_ed == pytest.approx(100e3 * (20.0 + 4.0 + 20.0) / 8.0, rel=REL_EXACT)
    m_rd = ec.M_Rd_pin(d, f_yp)
    assert m_rd == pytest.approx(1.5 * math.pi * d**3 / 32.0 * f_yp, rel=REL_EXACT)
    fv_rd = ec.F_v_Rd_pin(math.pi * d**2 / 4.0, f_up)
    assert fv_rd == pytest.approx(0.6 * math.pi * d**2 / 4.0 * f_up / 1.25, rel=REL_EXACT)
    ratio = ec.pin_interaction(m_ed, m_rd, 50e3, fv_rd)
    assert ratio == pytest.approx((m_ed / m_rd) ** 2 + (50e3 / fv_rd) ** 2, rel=REL_EXACT)
    assert ec.F_b_Rd_pin(10.0, d, 355.0) == pytest.approx(1.5 * 10.0 * d * 355.0, rel=REL_EXACT)


def test_clevis_moment_matches_knuckle_joint_statics() -> None:
    # docs/references.md: knuckle joint, no gap, uniform bearing: M = F(2a + b)/8
    assert ec.M_Ed_clevis(8.0, a=3.0, b=5.0, c=0.0) == pytest.approx(2 * 3.0 + 5.0, rel=REL_EXACT)
