"""Pin-connected plates to AISC 360-22 Chapter D, worked by hand in kip-in.

References:
    ANSI/AISC 360-22, Specification for Structural Steel Buildings, American
    Institute of Steel Construction, Chicago, 2022: D2(a) (Eq. D2-1, tensile
    yielding on the gross section, φt = 0.90), D5.1(a) (Eq. D5-1, tensile
    rupture on the net effective area 2·t·b_e, b_e = 2t + 0.63 in but not more
    than the distance from the hole's edge to the plate's edge normal to the
    force, φt = 0.75), D5.1(b) (Eq. D5-2, shear rupture 0.6·F_u·A_sf,
    A_sf = 2t(a + d/2), φsf = 0.75), D5.2 (width ≥ 2·b_e + d, a ≥ 1.33·b_e, hole
    ≤ d + 1/32 in), J7 (bearing 1.8·F_y·A_pb, φ = 0.75). The equations were
    recalled from the 2016 and 2022 editions (unchanged between them: from
    memory); the hand calculations below are worked from them in kip and inch.

The lug: a 3/4 in A572 Grade 50 plate (F_y = 50 ksi, F_u = 65 ksi, given in the
file so no catalogue value enters), 7 in wide, its 2 in pin hole centred 4.5 in
from the end; the hole d + 1/32 in = 2.03125 in (the D5.2 limit, the default).
"""

from __future__ import annotations

import math

import pytest

import plyshear
from plyshear import check
from plyshear.codes import aisc360 as aisc

IN = 25.4  # mm, exact by definition
KIP = 4448.2216152605  # N, exact by definition
KSI = KIP / IN**2  # MPa

# Hand arithmetic carried to 6 significant figures.
REL_HAND = 1e-5

T, W, EDGE, D = 0.75, 7.0, 4.5, 2.0  # in: the lug of the module docstring
DH = D + 1.0 / 32.0  # in: AISC 360-22 D5.2, the largest hole (relative movement)
FY, FU = 50.0, 65.0  # ksi: ASTM A572 Grade 50 (given in the model file)

CLEVIS = f"""\
format = 1
title = "lug in a clevis, kip-in"
units = "kip-in"

[bolt]
diameter = {D}
grade = "A325"
threads = "excluded"

[[ply]]
name = "fork-1"
member = "fork"
thickness = {T}
fy = "{FY} ksi"
fu = "{FU} ksi"
edge = {EDGE}
width = WIDTH

[[ply]]
name = "lug"
member = "lug"
thickness = 1.5
fy = "{FY} ksi"
fu = "{FU} ksi"
edge = 6.0
width = 10.0

[[ply]]
name = "fork-2"
member = "fork"
thickness = {T}
fy = "{FY} ksi"
fu = "{FU} ksi"
edge = {EDGE}
width = WIDTH

[member.fork]
support = true

[member.lug]
load = 150

[check]
standard = "aisc360-22"
method = "lrfd"
connector = "pin"
"""


def _items(tmp_path, width: float) -> list:
    path = tmp_path / "clevis.toml"
    path.write_text(CLEVIS.replace("WIDTH", str(width)), encoding="utf-8")
    joint = plyshear.load_model(path)
    return list(check(joint, plyshear.solve(joint)).items)


def _item(items: list, what: str, where: str):
    (found,) = [i for i in items if i.what == what and i.where == where]
    return found


def test_d5_1a_effective_width_and_net_tension() -> None:
    # b = (7 - 2.03125)/2 = 2.484375 in > 2t + 0.63 = 2.13 in, so b_e = 2.13 in
    b_e = aisc.b_e_pin(T * IN, (W - DH) / 2.0 * IN, form="us")
    assert b_e / IN == pytest.approx(2.13, rel=REL_HAND)  # hand: 2 x 0.75 + 0.63
    # Eq. D5-1: Pn = 65 x 2 x 0.75 x 2.13 = 207.675 kip
    pn = aisc.P_n_pin_tension(T * IN, b_e, FU * KSI)
    assert pn / KIP == pytest.approx(207.675, rel=REL_HAND)


def test_d5_1a_side_distance_caps_b_e() -> None:
    # a 6 in plate: b = (6 - 2.03125)/2 = 1.984375 in < 2.13 in governs
    assert aisc.b_e_pin(T * IN, (6.0 - DH) / 2.0 * IN, form="us") / IN == pytest.approx(
        1.984375, rel=REL_HAND
    )  # hand: (6 - 2 1/32)/2
    # the S.I. form: 2t + 16 mm
    assert aisc.b_e_pin(20.0, 100.0) == pytest.approx(56.0, rel=REL_HAND)  # 2 x 20 + 16


def test_d5_1b_shear_out() -> None:
    # a = 4.5 - 2.03125/2 = 3.484375 in; Asf = 2 x 0.75 x (3.484375 + 1) = 6.7265625 in^2
    # Eq. D5-2: Pn = 0.6 x 65 x 6.7265625 = 262.336 kip
    a = (EDGE - DH / 2.0) * IN
    pn = aisc.P_n_pin_shear(T * IN, a, D * IN, FU * KSI)
    assert pn / KIP == pytest.approx(262.33594, rel=REL_HAND)


def test_d5_2_dimensional_limits() -> None:
    b_e = aisc.b_e_pin(T * IN, None, form="us")
    # width >= 2 x 2.13 + 2 = 6.26 in; a >= 1.33 x 2.13 = 2.8329 in; hole <= 2 + 1/32
    assert aisc.pin_plate_min_width(b_e, D * IN) / IN == pytest.approx(6.26, rel=REL_HAND)
    assert aisc.pin_plate_min_extension(b_e) / IN == pytest.approx(2.8329, rel=REL_HAND)
    assert aisc.pin_hole_max(D * IN, form="us") / IN == pytest.approx(2.03125, rel=REL_HAND)
    assert aisc.pin_hole_max(40.0) == pytest.approx(41.0, rel=REL_HAND)  # S.I. form: d + 1 mm


def test_clause_functions_refuse_bad_input() -> None:
    with pytest.raises(ValueError, match="form"):
        aisc.b_e_pin(10.0, form="imperial")
    with pytest.raises(ValueError, match="t must be"):
        aisc.P_n_pin_tension(0.0, 10.0, 400.0)
    with pytest.raises(ValueError, match="a must be"):
        aisc.P_n_pin_shear(10.0, -1.0, 20.0, 400.0)


def test_check_lists_the_lug_items_with_their_design_strengths(tmp_path) -> None:
    items = _items(tmp_path, W)
    # LRFD: phi_t = 0.75 on Eq. D5-1 and D5-2, 0.90 on Eq. D2-1
    net = _item(items, "lug net tension", "ply fork-1")
    assert net.capacity / KIP == pytest.approx(0.75 * 207.675, rel=REL_HAND)
    assert net.clause == "D5.1(a), Eq. D5-1"
    shear = _item(items, "lug shear-out", "ply fork-1")
    assert shear.capacity / KIP == pytest.approx(0.75 * 262.33594, rel=REL_HAND)
    # Eq. D2-1: 0.90 x 50 x (7 x 0.75) = 236.25 kip
    gross = _item(items, "lug gross yielding", "ply fork-1")
    assert gross.capacity / KIP == pytest.approx(236.25, rel=REL_HAND)
    # J7: 0.75 x 1.8 x 50 x 0.75 x 2 = 101.25 kip (the driver's pin bearing)
    bearing = _item(items, "pin bearing", "ply fork-1")
    assert bearing.capacity / KIP == pytest.approx(101.25, rel=REL_HAND)
    # the demand is the ply's own solved force: half the 150 kip by symmetry (statics)
    assert net.demand / KIP == pytest.approx(75.0, rel=1e-9)
    width = _item(items, "lug geometry", "ply fork-1, width")
    assert (width.demand / IN, width.capacity / IN) == pytest.approx((6.26, 7.0), rel=REL_HAND)


def test_a_lug_that_fails_only_the_width_rule(tmp_path) -> None:
    # 6 in wide: 6 < 2 b_e + d = 6.26 in (D5.2) while every strength still passes:
    # net tension 0.75 x 65 x 2 x 0.75 x 1.984375 = 145.1 kip > 75 kip
    items = _items(tmp_path, 6.0)
    failing = sorted((i.what, i.where) for i in items if not i.informative and i.utilization > 1.0)
    assert failing == [("lug geometry", "ply fork-1, width"), ("lug geometry", "ply fork-2, width")]
    width = _item(items, "lug geometry", "ply fork-1, width")
    assert width.utilization == pytest.approx(6.26 / 6.0, rel=REL_HAND)
    assert width.clause.startswith("D5.2")
    net = _item(items, "lug net tension", "ply fork-1")
    assert net.capacity / KIP == pytest.approx(0.75 * 65 * 2 * 0.75 * 1.984375, rel=REL_HAND)
    assert math.isclose(net.demand / KIP, 75.0, rel_tol=1e-9)


def test_a_hole_larger_than_the_d5_2_limit_is_flagged(tmp_path) -> None:
    path = tmp_path / "clevis.toml"
    path.write_text(
        CLEVIS.replace("WIDTH", str(W)) + "\n[analysis]\nhole_clearance = 0.0625\n",
        encoding="utf-8",
    )
    joint = plyshear.load_model(path)
    items = check(joint, plyshear.solve(joint)).items
    hole = _item(list(items), "lug geometry", "ply fork-1, hole")
    # 2 1/16 in hole against 2 1/32 in: informative (the rule is for pins that move)
    assert hole.informative
    assert hole.utilization == pytest.approx(2.0625 / 2.03125, rel=REL_HAND)
