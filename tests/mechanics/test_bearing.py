"""The default bearing law: EN 1993-1-8:2005 Table 6.11, bolts in bearing."""

from __future__ import annotations

import pytest

from plyshear.mechanics import bearing
from plyshear.model.joint import BEARING_LAWS, Bolt, Ply

REL_EXACT = 1e-12


def _bolt(d: float) -> Bolt:
    return Bolt(diameter=d, grade="8.8", fyb=640.0, fub=800.0, stress_area=245.0)


def test_every_model_file_law_name_is_implemented() -> None:
    from plyshear.mechanics import laws

    assert set(BEARING_LAWS) == set(bearing.LAWS) | (set(laws.NONLINEAR_LAWS) - {"linear"})


def test_table_6_11_bolts_in_bearing_thin_plate() -> None:
    ply = Ply(name="p", member="m", thickness=10.0, fy=355.0, fu=510.0, edge=40.0)
    # EN 1993-1-8 Table 6.11: kb = min(0.25*40/20 + 0.5, 1.25) = 1.0,
    # kt = 1.5*10/16 = 0.9375, k12 = 24*kb*kt*d*fu/E; spring = E*k12
    k12 = 24 * 1.0 * (1.5 * 10 / 16) * 20 * 510 / 210000
    assert bearing.component_spring(_bolt(20.0), ply) == pytest.approx(210000 * k12, rel=REL_EXACT)


def test_table_6_11_kt_is_capped_at_2_5() -> None:
    ply = Ply(name="p", member="m", thickness=40.0, fy=355.0, fu=490.0)
    # EN 1993-1-8 Table 6.11: kt = min(1.5*40/16, 2.5) = 2.5; kb = 1.25 with no edge given
    spring = 24 * 1.25 * 2.5 * 24 * 490
    assert bearing.component_spring(_bolt(24.0), ply) == pytest.approx(spring, rel=REL_EXACT)
    assert bearing.component(_bolt(24.0), ply) == pytest.approx(spring / 40.0, rel=REL_EXACT)


def test_override_wins() -> None:
    ply = Ply(name="p", member="m", thickness=10.0, fy=355.0, fu=490.0, foundation_modulus=1234.0)
    assert bearing.modulus("component", _bolt(20.0), ply) == 1234.0
