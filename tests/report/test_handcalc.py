"""The hand methods beside the model, by hand on the examples; the last plane's line."""

from __future__ import annotations

import math

import pytest

import plyshear
from plyshear.report import handcalc
from plyshear.report.content import ReportData, last_plane_line
from tests.conftest import MODELS

REL_EXACT = 1e-12
N_PER_KN = 1000.0  # exact


def _solve(name: str):
    joint = plyshear.load_model(MODELS / name)
    return joint, plyshear.solve(joint)


def test_equal_split_of_the_demo_is_62_5_kn() -> None:
    joint, sol = _solve("fork-four-planes.toml")
    rows = {r.method: r for r in handcalc.hand_rows(sol)}
    equal = rows["equal split (total / planes)"]
    assert equal.hand == pytest.approx(250 / 4 * N_PER_KN, rel=REL_EXACT)  # 250 kN, 4 planes
    worst = max(p.shear for p in sol.first_bolt_planes)
    assert equal.ratio == pytest.approx(worst / (62.5 * N_PER_KN), rel=REL_EXACT)


def test_thickness_split_of_the_demo_by_hand() -> None:
    _, sol = _solve("fork-four-planes.toml")
    rows = {r.method: r for r in handcalc.hand_rows(sol)}
    # by hand: the fork's 250 kN reaction over its 12/20/12 mm legs; plane 1 carries the
    # outer leg's share 250 x 12/44; plane 2 that less the hanger ply's half, 250 x (12/44
    # - 1/2) in magnitude; plane 3 250 x (32/44 - 1/2): the largest is plane 1's
    expected = max(250 * 12 / 44, abs(250 * (12 / 44 - 0.5)), 250 * (32 / 44 - 0.5))
    assert rows["split in proportion to ply thickness"].hand == pytest.approx(
        expected * N_PER_KN, rel=REL_EXACT
    )


def test_table_3_10_moment_of_the_lug_by_hand() -> None:
    joint, sol = _solve("lug-cheek-plates.toml")
    row = handcalc.hand_rows(sol)[2]
    # by hand from the model file: F = |(300, 120)| kN; outer plies 25 and 20 mm (a = 25,
    # the thicker), the lug's plies 12 + 30 + 16 = 58 mm (b), gaps 2 and 3 mm (c = 3)
    F = math.hypot(300, 120) * N_PER_KN
    a, b, c = 25, 58, 3
    assert row.hand == pytest.approx(F * (b + 4 * c + 2 * a) / 8, rel=REL_EXACT)  # Table 3.10
    assert row.model == pytest.approx(max(bb.max_moment for bb in sol.bolts), rel=REL_EXACT)


def test_table_3_10_does_not_apply_to_a_five_ply_fork() -> None:
    _, sol = _solve("fork-four-planes.toml")
    row = handcalc.hand_rows(sol)[2]
    assert row.hand is None
    assert row.ratio is None
    assert "not applicable" in row.note


def test_hand_methods_per_bolt_of_a_row() -> None:
    joint, sol = _solve("splice-six-bolts.toml")
    n_bolts = len(joint.stations)
    total = sum(math.hypot(*m.load) for m in joint.members)
    planes = handcalc.member_planes(joint)
    assert handcalc.equal_split(joint) == pytest.approx(total / (planes * n_bolts), rel=REL_EXACT)


def test_last_plane_line_in_kn_and_per_cent() -> None:
    joint, sol = _solve("fork-four-planes.toml")
    lp = handcalc.LastPlane(4, 500.31e3, 462.3e3, 224.4e3)
    data = ReportData(joint, sol, plyshear.check(joint, sol), None, "", "2026-12-02", lp)
    line = last_plane_line(data)
    gain = 500.31 - 462.3  # kN, by hand
    assert f"{gain:.4g} kN" in line
    assert f"({100 * gain / 462.3:+.1f} %)" in line  # +8.2 %
    assert line.startswith("plane 4 pays")
    worse = handcalc.LastPlane(4, 450e3, 462.3e3, 224.4e3)
    data = ReportData(joint, sol, data.check, None, "", "2026-12-02", worse)
    assert "does NOT pay" in last_plane_line(data)


def test_last_plane_of_a_two_plane_joint_is_not_answered() -> None:
    joint = plyshear.load_model(MODELS / "splice-with-filler.toml")
    summary = plyshear.capacity(joint)
    lp = handcalc.last_plane(summary)
    assert lp.gain is None
    assert "two planes" in lp.why_not


def test_last_plane_of_a_bolt_row_is_not_answered() -> None:
    joint = plyshear.load_model(MODELS / "splice-six-bolts.toml")
    sol = plyshear.solve(joint)

    class _Summary:  # the fields last_plane reads, without the row's capacity run
        solution = sol
        planes = 12
        plane_strength = 1.0

        class nonlinear:  # noqa: N801
            load = 1.0

    lp = handcalc.last_plane(_Summary())  # type: ignore[arg-type]
    assert lp.gain is None
    assert "bolt rows" in lp.why_not
    assert lp.planes == 2  # per bolt: cover / chord / cover
