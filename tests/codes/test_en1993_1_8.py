"""Edge cases and range checks of the EN 1993-1-8:2005 clause functions."""

from __future__ import annotations

import math

import pytest

from plyshear.codes import en1993_1_8 as ec
from plyshear.codes.clause import cited

REL_EXACT = 1e-12


def test_every_public_function_is_cited_to_the_2005_edition() -> None:
    functions = [
        getattr(ec, name)
        for name in dir(ec)
        if not name.startswith("_")
        and callable(getattr(ec, name))
        and getattr(getattr(ec, name), "__module__", "") == ec.__name__
    ]
    assert len(functions) > 15
    for func in functions:
        assert cited(func).standard == "EN 1993-1-8:2005"
        assert func.__doc__ is not None


@pytest.mark.parametrize(
    ("grade", "threads", "expected"),
    [
        ("4.6", True, 0.6),  # EN 1993-1-8 Table 3.4
        ("5.6", True, 0.6),
        ("8.8", True, 0.6),
        ("4.8", True, 0.5),
        ("5.8", True, 0.5),
        ("6.8", True, 0.5),
        ("10.9", True, 0.5),
        ("10.9", False, 0.6),  # Table 3.4: unthreaded shank in the plane
        ("4.8", False, 0.6),
    ],
)
def test_alpha_v(grade: str, threads: bool, expected: float) -> None:
    assert ec.alpha_v(grade, threads) == expected


@pytest.mark.parametrize("grade", ["12.9", "8,8", "A325", ""])
def test_alpha_v_rejects_classes_outside_the_standard(grade: str) -> None:
    with pytest.raises(ValueError, match="bolt class must be one of"):
        ec.alpha_v(grade, True)


def test_shear_resistance_partial_factor_is_a_keyword() -> None:
    base = ec.F_v_Rd(0.6, 800.0, 245.0)
    assert ec.F_v_Rd(0.6, 800.0, 245.0, gamma_M2=1.0) == pytest.approx(1.25 * base, rel=REL_EXACT)
    with pytest.raises(ValueError, match="alpha_v must be in"):
        ec.F_v_Rd(0.7, 800.0, 245.0)
    with pytest.raises(ValueError, match="gamma_M2 must be"):
        ec.F_v_Rd(0.6, 800.0, 245.0, gamma_M2=0.0)


def test_alpha_b_end_and_inner_and_caps() -> None:
    # end bolt far from the end: capped at 1.0
    assert ec.alpha_b(100.0, None, 22.0, 800.0, 360.0, end_bolt=True) == 1.0
    # weak bolt: capped at fub/fu
    assert ec.alpha_b(100.0, None, 22.0, 400.0, 510.0, True) == pytest.approx(400.0 / 510.0)
    # inner bolt: p1/3d0 - 1/4
    assert ec.alpha_b(None, 60.0, 22.0, 800.0, 510.0, False) == pytest.approx(60.0 / 66.0 - 0.25)


def test_alpha_b_rejects_missing_or_too_small_distances() -> None:
    with pytest.raises(ValueError, match="an end bolt needs e_1"):
        ec.alpha_b(None, 60.0, 22.0, 800.0, 510.0, True)
    with pytest.raises(ValueError, match="an inner bolt needs p_1"):
        ec.alpha_b(40.0, None, 22.0, 800.0, 510.0, False)
    with pytest.raises(ValueError, match="below the minimum 1.2 d0"):
        ec.alpha_b(26.0, None, 22.0, 800.0, 510.0, True)
    with pytest.raises(ValueError, match="below the minimum 2.2 d0"):
        ec.alpha_b(None, 48.0, 22.0, 800.0, 510.0, False)


def test_k_1_edge_inner_and_not_governing_spacings() -> None:
    d0 = 22.0
    assert ec.k_1(None, None, d0, edge_bolt=False) == 2.5
    assert ec.k_1(None, math.inf, d0, edge_bolt=False) == 2.5
    assert ec.k_1(None, 60.0, d0, False) == pytest.approx(1.4 * 60.0 / d0 - 1.7)
    # edge bolt: the smallest of the three
    assert ec.k_1(30.0, 60.0, d0, True) == pytest.approx(
        min(2.8 * 30.0 / d0 - 1.7, 1.4 * 60.0 / d0 - 1.7, 2.5)
    )
    assert ec.k_1(100.0, None, d0, True) == 2.5


def test_k_1_rejects_bad_input() -> None:
    with pytest.raises(ValueError, match="an edge bolt needs a finite e_2"):
        ec.k_1(None, 60.0, 22.0, True)
    with pytest.raises(ValueError, match="below the minimum 1.2 d0"):
        ec.k_1(20.0, None, 22.0, True)
    with pytest.raises(ValueError, match="below the minimum 2.4 d0"):
        ec.k_1(None, 50.0, 22.0, False)


def test_bearing_resistance_rejects_factors_out_of_range() -> None:
    with pytest.raises(ValueError, match="k_1 must be in"):
        ec.F_b_Rd(2.6, 0.8, 510.0, 20.0, 10.0)
    with pytest.raises(ValueError, match="alpha_b must be in"):
        ec.F_b_Rd(2.5, 1.1, 510.0, 20.0, 10.0)
    with pytest.raises(ValueError, match="t must be"):
        ec.F_b_Rd(2.5, 0.8, 510.0, 20.0, 0.0)


def test_bearing_hole_factor() -> None:
    # EN 1993-1-8 Table 3.4 footnote: oversized 0.8, slots perpendicular 0.6
    assert ec.bearing_hole_factor("normal") == 1.0
    assert ec.bearing_hole_factor("oversized") == 0.8
    assert ec.bearing_hole_factor("long-slot") == 0.6
    assert ec.bearing_hole_factor("short-slot", slot_parallel_to_load=True) == 1.0


def test_tension_k2_keyword_and_range() -> None:
    # Table 3.4: k2 = 0.63 for countersunk bolts
    assert ec.F_t_Rd(800.0, 245.0, k_2=0.63) == pytest.approx(0.63 * 800 * 245 / 1.25)
    with pytest.raises(ValueError, match="k_2 must be in"):
        ec.F_t_Rd(800.0, 245.0, k_2=1.0)


def test_interaction_rejects_negative_demand() -> None:
    with pytest.raises(ValueError, match="F_v_Ed must be"):
        ec.shear_tension_interaction(-1.0, 100.0, 0.0, 100.0)
    with pytest.raises(ValueError, match="F_t_Rd must be"):
        ec.shear_tension_interaction(1.0, 100.0, 0.0, 0.0)


def test_beta_p_threshold_and_continuity() -> None:
    d = 24.0
    assert ec.beta_p(d, 0.0) == 1.0
    assert ec.beta_p(d, d / 3.0) == 1.0
    # just above d/3 the formula is (continuously) just below 1
    just_above = ec.beta_p(d, d / 3.0 + 1e-6)
    assert just_above < 1.0
    assert just_above == pytest.approx(1.0, abs=1e-6)
    with pytest.raises(ValueError, match="t_p must be"):
        ec.beta_p(d, -1.0)


def test_beta_lf_short_joint_and_lower_limit() -> None:
    assert ec.beta_Lf(0.0, 20.0) == 1.0
    assert ec.beta_Lf(15.0 * 20.0, 20.0) == 1.0
    assert ec.beta_Lf(5000.0, 20.0) == 0.75
    with pytest.raises(ValueError, match="d must be"):
        ec.beta_Lf(100.0, 0.0)


def test_slip_with_tension_not_negative_and_reduces_to_plain_slip() -> None:
    fpc = ec.F_p_C(1000.0, 245.0)
    assert ec.F_s_Rd_with_tension(1.0, 1, 0.5, fpc, 0.0) == pytest.approx(
        ec.F_s_Rd(1.0, 1, 0.5, fpc), rel=REL_EXACT
    )
    assert ec.F_s_Rd_with_tension(1.0, 1, 0.5, fpc, 2.0 * fpc) == 0.0


@pytest.mark.parametrize(
    ("args", "message"),
    [
        ((1.1, 1, 0.5, 1e5), "k_s must be in"),
        ((1.0, 0, 0.5, 1e5), "n must be an integer >= 1"),
        ((1.0, 1.5, 0.5, 1e5), "n must be an integer >= 1"),
        ((1.0, 1, 0.0, 1e5), "mu must be in"),
        ((1.0, 1, 0.5, 0.0), "F_p_C must be"),
    ],
)
def test_slip_resistance_rejects_out_of_range(args: tuple[float, ...], message: str) -> None:
    with pytest.raises(ValueError, match=message):
        ec.F_s_Rd(*args)  # type: ignore[arg-type]


def test_hole_and_class_lookups_reject_unknown_keys() -> None:
    with pytest.raises(ValueError, match="hole must be one of"):
        ec.k_s("round")
    with pytest.raises(ValueError, match="applies to 'short-slot' and 'long-slot' only"):
        ec.k_s("oversized", slot_parallel_to_load=True)
    with pytest.raises(ValueError, match="surface class must be one of"):
        ec.mu_class("E")
    assert ec.k_s("normal") == ec.k_s("standard") == 1.0


def test_minimum_distances_table_3_3() -> None:
    assert ec.e_min(22.0) == pytest.approx(26.4)  # Table 3.3: 1.2 d0
    assert ec.p_1_min(22.0) == pytest.approx(48.4)  # Table 3.3: 2.2 d0
    assert ec.p_2_min(22.0) == pytest.approx(52.8)  # Table 3.3: 2.4 d0
    with pytest.raises(ValueError, match="d_0 must be"):
        ec.e_min(0.0)


def test_pin_functions_reject_bad_input() -> None:
    with pytest.raises(ValueError, match="gamma_M0 must be"):
        ec.M_Rd_pin(30.0, 355.0, gamma_M0=0.0)
    with pytest.raises(ValueError, match="c must be"):
        ec.M_Ed_clevis(1e3, 10.0, 20.0, -1.0)
    with pytest.raises(ValueError, match="M_Rd must be"):
        ec.pin_interaction(1.0, 0.0, 1.0, 1.0)
    with pytest.raises(ValueError, match="A must be"):
        ec.F_v_Rd_pin(0.0, 490.0)
    with pytest.raises(ValueError, match="f_y must be"):
        ec.F_b_Rd_pin(10.0, 30.0, -355.0)


def test_clevis_gap_increases_moment() -> None:
    assert ec.M_Ed_clevis(1e3, 10.0, 20.0, 2.0) > ec.M_Ed_clevis(1e3, 10.0, 20.0, 0.0)
