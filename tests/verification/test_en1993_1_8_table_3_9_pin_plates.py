"""Pin plates and replaceable pins to EN 1993-1-8:2005, worked by hand.

References:
    EN 1993-1-8:2005, Eurocode 3: Design of steel structures, Part 1-8: Design
    of joints, CEN, Brussels: 3.13.1 Table 3.9 (geometrical requirements for
    pin-ended members: type A, given thickness, a ≥ F·γM0/(2·t·f_y) + 2·d0/3 and
    c ≥ F·γM0/(2·t·f_y) + d0/3; type B, given geometry, t ≥ 0.7·√(F·γM0/f_y)
    and d0 ≤ 2.5·t); 3.13.2 Table 3.10 (pin bearing 1.5·t·d·f_y/γM0 with f_y
    the lower of the pin's and the plate's; if the pin is to be replaceable,
    0.6·t·d·f_y/γM6,ser and 0.8·W_el·f_yp/γM6,ser); Eq. 3.14 and 3.15 (contact
    stress σh,Ed = 0.591·√(E·F_b,Ed,ser·(d0 − d)/(d²·t)) ≤ 2.5·f_y/γM6,ser).
    Recommended partial factors γM0 = 1.0, γM6,ser = 1.0. The equations are
    recalled from the 2005 text (from memory); the values below are hand
    calculations from them.
"""

from __future__ import annotations

import math

import pytest

import plyshear
from plyshear import check
from plyshear.codes import en1993_1_8 as en

# Hand arithmetic carried to 6 significant figures.
REL_HAND = 1e-5

F, T, FY, D0 = 300e3, 20.0, 355.0, 41.0  # N, mm, MPa, mm


def test_table_3_9_type_a() -> None:
    # F gM0 / (2 t fy) = 300000 / (2 x 20 x 355) = 21.1268 mm
    assert en.a_min_pin_plate(F, T, FY, D0) == pytest.approx(
        21.12676 + 27.33333, rel=REL_HAND
    )  # + 2 x 41/3
    assert en.c_min_pin_plate(F, T, FY, D0) == pytest.approx(
        21.12676 + 13.66667, rel=REL_HAND
    )  # + 41/3
    # a National Annex's gamma_M0 = 1.1 scales the first term only
    assert en.a_min_pin_plate(F, T, FY, D0, gamma_M0=1.1) == pytest.approx(
        1.1 * 21.12676 + 27.33333, rel=REL_HAND
    )


def test_table_3_9_type_b() -> None:
    # t >= 0.7 sqrt(300000 / 355) = 0.7 x 29.0701 = 20.3491 mm; d0 <= 2.5 x 20 = 50 mm
    assert en.t_min_pin_plate(F, FY) == pytest.approx(20.34907, rel=REL_HAND)
    assert en.d_0_max_pin_plate(T) == pytest.approx(50.0, rel=REL_HAND)


def test_eq_3_14_contact_stress_of_a_replaceable_pin() -> None:
    # E = 210000 MPa, F = 150 kN, d0 - d = 1 mm, d = 40 mm, t = 20 mm:
    # 0.591 sqrt(210000 x 150000 x 1 / (1600 x 20)) = 0.591 sqrt(984375) = 0.591 x 992.157
    sigma = en.sigma_h_Ed(210000.0, 150e3, 41.0, 40.0, 20.0)
    assert sigma == pytest.approx(586.3648, rel=REL_HAND)
    assert en.f_h_Rd(355.0) == pytest.approx(887.5, rel=REL_HAND)  # Eq. 3.15: 2.5 x 355
    assert en.sigma_h_Ed(210000.0, 150e3, 40.0, 40.0, 20.0) == 0.0  # fitted: no clearance
    with pytest.raises(ValueError, match="d_0"):
        en.sigma_h_Ed(210000.0, 150e3, 39.0, 40.0, 20.0)


def test_table_3_10_replaceable_pin_resistances() -> None:
    # 0.6 x 20 x 40 x 355 = 170400 N; 0.8 x (pi 40^3 / 32) x 900 = 4523893 N mm
    assert en.F_b_Rd_ser_pin(20.0, 40.0, 355.0) == pytest.approx(170400.0, rel=REL_HAND)
    assert en.M_Rd_ser_pin(40.0, 900.0) == pytest.approx(
        0.8 * math.pi * 40**3 / 32 * 900, rel=REL_HAND
    )


LUG = """\
format = 1
title = "replaceable pin, two steels"
units = "kN-mm"

[bolt]
diameter = 40
grade = "10.9"
threads = "excluded"

[[ply]]
name = "leg-1"
member = "fork"
thickness = 20
steel = "S235"
edge = 80
width = 140

[[ply]]
name = "lug"
member = "lug"
thickness = 30
steel = "S355"
edge = 90
width = 160

[[ply]]
name = "leg-2"
member = "fork"
thickness = 20
steel = "S235"
edge = 80
width = 140

[member.fork]
support = true

[member.lug]
load = 300

[check]
standard = "en1993-1-8"
connector = "pin"
replaceable = true
"""


def _check(tmp_path, text: str):
    path = tmp_path / "lug.toml"
    path.write_text(text, encoding="utf-8")
    joint = plyshear.load_model(path)
    return joint, check(joint, plyshear.solve(joint))


def _item(result, what: str, where: str):
    (found,) = [i for i in result.items if i.what == what and i.where == where]
    return found


def test_each_ply_bears_with_its_own_fy(tmp_path) -> None:
    _, result = _check(tmp_path, LUG)
    # Table 3.10: 1.5 t d fy / gM0, fy the lower of the pin (900) and the plate
    # (EN 10025-2: S235 235 MPa, S355 355 MPa for t <= 40 mm)
    assert _item(result, "pin bearing", "ply leg-1").capacity == pytest.approx(
        1.5 * 20 * 40 * 235, rel=REL_HAND
    )
    assert _item(result, "pin bearing", "ply lug").capacity == pytest.approx(
        1.5 * 30 * 40 * 355, rel=REL_HAND
    )


def test_the_lug_items_by_hand(tmp_path) -> None:
    joint, result = _check(tmp_path, LUG)
    # d0 = d + 1 mm = 41 mm; the lug carries the whole 300 kN (statics)
    a_lug = 90 - 41 / 2  # 69.5 mm
    c_lug = (160 - 41) / 2  # 59.5 mm
    type_a = _item(result, "lug geometry", "ply lug, type A")
    a_req = 300e3 / (2 * 30 * 355) + 2 * 41 / 3  # 14.0845 + 27.3333 = 41.4178 mm
    c_req = 300e3 / (2 * 30 * 355) + 41 / 3  # 27.7512 mm
    assert type_a.utilization == pytest.approx(max(a_req / a_lug, c_req / c_lug), rel=REL_HAND)
    assert type_a.clause == "3.13.1, Table 3.9 (type A)"
    type_b = _item(result, "lug geometry", "ply lug, type B")
    t_req = 0.7 * math.sqrt(300e3 / 355)  # 20.349 mm
    assert type_b.informative
    assert type_b.utilization == pytest.approx(max(t_req / 30, 41 / 75), rel=REL_HAND)
    # Eq. 3.14 with the lug's own force; Eq. 3.15 with the lower fy (355)
    contact = _item(result, "pin contact stress", "ply lug")
    assert contact.demand == pytest.approx(
        0.591 * math.sqrt(210000 * 300e3 * 1.0 / (40**2 * 30)), rel=REL_HAND
    )
    assert contact.capacity == pytest.approx(2.5 * 355, rel=REL_HAND)
    assert _item(result, "pin bearing (serviceability)", "ply leg-1").capacity == pytest.approx(
        0.6 * 20 * 40 * 235, rel=REL_HAND
    )
    # factored loads: the serviceability rules run on them (conservative), and say so
    assert any("factored loads (conservative)" in n for n in result.notes)
    assert joint.check.replaceable


def test_service_loads_check_the_serviceability_rules_alone(tmp_path) -> None:
    _, result = _check(
        tmp_path, LUG.replace("replaceable = true", 'replaceable = true\nloads = "service"')
    )
    whats = {i.what for i in result.items}
    assert whats == {
        "pin bearing (serviceability)",
        "pin contact stress",
        "pin bending (serviceability)",
    }
    assert result.loads == "service"


def test_service_loads_without_a_replaceable_pin_are_still_refused(tmp_path) -> None:
    path = tmp_path / "lug.toml"
    path.write_text(LUG.replace("replaceable = true", 'loads = "service"'), encoding="utf-8")
    joint = plyshear.load_model(path)
    with pytest.raises(ValueError, match="service"):
        check(joint, plyshear.solve(joint))


def test_the_serviceability_rules_need_no_edge_or_width(tmp_path) -> None:
    bare = "\n".join(line for line in LUG.splitlines() if not line.startswith(("edge", "width")))
    _, result = _check(tmp_path, bare)
    assert {i.where for i in result.items if i.what == "pin contact stress"} == {
        "ply leg-1",
        "ply lug",
        "ply leg-2",
    }
    assert not any(i.what == "lug geometry" for i in result.items)
    assert any("no edge or width given" in n for n in result.notes)
