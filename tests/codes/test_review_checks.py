"""Checks an engineer can sign (issue 13): what the check says beside its verdict.

Check values are computed in the test from the standards' formulas:
EN 1993-1-8:2005 Tables 3.3, 3.4 and 3.10, EN 1993-1-1:2005 Table 3.1.
"""

from __future__ import annotations

import dataclasses
import math

import pytest

import plyshear
from plyshear.codes import check as chk
from plyshear.model import modelfile
from tests.conftest import FORK, MODELS

REL_ROUNDOFF = 1e-9
GAMMA_M0, GAMMA_M2 = 1.0, 1.25  # EN 1993-1-8:2005 Table 2.1, recommended values

DEMO = (MODELS / "fork-four-planes.toml").read_text(encoding="utf-8")
SPLICE = (MODELS / "splice-with-filler.toml").read_text(encoding="utf-8")


def _check(text: str, standard: str | None = None, method: str | None = None):
    joint = modelfile.loads(text)
    return joint, plyshear.check(joint, plyshear.solve(joint), standard, method)


def _item(result, what: str, where: str):
    (item,) = [i for i in result.items if i.what == what and i.where == where]
    return item


# --------------------------------------------------------------------------- item 5: k1


def _en_bearing(
    k1: float, e1: float, d0: float, fub: float, fu: float, d: float, t: float
) -> float:
    # EN 1993-1-8:2005 Table 3.4: F_b,Rd = k1 alpha_b fu d t / gamma_M2, end bolt
    alpha_b = min(e1 / (3 * d0), fub / fu, 1.0)
    return k1 * alpha_b * fu * d * t / GAMMA_M2


def test_en_bearing_without_width_takes_k1_from_the_minimum_edge_distance() -> None:
    text = DEMO.replace("width = 100          # across the load: e2 = 50 mm\n", "").replace(
        "width = 100\n", ""
    )
    assert "width" not in text.split("[member")[0].split("[[ply]]", 1)[1]
    _, result = _check(text)
    item = _item(result, "bearing", "ply hanger-1")
    # M24 in a 26 mm hole (EN 1090-2 Table 11: d + 2); e2,min = 1.2 d0 (Table 3.3);
    # k1 = 2.8 e2/d0 - 1.7 (Table 3.4); S355, t = 15 mm: fu = 510 MPa (EN 1993-1-1 Table 3.1)
    d0 = 26.0
    k1 = min(2.8 * 1.2 * d0 / d0 - 1.7, 2.5)
    expected = _en_bearing(k1, 50.0, d0, 800.0, 510.0, 24.0, 15.0)
    assert item.capacity == pytest.approx(expected, rel=REL_ROUNDOFF)
    assert "no width given" in item.note
    assert "1.2 d0" in item.note


def test_en_bearing_with_a_width_takes_k1_from_half_of_it() -> None:
    text = DEMO.replace("width = 100\n", "width = 70\n")  # the hangers: e2 = 35 mm
    _, result = _check(text)
    item = _item(result, "bearing", "ply hanger-1")
    d0 = 26.0
    k1 = min(2.8 * 35.0 / d0 - 1.7, 2.5)  # EN 1993-1-8:2005 Table 3.4
    assert item.capacity == pytest.approx(
        _en_bearing(k1, 50.0, d0, 800.0, 510.0, 24.0, 15.0), rel=REL_ROUNDOFF
    )
    assert "no width" not in item.note


def test_s355_bearing_uses_fu_510() -> None:
    # EN 1993-1-1:2005 Table 3.1: S355 (EN 10025-2), t <= 40 mm: fu = 510 MPa
    _, result = _check(DEMO)
    item = _item(result, "bearing", "ply hanger-1")
    d0 = 26.0
    assert item.capacity == pytest.approx(
        _en_bearing(2.5, 50.0, d0, 800.0, 510.0, 24.0, 15.0), rel=REL_ROUNDOFF
    )


# --------------------------------------------------------------------------- item 6


def test_an_informative_item_over_one_is_a_warning_beside_passes() -> None:
    _, result = _check(SPLICE)
    bending = _item(result, "bolt bending", "bolt")
    assert bending.informative
    assert bending.utilization > 1.0
    assert result.passes
    assert len(result.warnings) == 1
    assert result.warnings[0].startswith(
        f"bolt bending, bolt at z = 0.875 in: utilization "
        f"{bending.utilization:.3f} > 1.0 on an informative"
    )
    assert result.to_dict()["warnings"] == list(result.warnings)


def test_no_warning_when_every_informative_item_is_below_one() -> None:
    _, result = _check(DEMO)
    assert all(i.utilization <= 1.0 for i in result.items if i.informative)
    assert result.warnings == ()


# --------------------------------------------------------------------------- item 7


CLEVIS = FORK + '\n[check]\nstandard = "en1993-1-8"\nconnector = "pin"\n'


@pytest.fixture(scope="module")
def clevis():
    joint = modelfile.loads(CLEVIS.replace('grade = "8.8"', 'grade = "8.8"\nthreads = "excluded"'))
    return joint, plyshear.solve(joint)


def test_pin_bending_with_shear_defaults_to_max_moment_with_max_shear(clevis) -> None:
    joint, sol = clevis
    assert joint.check.pin_interaction == "max-max"
    item = _item(plyshear.check(joint, sol), "bending + shear", "bolt")
    # EN 1993-1-8:2005 Table 3.10: M_Rd = 1.5 Wel fyp / gamma_M0, F_v,Rd = 0.6 A fup / gamma_M2;
    # 8.8: fyb 640, fub 800 MPa (ISO 898-1). Symmetric clevis: each plane carries F/2 (statics).
    d = 24.0
    m_rd = 1.5 * math.pi * d**3 / 32 * 640.0 / GAMMA_M0
    v_rd = 0.6 * math.pi * d**2 / 4 * 800.0 / GAMMA_M2
    shear = 100e3 / 2
    # 3.13.2, Figure 3.11: never below F (b + 4c + 2a)/8 with uniform bearing
    plies = joint.plies
    figure = (
        100e3 * (plies[1].thickness + 4 * plies[1].gap + 2 * plies[0].thickness) / 8.0
        if len(plies) == 3
        else 0.0
    )
    moment = max(sol.bolts[0].max_moment, figure)
    expected = (moment / m_rd) ** 2 + (shear / v_rd) ** 2
    # the plane shears of the solve are F/2 to round-off (symmetry)
    assert item.demand == pytest.approx(expected, rel=REL_ROUNDOFF)
    assert "largest M" in item.note
    assert "3.13.2, Table 3.10" in item.clause


def test_pin_bending_with_shear_of_one_section_is_smaller(clevis) -> None:
    joint, sol = clevis
    joint_same = dataclasses.replace(
        joint, check=dataclasses.replace(joint.check, pin_interaction="same-section")
    )
    a = _item(plyshear.check(joint, sol), "bending + shear", "bolt").demand
    b = _item(plyshear.check(joint_same, sol), "bending + shear", "bolt").demand
    d = 24.0
    m_rd = 1.5 * math.pi * d**3 / 32 * 640.0 / GAMMA_M0  # Table 3.10
    # at mid-span of a symmetric clevis the shear is zero (statics): the same-section
    # rule is at least the bending term alone, and below the max-max combination
    assert (sol.bolts[0].max_moment / m_rd) ** 2 <= b * (1 + REL_ROUNDOFF)
    assert b < a
    item = _item(plyshear.check(joint_same, sol), "bending + shear", "bolt")
    assert "same section" in item.note


# --------------------------------------------------------------------------- item 9


def test_a_utilization_over_twenty_names_the_units_and_the_value_as_read() -> None:
    # the review's case: load = 800000 typed as N in a kN-mm file
    _, result = _check(FORK.replace("load = 100", "load = 800000"))
    worst = max(i.utilization for i in result.items)
    assert worst > chk.UTILIZATION_SUSPECT
    (line,) = [w for w in result.warnings if w.startswith("utilization ")]
    assert 'units = "kN-mm"' in line
    assert "member.lug.load as [800000, 0] kN" in line


def test_an_ordinary_utilization_draws_no_units_warning() -> None:
    _, result = _check(FORK)
    assert not any(w.startswith("utilization ") for w in result.warnings)


# --------------------------------------------------------------------------- item 10


def test_asd_on_loads_declared_factored_is_refused() -> None:
    text = SPLICE.replace('method = "lrfd"', 'method = "lrfd"\nloads = "factored"')
    joint = modelfile.loads(text)
    with pytest.raises(ValueError, match="the loads are declared factored") as info:
        plyshear.check(joint, plyshear.solve(joint), method="asd")
    assert 'loads = "service"' in str(info.value)


@pytest.mark.parametrize(("standard", "method"), [("aisc360-22", "lrfd"), ("en1993-1-8", None)])
def test_strength_checks_of_loads_declared_service_are_refused(standard, method) -> None:
    text = SPLICE.replace('method = "lrfd"', 'method = "asd"\nloads = "service"')
    joint = modelfile.loads(text)
    with pytest.raises(ValueError, match="the loads are declared service"):
        plyshear.check(joint, plyshear.solve(joint), standard, method)


def test_the_load_level_follows_the_method_when_undeclared() -> None:
    joint = modelfile.loads(SPLICE)
    sol = plyshear.solve(joint)
    assert plyshear.check(joint, sol).loads == "factored"
    assert plyshear.check(joint, sol, method="asd").loads == "service"
    assert plyshear.check(joint, sol, method="asd").to_dict()["loads"] == "service"


# --------------------------------------------------------------------------- item 11


def test_the_check_notes_that_the_split_assumes_fitted_holes() -> None:
    joint, result = _check(SPLICE)
    # AISC 360-22 Table J3.3: a 3/4 in bolt in a 13/16 in standard hole, 1/16 in clearance
    (note,) = [n for n in result.notes if "fitted holes" in n]
    assert "(0.0625 in diametral)" in note
    assert "--scatter" in note
    # without clearance there is nothing to say
    _, result = _check(FORK + "\n[analysis]\nhole_clearance = 0\n")
    assert not any("fitted holes" in n for n in result.notes)
