"""Edge cases and range checks of the AISC 360-22 clause functions."""

from __future__ import annotations

import math

import pytest

from plyshear.codes import aisc360 as aisc
from plyshear.codes.clause import cited

IN = 25.4  # mm, exact
REL_EXACT = 1e-12


def test_every_public_function_is_cited_to_the_2022_edition() -> None:
    functions = [
        getattr(aisc, name)
        for name in dir(aisc)
        if not name.startswith("_")
        and callable(getattr(aisc, name))
        and getattr(getattr(aisc, name), "__module__", "") == aisc.__name__
    ]
    assert len(functions) > 15
    for func in functions:
        assert cited(func).standard == "AISC 360-22"
        assert func.__doc__ is not None
        assert func.__doc__.startswith("[AISC 360-22 ")


@pytest.mark.parametrize("group", ["A490", "a", "", "Group 120"])
def test_unknown_bolt_group_raises(group: str) -> None:
    with pytest.raises(ValueError, match="bolt group must be one of"):
        aisc.F_nt(group)
    with pytest.raises(ValueError, match="bolt group must be one of"):
        aisc.F_nv(group, threads_excluded=False)


def test_a307_shear_stress_does_not_depend_on_threads() -> None:
    # AISC 360 Table J3.2: threads permitted in shear planes of A307 bolts
    assert aisc.F_nv("A307", True) == aisc.F_nv("A307", False)


def test_threads_included_is_eighty_percent_of_excluded_for_group_a() -> None:
    # docs/references.md (common practice): 54/68 = 0.794, about 0.80
    ratio = aisc.F_nv("A", False) / aisc.F_nv("A", True)
    assert ratio == pytest.approx(54.0 / 68.0, rel=REL_EXACT)


def test_available_lrfd_and_asd() -> None:
    assert aisc.available(100.0, "lrfd", 0.75, 2.0) == pytest.approx(75.0, rel=REL_EXACT)
    assert aisc.available(100.0, "ASD", 0.75, 2.0) == pytest.approx(50.0, rel=REL_EXACT)


@pytest.mark.parametrize(
    ("kwargs", "message"),
    [
        ({"method": "lsd"}, "method must be one of"),
        ({"phi": 0.0}, "phi must be in"),
        ({"phi": 1.2}, "phi must be in"),
        ({"omega": 0.9}, "omega must be >= 1"),
        ({"R_n": -1.0}, "R_n must be"),
        ({"R_n": math.nan}, "R_n must be"),
    ],
)
def test_available_rejects_out_of_range(kwargs: dict[str, object], message: str) -> None:
    args: dict[str, object] = {"R_n": 10.0, "method": "lrfd", "phi": 0.75, "omega": 2.0}
    args.update(kwargs)
    with pytest.raises(ValueError, match=message):
        aisc.available(**args)  # type: ignore[arg-type]


def test_shear_strength_rejects_non_positive_area() -> None:
    with pytest.raises(ValueError, match="A_b must be a finite number > 0"):
        aisc.R_n_shear(372.0, 0.0)


def test_f_nt_prime_caps_and_floors() -> None:
    fnt, fnv = aisc.F_nt("A"), aisc.F_nv("A", False)
    # no shear: 1.3 Fnt is capped at Fnt (J3.7)
    assert aisc.F_nt_prime(fnt, fnv, 0.0, "lrfd") == pytest.approx(fnt, rel=REL_EXACT)
    # shear at the LRFD shear capacity: 1.3Fnt - Fnt = 0.3 Fnt
    assert aisc.F_nt_prime(fnt, fnv, 0.75 * fnv, "lrfd") == pytest.approx(0.3 * fnt, rel=1e-9)
    # ASD, shear at Fnv/Omega: also 0.3 Fnt
    assert aisc.F_nt_prime(fnt, fnv, fnv / 2.0, "asd") == pytest.approx(0.3 * fnt, rel=1e-9)
    # shear beyond 1.3 phi Fnv: not negative
    assert aisc.F_nt_prime(fnt, fnv, 2.0 * fnv, "lrfd") == 0.0


def test_f_nt_prime_rejects_negative_shear_stress() -> None:
    with pytest.raises(ValueError, match="f_rv must be"):
        aisc.F_nt_prime(620.0, 372.0, -1.0, "lrfd")


def test_bearing_variants() -> None:
    d, t, fu = 20.0, 10.0, 400.0
    assert aisc.R_n_bearing(d, t, fu) == pytest.approx(2.4 * d * t * fu, rel=REL_EXACT)
    assert aisc.R_n_bearing(d, t, fu, deformation_considered=False) == pytest.approx(
        3.0 * d * t * fu, rel=REL_EXACT
    )
    for deformation in (True, False):
        assert aisc.R_n_bearing(
            d, t, fu, deformation_considered=deformation, long_slot_perpendicular=True
        ) == pytest.approx(2.0 * d * t * fu, rel=REL_EXACT)


def test_tearout_variants_and_zero_clear_distance() -> None:
    t, fu = 10.0, 400.0
    assert aisc.R_n_tearout(15.0, t, fu) == pytest.approx(1.2 * 15.0 * t * fu, rel=REL_EXACT)
    assert aisc.R_n_tearout(15.0, t, fu, False) == pytest.approx(1.5 * 15.0 * t * fu, rel=REL_EXACT)
    assert aisc.R_n_tearout(15.0, t, fu, long_slot_perpendicular=True) == pytest.approx(
        1.0 * 15.0 * t * fu, rel=REL_EXACT
    )
    assert aisc.R_n_tearout(0.0, t, fu) == 0.0


def test_clear_distances() -> None:
    assert aisc.l_c_edge(35.0, 22.0) == pytest.approx(24.0, rel=REL_EXACT)
    assert aisc.l_c_inner(70.0, 22.0) == pytest.approx(48.0, rel=REL_EXACT)
    with pytest.raises(ValueError, match="must exceed d_hole/2"):
        aisc.l_c_edge(11.0, 22.0)
    with pytest.raises(ValueError, match="must exceed d_hole"):
        aisc.l_c_inner(22.0, 22.0)


@pytest.mark.parametrize(
    ("hole", "parallel", "phi", "omega"),
    [
        ("standard", False, 1.00, 1.50),  # AISC 360 J3.8
        ("short-slot", False, 1.00, 1.50),  # J3.8: short slot perpendicular
        ("oversized", False, 0.85, 1.76),  # J3.8
        ("short-slot", True, 0.85, 1.76),  # J3.8: short slot parallel
        ("long-slot", False, 0.70, 2.14),  # J3.8
        ("long-slot", True, 0.70, 2.14),  # J3.8
    ],
)
def test_slip_factors_by_hole(hole: str, parallel: bool, phi: float, omega: float) -> None:
    assert aisc.phi_slip(hole, parallel) == phi
    assert aisc.omega_slip(hole, parallel) == omega


def test_slip_hole_errors() -> None:
    with pytest.raises(ValueError, match="hole must be one of"):
        aisc.phi_slip("normal")
    with pytest.raises(ValueError, match="applies to 'short-slot' and 'long-slot' only"):
        aisc.omega_slip("standard", slot_parallel_to_load=True)


def test_filler_factor_h_f() -> None:
    assert aisc.h_f(0) == 1.0
    assert aisc.h_f(1) == 1.0
    assert aisc.h_f(2) == 0.85
    assert aisc.h_f(3, developed=True) == 1.0
    with pytest.raises(ValueError, match="n_fillers must be an integer >= 0"):
        aisc.h_f(-1)


def test_slip_resistance_rejects_out_of_range() -> None:
    with pytest.raises(ValueError, match="n_s must be an integer >= 1"):
        aisc.R_n_slip(0.3, 125e3, 0)
    with pytest.raises(ValueError, match="mu must be in"):
        aisc.R_n_slip(0.0, 125e3, 1)
    with pytest.raises(ValueError, match="h_f must be in"):
        aisc.R_n_slip(0.3, 125e3, 1, h_f=1.2)


def test_k_sc_lrfd_asd_and_floor() -> None:
    tb = 125e3
    assert aisc.k_sc(0.0, tb, 1, "lrfd") == 1.0
    assert aisc.k_sc(1.13 * tb / 2.0, tb, 1, "lrfd") == pytest.approx(0.5, rel=REL_EXACT)
    assert aisc.k_sc(1.13 * tb / 3.0, tb, 1, "asd") == pytest.approx(0.5, rel=REL_EXACT)
    assert aisc.k_sc(10.0 * tb, tb, 1, "lrfd") == 0.0


@pytest.mark.parametrize("d", [12.0, 18.0, 0.5 * IN + 0.5, 1.75 * IN])
def test_pretension_unknown_size_raises(d: float) -> None:
    with pytest.raises(ValueError, match="no pretension tabulated"):
        aisc.T_b_min(d, "A")


def test_pretension_group_c_not_tabulated() -> None:
    with pytest.raises(ValueError, match="bolt group must be one of"):
        aisc.T_b_min(20.0, "C")


def test_pretension_inch_and_metric_neighbours_are_their_own_rows() -> None:
    # 5/8 in (15.875 mm) and M16 are separate rows of Tables J3.1 / J3.1M:
    # AISC 360-22 Table J3.1, 5/8 in Group A: 19 kip; Table J3.1M, M16 Group A: 91 kN
    kip = 4448.2216152605  # N, exact (1000 lbf)
    assert aisc.T_b_min(0.625 * IN, "A") == pytest.approx(19.0 * kip, rel=1e-12)
    assert aisc.T_b_min(16.0, "A") == pytest.approx(91.0e3, rel=1e-12)


def test_filler_factor_ranges() -> None:
    assert aisc.filler_factor(0.0) == 1.0
    assert aisc.filler_factor(6.0) == 1.0
    # just above 6 mm the S.I. equation applies
    assert aisc.filler_factor(8.0) == pytest.approx(1.0 - 0.0154 * 2.0, rel=REL_EXACT)
    # the 0.85 floor governs near 3/4 in (1 - 0.0154*13 = 0.80)
    assert aisc.filler_factor(19.0) == 0.85
    assert aisc.filler_factor(0.75 * IN) == 0.85
    assert aisc.filler_factor(40.0, developed=True) == 1.0
    with pytest.raises(ValueError, match="must be developed"):
        aisc.filler_factor(20.0)
    with pytest.raises(ValueError, match="t must be a finite number >= 0"):
        aisc.filler_factor(-1.0)


def test_filler_factor_is_monotone_non_increasing() -> None:
    values = [aisc.filler_factor(0.25 * i) for i in range(0, 77)]
    assert all(b <= a for a, b in zip(values, values[1:], strict=False))


def test_long_joint_factor_edges() -> None:
    assert aisc.long_joint_factor(0.0) == 1.0
    assert aisc.long_joint_factor(965.2) == 1.0
    assert aisc.long_joint_factor(966.0) == 0.833
    with pytest.raises(ValueError, match="L_pattern must be"):
        aisc.long_joint_factor(-1.0)


def test_a307_grip_factor_ranges() -> None:
    assert aisc.A307_long_grip_factor(5.0 * 20.0, 20.0) == 1.0
    assert aisc.A307_long_grip_factor(50.0, 20.0) == 1.0
    with pytest.raises(ValueError, match="beyond the range"):
        aisc.A307_long_grip_factor(100.0 + 100.0 * IN / 16.0, 20.0)


def test_threaded_parts_reject_bad_strength() -> None:
    with pytest.raises(ValueError, match="F_u must be"):
        aisc.F_nt_threaded_part(0.0)
    with pytest.raises(ValueError, match="F_u must be"):
        aisc.F_nv_threaded_part(math.inf, True)


def test_pin_bearing_and_plastic_moment_reject_bad_input() -> None:
    with pytest.raises(ValueError, match="A_pb must be"):
        aisc.R_n_pin_bearing(-1.0, 250.0)
    with pytest.raises(ValueError, match="d must be"):
        aisc.M_p_circle(0.0, 250.0)


def test_plastic_moment_exceeds_elastic_by_shape_factor() -> None:
    # derived: Z/S = (d³/6)/(pi d³/32) = 16/(3 pi) = 1.698 for a solid circle
    d, fy = 24.0, 640.0
    elastic = fy * math.pi * d**3 / 32.0
    assert aisc.M_p_circle(d, fy) / elastic == pytest.approx(16.0 / (3.0 * math.pi), rel=1e-12)
